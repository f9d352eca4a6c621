import { Router, type Request, type Response, type RequestHandler } from 'express'
import type { ZodType } from 'zod'
import { authenticate } from '../services/auth.ts'
import { ForbiddenError, UnauthenticatedError, ValidationError, zodDetails } from '../errors.ts'
import type { Role } from '../../shared/schemas/common.ts'
import type { Config } from '../config.ts'
import { assertSameOriginWrite } from '../middleware/transport-security.ts'

/**
 * What a route needs. Every route under /api/v1 declares one of these; the guard enforces it.
 * - public: anyone
 * - signedIn: any signed-in person
 * - systemAdmin: people flagged as system administrators
 * - site: a member of the route's :siteId with one of the roles (system admins pass too)
 */
export type Access =
  | { kind: 'public' }
  | { kind: 'signedIn' }
  | { kind: 'systemAdmin' }
  | { kind: 'site'; roles: readonly Role[] }

export const ANY_ROLE: readonly Role[] = ['admin', 'economist', 'engineer', 'reviewer']

/** What a route takes and answers, for the OpenAPI document (server/openapi.ts). */
export interface RouteDoc {
  /** JSON request body (a shared zod schema), or a CSV upload in the multipart field `file`. */
  body?: ZodType | 'csvUpload'
  query?: ZodType
  /** The answer: a shared zod schema, or a file. Left out: a JSON answer described only by the summary. */
  response?: ZodType | 'pdf' | 'xlsx'
}

export interface RouteSpec {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete'
  path: string
  access: Access
  summary: string
  /** Status of a successful answer with a body (default: 201 for POST, 200 otherwise); none -> 204. */
  status?: 200 | 201 | 204
  doc?: RouteDoc
  handler: (req: Request, res: Response) => Promise<unknown> | unknown
  /** Extra middleware before the handler (uploads, rate limits). */
  before?: RequestHandler[]
}

/** All declared routes, for the authorisation matrix test and the route list in the README. */
export const routeTable: RouteSpec[] = []

export const SESSION_COOKIE = 'sw_session'

function tokenOf(req: Request): { token: string; fromCookie: boolean } | undefined {
  const h = req.get('authorization')
  if (h?.startsWith('Bearer ')) return { token: h.slice(7).trim(), fromCookie: false }
  const c = (req.cookies as Record<string, string> | undefined)?.[SESSION_COOKIE]
  return c ? { token: c, fromCookie: true } : undefined
}

function guard(access: Access): RequestHandler {
  return async (req, _res, next) => {
    if (access.kind === 'public') return next()
    const t = tokenOf(req)
    if (!t) throw new UnauthenticatedError()
    // A browser sends the cookie with cross-site requests too: such writes must come from our own pages.
    if (t.fromCookie) assertSameOriginWrite(req, (req.app.locals as { cfg: Config }).cfg)
    const token = t.token
    req.user = await authenticate(token)
    if (access.kind === 'signedIn') return next()
    if (access.kind === 'systemAdmin') {
      if (!req.user.isAdmin) throw new ForbiddenError('Only system administrators may do this.')
      return next()
    }
    const siteId = Number(req.params.siteId)
    // A person who is not a member gets the same answer whether the site exists or not.
    const role = Number.isInteger(siteId) ? (req.user.roles.get(siteId) ?? null) : null
    if (role === null && !req.user.isAdmin) throw new ForbiddenError('You are not a member of this site.')
    if (!req.user.isAdmin && !access.roles.includes(role as Role)) {
      throw new ForbiddenError(`This needs one of these roles at the site: ${access.roles.join(', ')}.`)
    }
    req.site = { id: siteId, role }
    next()
  }
}

/** The status of a successful answer with a body. */
export function successStatus(s: Pick<RouteSpec, 'method' | 'status'>): number {
  return s.status ?? (s.method === 'post' ? 201 : 200)
}

export function defineRoutes(router: Router, specs: RouteSpec[]): Router {
  for (const s of specs) {
    routeTable.push(s)
    router[s.method](s.path, guard(s.access), ...(s.before ?? []), async (req: Request, res: Response) => {
      const out = await s.handler(req, res)
      if (!res.headersSent) {
        if (out === undefined) res.status(204).end()
        else res.status(successStatus(s)).json(out)
      }
    })
  }
  return router
}

/** Parse with a shared zod schema; 400 with field paths on failure. */
export function parse<T>(schema: ZodType<T>, value: unknown, prefix = 'body'): T {
  const r = schema.safeParse(value)
  if (!r.success) throw new ValidationError('The request is not valid.', zodDetails(r.error, prefix))
  return r.data
}

export function newRouter(): Router {
  return Router({ mergeParams: true })
}
