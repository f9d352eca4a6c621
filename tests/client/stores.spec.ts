/**
 * Session, site and units stores, and the router's access decision, against a fake API.
 * Unit factors: NIST SP 811 (2008), Appendix B (1 ft = 0.3048 m; 1 lb = 0.45359237 kg).
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { useSessionStore } from '@/stores/session.ts'
import { SITE_STORAGE_KEY, useSiteStore } from '@/stores/site.ts'
import { useUnitsStore } from '@/stores/units.ts'
import { fieldErrors, ApiError } from '@/api/http.ts'
import { guardDecision } from '@/router/index.ts'
import { demoUser, fakeFetch } from './helpers.ts'

const SITES = [
  { id: 1, name: 'Cobalt Ridge fermentation plant', code: 'cobalt-ridge', description: '', role: 'engineer' },
  { id: 2, name: 'Marrow Bay coatings plant', code: 'marrow-bay', description: '', role: 'reviewer' },
]

beforeEach(() => {
  setActivePinia(createPinia())
  localStorage.clear()
})
afterEach(() => {
  vi.unstubAllGlobals()
})

describe('session store', () => {
  it('takes the person from GET /auth/me', async () => {
    fakeFetch(() => ({ status: 200, body: demoUser() }))
    const s = useSessionStore()
    await s.ensureChecked()
    expect(s.signedIn).toBe(true)
    expect(s.roleAt(1)).toBe('engineer')
    expect(s.roleAt(2)).toBe('reviewer')
    expect(s.roleAt(99)).toBeNull()
  })

  it('treats 401 from /auth/me as signed out, not as an error', async () => {
    fakeFetch(() => ({ status: 401, body: { error: { code: 'unauthorized', message: 'Sign in', details: [] } } }))
    const s = useSessionStore()
    await s.ensureChecked()
    expect(s.signedIn).toBe(false)
    expect(s.checked).toBe(true)
  })

  it('signs in with the cookie only: the token is not kept in the store or in storage', async () => {
    const calls = fakeFetch(() => ({ status: 200, body: { user: demoUser(), token: 'secret-token', expiresAt: '2030-01-01T00:00:00Z' } }))
    const s = useSessionStore()
    await s.signIn('engineer@halvard.example', 'scrubwright-demo')
    expect(calls[0]?.url).toBe('/api/v1/auth/login')
    expect(s.user?.name).toBe('Nora Castellanos')
    expect(JSON.stringify(s.$state)).not.toContain('secret-token')
    expect(JSON.stringify({ ...localStorage })).not.toContain('secret-token')
  })

  it('saves the unit system with PATCH /auth/me and reverts when the server refuses', async () => {
    let fail = false
    const calls = fakeFetch((method, _url, body) => {
      if (fail) return { status: 500, body: { error: { code: 'internal', message: 'down', details: [] } } }
      return { status: 200, body: demoUser({ unitSystem: (body as { unitSystem: 'SI' | 'US' }).unitSystem }) }
    })
    const s = useSessionStore()
    s.user = demoUser()
    await s.setUnitSystem('US')
    expect(calls.at(-1)).toMatchObject({ method: 'PATCH', url: '/api/v1/auth/me', body: { unitSystem: 'US' } })
    expect(s.unitSystem).toBe('US')
    fail = true
    await expect(s.setUnitSystem('SI')).rejects.toBeInstanceOf(ApiError)
    expect(s.unitSystem).toBe('US')
  })
})

describe('site store', () => {
  it('picks the first site when nothing is remembered, and remembers a choice', async () => {
    fakeFetch(() => ({ status: 200, body: SITES }))
    useSessionStore().user = demoUser()
    const site = useSiteStore()
    await site.load()
    expect(site.currentId).toBe(1)
    expect(site.role).toBe('engineer')
    expect(site.canEditStudies).toBe(true)
    site.choose(2)
    expect(localStorage.getItem(SITE_STORAGE_KEY)).toBe('2')
    expect(site.role).toBe('reviewer')
    expect(site.canEditStudies).toBe(false)
    expect(site.canEditCostBasis).toBe(false)
  })

  it('keeps a remembered site the person still belongs to', async () => {
    localStorage.setItem(SITE_STORAGE_KEY, '2')
    fakeFetch(() => ({ status: 200, body: SITES }))
    useSessionStore().user = demoUser()
    const site = useSiteStore()
    await site.load()
    expect(site.currentId).toBe(2)
  })

  it('drops a remembered site the person no longer belongs to', async () => {
    localStorage.setItem(SITE_STORAGE_KEY, '7')
    fakeFetch(() => ({ status: 200, body: SITES }))
    useSessionStore().user = demoUser()
    const site = useSiteStore()
    await site.load()
    expect(site.currentId).toBe(1)
  })

  it('reports a failed load in its error state', async () => {
    fakeFetch(() => ({ status: 500, body: { error: { code: 'internal', message: 'Database unavailable', details: [] } } }))
    const site = useSiteStore()
    await site.load()
    expect(site.status).toBe('error')
    expect(site.error).toBe('Database unavailable')
  })
})

describe('units store', () => {
  it('converts case values for display and back (1 ft = 0.3048 m, NIST SP 811)', async () => {
    const session = useSessionStore()
    session.user = demoUser({ unitSystem: 'US' })
    const units = useUnitsStore()
    await units.ensureLoaded()
    expect(units.caseToDisplay('length', 0.6096)).toBeCloseTo(2, 12)
    expect(units.displayToCase('length', 10)).toBeCloseTo(3.048, 12)
    expect(units.label('length')).toBe('ft')
    expect(units.label('temperature')).toBe('°F')
  })

  it('shows SI display units typeset (m³/h, °C)', async () => {
    useSessionStore().user = demoUser()
    const units = useUnitsStore()
    await units.ensureLoaded()
    expect(units.label('liquidVolumetricFlow')).toBe('m³/h')
    expect(units.label('temperature')).toBe('°C')
    // engine values are SI: 1 m3/s = 3600 m3/h by definition of the hour
    expect(units.siToDisplay('liquidVolumetricFlow', 1)).toBeCloseTo(3600, 9)
  })
})

describe('API errors', () => {
  it('keys field errors by path without the leading body.', () => {
    const err = new ApiError(400, 'validation', 'Invalid input', [
      { path: 'body.gas.flow', message: 'must be positive' },
      { path: 'body.inputs.tray.holeDiameter', message: 'too small' },
      { path: 'body.name', message: 'is required' },
    ])
    const f = fieldErrors(err, ['inputs.'])
    expect(f['gas.flow']).toEqual(['must be positive'])
    expect(f['tray.holeDiameter']).toEqual(['too small'])
    expect(f.name).toEqual(['is required'])
  })
})

describe('route access', () => {
  const to = (meta: Record<string, unknown>, name = 'portfolio') => ({ meta, fullPath: '/x', name })

  it('sends a signed-out person to sign-in with the way back', () => {
    expect(guardDecision(to({}), false, false, null, false)).toEqual({ name: 'sign-in', query: { redirect: '/x' } })
  })

  it('keeps People & sites for administrators', () => {
    expect(guardDecision(to({ adminOnly: true }, 'people'), true, false, 'engineer', false)).toEqual({ name: 'not-allowed' })
    expect(guardDecision(to({ adminOnly: true }, 'people'), true, true, null, false)).toBe(true)
    expect(guardDecision(to({ adminOnly: true }, 'people'), true, false, 'engineer', true)).toBe(true)
  })

  it('checks the site role when a route names roles', () => {
    expect(guardDecision(to({ roles: ['economist'] }), true, false, 'reviewer', false)).toEqual({ name: 'not-allowed' })
    expect(guardDecision(to({ roles: ['economist'] }), true, false, 'economist', false)).toBe(true)
  })

  it('moves a signed-in person away from the sign-in page', () => {
    expect(guardDecision(to({ public: true }, 'sign-in'), true, false, null, false)).toEqual({ name: 'portfolio' })
  })
})
