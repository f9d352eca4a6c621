import { describe, it, expect } from 'vitest'
import request from 'supertest'
import jwt from 'jsonwebtoken'
import { api, tokenFor, PEOPLE, DEMO_PASSWORD, siteIds } from './helpers.ts'
import { createApp } from '../../server/app.ts'
import { AuditEntry } from '../../server/db/models/index.ts'

describe('sign-in', () => {
  it('gives a token, an httpOnly cookie and the person with site roles', async () => {
    const res = await api().post('/api/v1/auth/login').send({ email: PEOPLE.economist, password: DEMO_PASSWORD })
    expect(res.status).toBe(200)
    expect(res.body.user.email).toBe(PEOPLE.economist)
    expect(res.body.user.memberships.map((m: { role: string }) => m.role)).toEqual(['economist', 'economist'])
    const cookie = String(res.headers['set-cookie'])
    expect(cookie).toMatch(/sw_session=/)
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Strict/i)
    // The cookie alone authenticates.
    const me = await api().get('/api/v1/auth/me').set('Cookie', cookie.split(';')[0]!)
    expect(me.status).toBe(200)
    expect(me.body.email).toBe(PEOPLE.economist)
  })

  it('refuses a wrong password with 401 and the same message as an unknown e-mail', async () => {
    const a = await api().post('/api/v1/auth/login').send({ email: PEOPLE.engineer, password: 'wrong-password' })
    const b = await api().post('/api/v1/auth/login').send({ email: 'nobody@halvard.example', password: 'wrong-password' })
    expect(a.status).toBe(401)
    expect(b.status).toBe(401)
    expect(a.body.error.message).toBe(b.body.error.message)
    expect(a.body.error.requestId).toBeTruthy()
  })

  it('stores only bcrypt hashes', async () => {
    const { User } = await import('../../server/db/models/index.ts')
    const u = await User.findOne({ where: { email: PEOPLE.reviewer } })
    expect(u!.passwordHash).toMatch(/^\$2[aby]\$10\$/)
    expect(u!.passwordHash).not.toContain(DEMO_PASSWORD)
  })

  it('rejects expired, forged and missing tokens with 401', async () => {
    const expired = jwt.sign({ tv: 0 }, process.env.JWT_SECRET!, { subject: '1', expiresIn: -10 })
    const forged = jwt.sign({ tv: 0 }, 'not-the-secret-at-all', { subject: '1', expiresIn: 600 })
    for (const t of [expired, forged, 'garbage']) {
      const r = await api().get('/api/v1/auth/me').set('Authorization', `Bearer ${t}`)
      expect(r.status).toBe(401)
      expect(r.body.error.code).toBe('unauthenticated')
    }
    expect((await api().get('/api/v1/auth/me')).status).toBe(401)
  })

  it('sign-out ends the session and is audited', async () => {
    const admin = await tokenFor('admin')
    const email = `signout-${Date.now()}@halvard.example`
    const created = await api().post('/api/v1/people').set('Authorization', `Bearer ${admin}`)
      .send({ email, name: 'Short Lived', password: 'a-long-password' })
    expect(created.status).toBe(201)
    const login = await api().post('/api/v1/auth/login').send({ email, password: 'a-long-password' })
    const t = login.body.token as string
    expect((await api().get('/api/v1/auth/me').set('Authorization', `Bearer ${t}`)).status).toBe(200)
    expect((await api().post('/api/v1/auth/logout').set('Authorization', `Bearer ${t}`)).status).toBe(204)
    expect((await api().get('/api/v1/auth/me').set('Authorization', `Bearer ${t}`)).status).toBe(401)
    const entries = await AuditEntry.findAll({ where: { entity: 'user', entityId: String(created.body.id) } })
    expect(entries.map((e) => e.action)).toEqual(expect.arrayContaining(['create', 'sign_in', 'sign_out']))
  })

  it('rate-limits sign-in attempts', async () => {
    // Failures are counted per client address (here one the trusted loopback proxy names) in the database.
    const strict = createApp({ LOGIN_RATE_LIMIT: 3, TRUST_PROXY: 'loopback' })
    const ip = `192.0.2.${Math.floor(Math.random() * 250) + 1}`
    const codes: number[] = []
    for (let i = 0; i < 5; i++) {
      codes.push((await request(strict).post('/api/v1/auth/login').set('X-Forwarded-For', ip).send({ email: `nobody-${i}@halvard.example`, password: 'nope-nope' })).status)
    }
    expect(codes.slice(0, 3)).toEqual([401, 401, 401])
    expect(codes.slice(3)).toEqual([429, 429])
    const last = await request(strict).post('/api/v1/auth/login').set('X-Forwarded-For', ip).send({ email: PEOPLE.engineer, password: 'nope-nope' })
    expect(last.body.error.code).toBe('rate_limited')
  })

  it('sends security headers and a request id', async () => {
    const r = await api().get('/api/v1/health')
    expect(r.headers['x-content-type-options']).toBe('nosniff')
    expect(r.headers['content-security-policy']).toContain("default-src 'self'")
    expect(r.headers['x-frame-options']).toBe('SAMEORIGIN')
    expect(r.headers['x-powered-by']).toBeUndefined()
    expect(r.headers['x-request-id']).toMatch(/[\w-]{8,}/)
  })

  it('a person only sees the sites they belong to', async () => {
    const { cobalt, marrow } = await siteIds()
    const r = await api().get('/api/v1/sites').set('Authorization', `Bearer ${await tokenFor('bayEngineer')}`)
    expect(r.body.map((s: { id: number }) => s.id)).toEqual([marrow])
    const other = await api().get(`/api/v1/sites/${cobalt}`).set('Authorization', `Bearer ${await tokenFor('bayEngineer')}`)
    const missing = await api().get('/api/v1/sites/987654').set('Authorization', `Bearer ${await tokenFor('bayEngineer')}`)
    // Same answer for a site that exists and one that does not: nothing is learned.
    expect(other.status).toBe(403)
    expect(missing.status).toBe(403)
    expect(other.body.error.message).toBe(missing.body.error.message)
  })
})
