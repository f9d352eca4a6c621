import { z } from 'zod'
import {
  adminUserRowSchema,
  memberRowSchema,
  sessionSchema,
  siteViewSchema,
  userViewSchema,
  type AdminUserRow,
  type MemberRow,
  type SessionView,
  type SiteView,
  type UserView,
} from '@shared/schemas/identity.ts'
import type { Role, UnitSystem } from '@shared/schemas/common.ts'
import { http } from './http.ts'

export const authApi = {
  login: (email: string, password: string): Promise<SessionView> =>
    http.post('/auth/login', { email, password }, { schema: sessionSchema, quiet401: true }),
  logout: (): Promise<unknown> => http.post('/auth/logout', {}, { quiet401: true }),
  me: (): Promise<UserView> => http.get('/auth/me', { schema: userViewSchema, quiet401: true }),
  /** Change one's own password; the answer is a fresh session (every other session ends). */
  changePassword: (currentPassword: string, newPassword: string): Promise<SessionView> =>
    http.post('/auth/password', { currentPassword, newPassword }, { schema: sessionSchema }),
  updateMe: (patch: { unitSystem?: UnitSystem; name?: string }): Promise<UserView> =>
    http.patch('/auth/me', patch, { schema: userViewSchema }),
}

export const sitesApi = {
  list: (): Promise<SiteView[]> => http.get('/sites', { schema: z.array(siteViewSchema) }),
  create: (body: { name: string; code: string; description: string }): Promise<unknown> => http.post('/sites', body),
  members: (siteId: number): Promise<MemberRow[]> =>
    http.get(`/sites/${siteId}/members`, { schema: z.array(memberRowSchema) }),
  setMember: (siteId: number, userId: number, role: Role): Promise<unknown> =>
    http.put(`/sites/${siteId}/members/${userId}`, { role }),
  removeMember: (siteId: number, userId: number): Promise<unknown> => http.del(`/sites/${siteId}/members/${userId}`),
}

export const peopleApi = {
  list: (): Promise<AdminUserRow[]> => http.get('/people', { schema: z.array(adminUserRowSchema) }),
  create: (body: { email: string; name: string; password: string; isAdmin: boolean }): Promise<unknown> =>
    http.post('/people', body),
}
