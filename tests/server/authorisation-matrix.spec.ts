import { describe, it, expect, beforeAll } from 'vitest'
import { api, tokenFor, siteIds, type Person } from './helpers.ts'
import { routeTable, type Access } from '../../server/routes/define.ts'
import type { Role } from '../../shared/schemas/common.ts'

/**
 * Calls every declared /api/v1 route as every kind of caller and checks the status:
 * signed out -> 401; a role or site that does not allow it -> 403; allowed -> anything else
 * (validation or not-found answers are fine: the guard let the call through).
 * The callers act on the Cobalt Ridge site, where the demo people hold one role each and the
 * Marrow Bay engineer is not a member.
 */
type Caller = 'signedOut' | Person
const CALLERS: Caller[] = ['signedOut', 'admin', 'economist', 'engineer', 'reviewer', 'bayEngineer']
const ROLE_AT_COBALT: Record<Person, Role | null> = {
  admin: 'admin', economist: 'economist', engineer: 'engineer', reviewer: 'reviewer', bayEngineer: null,
}

function allowed(access: Access, caller: Caller): boolean {
  if (access.kind === 'public') return true
  if (caller === 'signedOut') return false
  if (access.kind === 'signedIn') return true
  if (caller === 'admin') return true // the demo admin is a system administrator
  if (access.kind === 'systemAdmin') return false
  const role = ROLE_AT_COBALT[caller]
  return role !== null && access.roles.includes(role)
}

// A hand-written expectation for the routes where a mistake would hurt most; the generic
// loop below covers every other route from its declaration.
const EXPLICIT: { method: string; path: string; expect: Partial<Record<Caller, 'allow' | 401 | 403>> }[] = [
  { method: 'get', path: '/people', expect: { signedOut: 401, admin: 'allow', economist: 403, engineer: 403, reviewer: 403, bayEngineer: 403 } },
  { method: 'post', path: '/sites', expect: { signedOut: 401, admin: 'allow', economist: 403, engineer: 403 } },
  { method: 'put', path: '/sites/:siteId/members/:userId', expect: { signedOut: 401, admin: 'allow', economist: 403, engineer: 403, reviewer: 403, bayEngineer: 403 } },
  { method: 'get', path: '/sites/:siteId/members', expect: { signedOut: 401, reviewer: 'allow', bayEngineer: 403 } },
  { method: 'get', path: '/sites/:siteId', expect: { engineer: 'allow', bayEngineer: 403 } },
]

let site = 0
beforeAll(async () => {
  site = (await siteIds()).cobalt
})

function concrete(path: string): string {
  return path.replace(':siteId', String(site)).replace(/:(\w+)/g, '999999')
}

async function call(method: string, path: string, caller: Caller) {
  const req = api()[method as 'get'](`/api/v1${concrete(path)}`)
  if (caller !== 'signedOut') req.set('Authorization', `Bearer ${await tokenFor(caller)}`)
  if (method !== 'get' && method !== 'delete') req.send({})
  return req
}

describe('authorisation matrix', () => {
  it('declares every route with an access rule', () => {
    expect(routeTable.length).toBeGreaterThan(10)
    for (const r of routeTable) expect(['public', 'signedIn', 'systemAdmin', 'site']).toContain(r.access.kind)
  })

  // Sign-out invalidates tokens, so it is checked signed-out only (auth.spec covers the rest).
  const routes = () => routeTable.filter((r) => !(r.method === 'post' && r.path === '/auth/logout'))

  for (const caller of CALLERS) {
    it(`enforces every route for ${caller}`, async () => {
      const failures: string[] = []
      for (const r of routes()) {
        const res = await call(r.method, r.path, caller)
        const ok = allowed(r.access, caller)
        const bad = ok ? res.status === 401 || res.status === 403 : res.status !== (caller === 'signedOut' ? 401 : 403)
        if (bad || res.status >= 500) failures.push(`${r.method.toUpperCase()} ${r.path}: got ${res.status}, expected ${ok ? 'allowed' : 'denied'}`)
      }
      expect(failures).toEqual([])
    })
  }

  it('matches the explicit expectations', async () => {
    for (const e of EXPLICIT) {
      expect(routeTable.some((r) => r.method === e.method && r.path === e.path), `${e.path} is declared`).toBe(true)
      for (const [caller, want] of Object.entries(e.expect) as [Caller, 'allow' | 401 | 403][]) {
        const res = await call(e.method, e.path, caller)
        if (want === 'allow') expect([401, 403], `${e.method} ${e.path} as ${caller}`).not.toContain(res.status)
        else expect(res.status, `${e.method} ${e.path} as ${caller}`).toBe(want)
      }
    }
  })

  it('denies sign-out when signed out', async () => {
    expect((await api().post('/api/v1/auth/logout')).status).toBe(401)
  })
})

describe('API documentation', () => {
  it('the README lists every route with its access rule', async () => {
    const { readFileSync } = await import('node:fs')
    const { routeRows } = await import('../../scripts/routes.ts')
    const readme = readFileSync('README.md', 'utf8')
    const missing = routeRows().filter((row) => !readme.includes(row))
    expect(missing).toEqual([])
  })
})
