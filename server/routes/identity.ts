import type { Router } from 'express'
import { defineRoutes, parse, ANY_ROLE, SESSION_COOKIE, type RouteSpec } from './define.ts'
import { signIn, signOut, userView, changePassword } from '../services/auth.ts'
import * as people from '../services/people.ts'
import { listAudit } from '../services/audit.ts'
import { loginBody, changePasswordBody, createUserBody, createSiteBody, setMembershipBody, updateMeBody } from '../../shared/schemas/identity.ts'
import { idParam, pagingQuery } from '../../shared/schemas/common.ts'
import type { Config } from '../config.ts'
import { openApiDocument } from '../openapi.ts'
import { isHttps } from '../middleware/transport-security.ts'
import { databaseReady } from '../services/readiness.ts'
import { auditEntryAnswer, healthAnswer, memberAnswer, openApiAnswer, pageOf, personAnswer, signInAnswer, siteAnswer } from '../../shared/schemas/answers.ts'
import { z } from 'zod'

export function identityRoutes(router: Router, cfg: Config): Router {
  const limits = { perAccount: cfg.LOGIN_ACCOUNT_LIMIT, perAddress: cfg.LOGIN_RATE_LIMIT }

  const specs: RouteSpec[] = [
    {
      method: 'get', path: '/health', access: { kind: 'public' }, summary: 'Liveness and version',
      doc: { response: healthAnswer },
      handler: () => ({ status: 'ok', service: 'scrubwright' }),
    },
    {
      method: 'get', path: '/openapi.json', access: { kind: 'public' }, summary: 'This API described as OpenAPI 3.1 (browsable at /api/v1/docs/)',
      doc: { response: openApiAnswer },
      handler: () => openApiDocument(),
    },
    {
      method: 'get', path: '/health/live', access: { kind: 'public' }, summary: 'Liveness: the process answers (no database check)',
      doc: { response: healthAnswer },
      handler: () => ({ status: 'ok', service: 'scrubwright' }),
    },
    {
      method: 'get', path: '/health/ready', access: { kind: 'public' }, summary: 'Readiness: 200 when the database answers, else 503 with Retry-After',
      doc: { response: healthAnswer },
      handler: async (_req, res) => {
        await databaseReady()
        res.status(200).json({ status: 'ready', database: 'ok' })
      },
    },
    {
      method: 'post', path: '/auth/login', access: { kind: 'public' }, summary: 'Sign in with e-mail and password',
      status: 200,
      doc: { body: loginBody, response: signInAnswer },
      handler: async (req, res) => {
        const body = parse(loginBody, req.body)
        const session = await signIn(body.email, body.password, req.requestId, { address: req.ip ?? req.socket.remoteAddress ?? 'unknown', limits })
        res.cookie(SESSION_COOKIE, session.token, {
          httpOnly: true, sameSite: 'strict', secure: isHttps(req, cfg), path: '/api', expires: new Date(session.expiresAt),
        })
        res.status(200).json(session)
      },
    },
    {
      method: 'post', path: '/auth/logout', access: { kind: 'signedIn' }, summary: 'Sign out (ends every session of this person)',
      status: 204,
      handler: async (req, res) => {
        await signOut(req.user!.id, req.requestId)
        res.clearCookie(SESSION_COOKIE, { path: '/api' })
        res.status(204).end()
      },
    },
    {
      method: 'get', path: '/auth/me', access: { kind: 'signedIn' }, summary: 'The signed-in person with their site roles',
      doc: { response: personAnswer },
      handler: (req) => userView(req.user!.id),
    },
    {
      method: 'patch', path: '/auth/me', access: { kind: 'signedIn' }, summary: 'Change own name or unit system',
      status: 200,
      doc: { body: updateMeBody, response: personAnswer },
      handler: (req) => people.updateMe(req.user!.id, parse(updateMeBody, req.body)),
    },
    {
      method: 'post', path: '/auth/password', access: { kind: 'signedIn' }, summary: 'Change own password (current and new; throttled like sign-in; other sessions end)',
      status: 200,
      doc: { body: changePasswordBody, response: signInAnswer },
      handler: async (req, res) => {
        const body = parse(changePasswordBody, req.body)
        const session = await changePassword(req.user!.id, body, req.requestId, { address: req.ip ?? req.socket.remoteAddress ?? 'unknown', limits })
        res.cookie(SESSION_COOKIE, session.token, {
          httpOnly: true, sameSite: 'strict', secure: isHttps(req, cfg), path: '/api', expires: new Date(session.expiresAt),
        })
        res.status(200).json(session)
      },
    },
    {
      method: 'get', path: '/sites', access: { kind: 'signedIn' }, summary: 'Sites the person is a member of',
      doc: { response: z.array(siteAnswer) },
      handler: (req) => people.listMySites(req.user!),
    },
    {
      method: 'post', path: '/sites', access: { kind: 'systemAdmin' }, summary: 'Create a site',
      doc: { body: createSiteBody, response: siteAnswer },
      handler: (req) => people.createSite(parse(createSiteBody, req.body), req.user!, req.requestId),
    },
    {
      method: 'get', path: '/sites/:siteId', access: { kind: 'site', roles: ANY_ROLE }, summary: 'One site',
      doc: { response: siteAnswer },
      handler: (req) => people.getSite(req.site!.id, req.user!),
    },
    {
      method: 'get', path: '/sites/:siteId/members', access: { kind: 'site', roles: ANY_ROLE }, summary: 'Members of a site and their roles',
      doc: { response: z.array(memberAnswer) },
      handler: (req) => people.listMembers(req.site!.id),
    },
    {
      method: 'put', path: '/sites/:siteId/members/:userId', access: { kind: 'site', roles: ['admin'] }, summary: 'Give a person a role at the site',
      doc: { body: setMembershipBody, response: memberAnswer },
      handler: (req) =>
        people.setMembership(req.site!.id, parse(idParam, req.params.userId, 'params.userId'), parse(setMembershipBody, req.body).role, req.user!, req.requestId),
    },
    {
      method: 'delete', path: '/sites/:siteId/members/:userId', access: { kind: 'site', roles: ['admin'] }, summary: 'Remove a person from the site',
      handler: async (req) => {
        await people.removeMembership(req.site!.id, parse(idParam, req.params.userId, 'params.userId'), req.user!, req.requestId)
      },
    },
    {
      method: 'get', path: '/sites/:siteId/audit', access: { kind: 'site', roles: ['admin'] }, summary: 'The site audit log, newest first',
      doc: { query: pagingQuery, response: pageOf(auditEntryAnswer) },
      handler: (req) => listAudit(req.site!.id, parse(pagingQuery, req.query, 'query')),
    },
    {
      method: 'get', path: '/people', access: { kind: 'systemAdmin' }, summary: 'Everyone, with memberships',
      doc: { response: z.array(personAnswer) },
      handler: () => people.listPeople(),
    },
    {
      method: 'post', path: '/people', access: { kind: 'systemAdmin' }, summary: 'Create a person',
      doc: { body: createUserBody, response: personAnswer },
      handler: (req) => people.createPerson(parse(createUserBody, req.body), req.user!, req.requestId),
    },
  ]
  return defineRoutes(router, specs)
}
