import { describe, it, expect } from 'vitest'
import request from 'supertest'
import { readFileSync } from 'node:fs'
import ExcelJS from 'exceljs'
import type { Response } from 'superagent'
import { api, tokenFor, siteIds, PEOPLE, DEMO_PASSWORD } from './helpers.ts'
import { createApp } from '../../server/app.ts'
import { passwordProblem } from '../../shared/schemas/password.ts'

/**
 * Session, password and cross-site checks after OWASP ASVS 4.0.3 level 2 (the requirement
 * numbers are given beside each test).
 */
const demo = JSON.parse(readFileSync('data/demo-studies.json', 'utf8')) as { studies: { inputs: Record<string, unknown> }[] }
const ethanolCase = demo.studies[0]!.inputs
const admin = async () => ({ Authorization: `Bearer ${await tokenFor('admin')}` })
const unique = () => `${Date.now()}-${Math.floor(Math.random() * 1e6)}`

async function cookieOf(email: string, password = DEMO_PASSWORD): Promise<string> {
  const r = await api().post('/api/v1/auth/login').send({ email, password })
  expect(r.status).toBe(200)
  return String(r.headers['set-cookie']).split(';')[0]!
}

describe('passwords (ASVS 2.1.1, 2.1.7)', () => {
  it('refuses fewer than 12 characters, a common password and the e-mail address; takes a sound one', async () => {
    const h = await admin()
    const email = `pw-${unique()}@halvard.example`
    const tries: [string, number][] = [
      ['elevenchars', 400], // 11 characters
      ['password1234', 400], // in the common-password list shipped with @zxcvbn-ts/language-common
      ['qwertyuiop123', 400], // same list
      [email, 400],
      [email.toUpperCase(), 400],
      ['marrow bay night shift 7', 201],
    ]
    for (const [password, status] of tries) {
      const r = await api().post('/api/v1/people').set(h).send({ email, name: 'Pat Word', password })
      expect(r.status, password).toBe(status)
      if (status === 400) expect(r.body.error.details.map((d: { path: string }) => d.path)).toContain('body.password')
    }
  })

  it('the shared rule is one function the client and every password path use', () => {
    expect(passwordProblem('short')).toMatch(/at least 12/)
    expect(passwordProblem('123456789012')).toMatch(/common/)
    expect(passwordProblem('ann.lee@halvard.example', 'Ann.Lee@halvard.example')).toMatch(/e-mail/)
    expect(passwordProblem('a sound passphrase here', 'ann.lee@halvard.example')).toBeNull()
  })
})

describe('sign-in throttling (ASVS 2.2.1)', () => {
  it('counts failures per account across addresses; known and unknown accounts get the same answer', async () => {
    const app = createApp({ LOGIN_ACCOUNT_LIMIT: 3, LOGIN_RATE_LIMIT: 1000, TRUST_PROXY: 'loopback' })
    const email = `throttle-${unique()}@halvard.example`
    const h = await admin()
    expect((await api().post('/api/v1/people').set(h).send({ email, name: 'Tess Rottle', password: 'cobalt ridge tank farm' })).status).toBe(201)
    const unknown = `nobody-${unique()}@halvard.example`
    const codes = { known: [] as number[], unknown: [] as number[] }
    for (let i = 0; i < 4; i++) {
      // A different client address each time: the account count alone must stop it.
      codes.known.push((await request(app).post('/api/v1/auth/login').set('X-Forwarded-For', `198.51.100.${i + 1}`).send({ email, password: 'not the password' })).status)
      codes.unknown.push((await request(app).post('/api/v1/auth/login').set('X-Forwarded-For', `198.51.100.${i + 1}`).send({ email: unknown, password: 'not the password' })).status)
    }
    expect(codes.known).toEqual([401, 401, 401, 429])
    expect(codes.unknown).toEqual([401, 401, 401, 429])
    const a = await request(app).post('/api/v1/auth/login').set('X-Forwarded-For', '198.51.100.9').send({ email, password: 'cobalt ridge tank farm' })
    const b = await request(app).post('/api/v1/auth/login').set('X-Forwarded-For', '198.51.100.9').send({ email: unknown, password: 'cobalt ridge tank farm' })
    expect(a.status).toBe(429)
    expect(b.status).toBe(429)
    expect(a.body.error).toMatchObject({ code: b.body.error.code, message: b.body.error.message })
  })

  it('counts failures per address across accounts, and successes are not counted', async () => {
    const app = createApp({ LOGIN_ACCOUNT_LIMIT: 1000, LOGIN_RATE_LIMIT: 3, TRUST_PROXY: 'loopback' })
    const ip = `203.0.113.${Math.floor(Math.random() * 250) + 1}`
    const email = `addr-${unique()}@halvard.example`
    const h = await admin()
    expect((await api().post('/api/v1/people').set(h).send({ email, name: 'Addy Ress', password: 'marrow bay coatings line' })).status).toBe(201)
    for (let i = 0; i < 5; i++) {
      expect((await request(app).post('/api/v1/auth/login').set('X-Forwarded-For', ip).send({ email, password: 'marrow bay coatings line' })).status).toBe(200)
    }
    const codes: number[] = []
    for (let i = 0; i < 4; i++) codes.push((await request(app).post('/api/v1/auth/login').set('X-Forwarded-For', ip).send({ email: `x${i}-${unique()}@halvard.example`, password: 'wrong one' })).status)
    expect(codes).toEqual([401, 401, 401, 429])
  })

  it('without TRUST_PROXY a forged X-Forwarded-For does not pick another address', async () => {
    const app = createApp({ LOGIN_ACCOUNT_LIMIT: 1000, LOGIN_RATE_LIMIT: 1000 })
    const r = await request(app).get('/api/v1/health').set('X-Forwarded-For', '192.0.2.7').set('X-Forwarded-Proto', 'https')
    expect(r.headers['strict-transport-security']).toBeUndefined()
  })
})

describe('transport (ASVS 3.4.1, 14.4.5, 8.2.1)', () => {
  it('plain http on loopback: no Secure flag, no HSTS; API answers are not stored', async () => {
    const r = await api().post('/api/v1/auth/login').send({ email: PEOPLE.reviewer, password: DEMO_PASSWORD })
    expect(String(r.headers['set-cookie'])).not.toMatch(/;\s*Secure/i)
    expect(r.headers['strict-transport-security']).toBeUndefined()
    expect(r.headers['cache-control']).toBe('no-store')
    const e = await api().get('/api/v1/no-such-route')
    expect(e.headers['cache-control']).toBe('no-store')
  })

  it('PUBLIC_URL with https: Secure cookie and HSTS', async () => {
    const app = createApp({ PUBLIC_URL: 'https://scrubwright.halvard.example' })
    const r = await request(app).post('/api/v1/auth/login').send({ email: PEOPLE.reviewer, password: DEMO_PASSWORD })
    expect(String(r.headers['set-cookie'])).toMatch(/;\s*Secure/i)
    expect(r.headers['strict-transport-security']).toMatch(/max-age=\d+/)
  })

  it('a trusted proxy saying https: Secure cookie and HSTS', async () => {
    const app = createApp({ TRUST_PROXY: 'loopback' })
    const r = await request(app).post('/api/v1/auth/login').set('X-Forwarded-Proto', 'https').send({ email: PEOPLE.reviewer, password: DEMO_PASSWORD })
    expect(String(r.headers['set-cookie'])).toMatch(/;\s*Secure/i)
    expect(r.headers['strict-transport-security']).toMatch(/max-age=\d+/)
  })
})

describe('cross-site writes with the session cookie (ASVS 4.2.2, 13.2.3)', () => {
  it('archive, revise, compare-current, logout and uploads refuse a foreign Origin or Sec-Fetch-Site', async () => {
    const { cobalt } = await siteIds()
    const cookie = await cookieOf(PEOPLE.engineer)
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const s = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: `Cross-site ${unique()}`, inputs: ethanolCase })
    const run = await api().post(`/api/v1/sites/${cobalt}/studies/${s.body.id}/runs`).set(eng).send({ kind: 'design' })
    const writes = [
      `/api/v1/sites/${cobalt}/studies/${s.body.id}/archive`,
      `/api/v1/sites/${cobalt}/studies/${s.body.id}/revise`,
      `/api/v1/sites/${cobalt}/studies/${s.body.id}/runs/${run.body.id}/compare-current`,
      `/api/v1/sites/${cobalt}/uploads/equilibrium/preview`,
    ]
    for (const path of writes) {
      const foreign = await api().post(path).set('Cookie', cookie).set('Origin', 'https://evil.example').send({})
      expect(foreign.status, path).toBe(403)
      const fetchSite = await api().post(path).set('Cookie', cookie).set('Sec-Fetch-Site', 'cross-site').send({})
      expect(fetchSite.status, path).toBe(403)
    }
    // The session still works: nothing above was carried out.
    expect((await api().get('/api/v1/auth/me').set('Cookie', cookie)).status).toBe(200)
    // The app's own pages pass.
    const own = await api().post(`/api/v1/sites/${cobalt}/studies/${s.body.id}/archive`).set('Cookie', cookie).set('Host', '127.0.0.1:8640').set('Origin', 'http://127.0.0.1:8640').send({})
    expect(own.status).toBe(200)
    // Sign-out with the cookie: refused cross-site, carried out from the app's own page.
    const email = `leaving-${unique()}@halvard.example`
    expect((await api().post('/api/v1/people').set(await admin()).send({ email, name: 'Lee Ving', password: 'signing out for today' })).status).toBe(201)
    const mine = await cookieOf(email, 'signing out for today')
    expect((await api().post('/api/v1/auth/logout').set('Cookie', mine).set('Origin', 'https://evil.example').send({})).status).toBe(403)
    expect((await api().post('/api/v1/auth/logout').set('Cookie', mine).set('Sec-Fetch-Site', 'cross-site').send({})).status).toBe(403)
    expect((await api().get('/api/v1/auth/me').set('Cookie', mine)).status).toBe(200)
    const same = await api().post('/api/v1/auth/logout').set('Cookie', mine).set('Sec-Fetch-Site', 'same-origin').send({})
    expect(same.status).toBe(204)
    expect((await api().get('/api/v1/auth/me').set('Cookie', mine)).status).toBe(401)
  })
})

describe('people an administrator may see (ASVS 4.2.1)', () => {
  it('a site administrator cannot learn the name and e-mail of someone outside their sites', async () => {
    const { marrow, cobalt } = await siteIds()
    const h = await admin()
    const siteAdminEmail = `site-admin-${unique()}@halvard.example`
    const sa = await api().post('/api/v1/people').set(h).send({ email: siteAdminEmail, name: 'Sita Admin', password: 'marrow bay admin desk' })
    expect((await api().put(`/api/v1/sites/${marrow}/members/${sa.body.id}`).set(h).send({ role: 'admin' })).status).toBe(200)
    const outsider = await api().post('/api/v1/people').set(h).send({ email: `outsider-${unique()}@halvard.example`, name: 'Otto Side', password: 'nobody knows my name' })
    const cobaltOnly = await api().post('/api/v1/people').set(h).send({ email: `cobalt-${unique()}@halvard.example`, name: 'Cora Balt', password: 'cobalt ridge only here' })
    expect((await api().put(`/api/v1/sites/${cobalt}/members/${cobaltOnly.body.id}`).set(h).send({ role: 'reviewer' })).status).toBe(200)

    const login = await api().post('/api/v1/auth/login').send({ email: siteAdminEmail, password: 'marrow bay admin desk' })
    const saAuth = { Authorization: `Bearer ${login.body.token}` }
    for (const id of [outsider.body.id as number, cobaltOnly.body.id as number, 987654321]) {
      const r = await api().put(`/api/v1/sites/${marrow}/members/${id}`).set(saAuth).send({ role: 'reviewer' })
      expect(r.status).toBe(404)
      expect(JSON.stringify(r.body)).not.toMatch(/Otto|Cora|outsider-|cobalt-/)
    }
    // A system administrator still adds anyone.
    const sys = await api().put(`/api/v1/sites/${marrow}/members/${outsider.body.id}`).set(h).send({ role: 'reviewer' })
    expect(sys.status).toBe(200)
    expect(sys.body.name).toBe('Otto Side')
  })
})

describe('spreadsheet export', () => {
  it('escapes text that a spreadsheet would run as a formula', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const name = '=HYPERLINK("http://evil.example","open")'
    const s = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name, inputs: ethanolCase })
    expect(s.status).toBe(201)
    const binary = (res: Response, cb: (err: Error | null, body: Buffer) => void) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => cb(null, Buffer.concat(chunks)))
    }
    const x = await api().get(`/api/v1/sites/${cobalt}/studies/${s.body.id}/export.xlsx`).set(eng).buffer(true).parse(binary)
    expect(x.status).toBe(200)
    const wb = new ExcelJS.Workbook()
    const buf = x.body as Buffer
    await wb.xlsx.load(buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength) as ArrayBuffer)
    const texts: string[] = []
    wb.eachSheet((ws) => ws.eachRow((row) => row.eachCell((c) => { if (typeof c.value === 'string') texts.push(c.value) })))
    expect(texts).toContain(`'${name}`)
    for (const t of texts) expect(t).not.toMatch(/^[=+\-@\t\r]/)
    wb.eachSheet((ws) => ws.eachRow((row) => row.eachCell((c) => expect(c.formula ?? null).toBeNull())))
  })
})
