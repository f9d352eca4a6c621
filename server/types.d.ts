import type { Role } from '../shared/schemas/common.ts'

export interface AuthUser {
  id: number
  email: string
  name: string
  isAdmin: boolean
  unitSystem: 'SI' | 'US'
  /** siteId -> role */
  roles: Map<number, Role>
}

declare global {
  namespace Express {
    interface Request {
      requestId: string
      user?: AuthUser
      /** Set by the site guard: the site of the route and the caller's role there (null = system admin without membership). */
      site?: { id: number; role: Role | null }
    }
  }
}
