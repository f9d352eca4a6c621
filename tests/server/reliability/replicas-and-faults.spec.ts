import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import { readFileSync } from 'node:fs'
import { SMTPServer } from 'smtp-server'
import { PrivateMariaDb, ServerProcess, migrateAndSeed, waitFor, DB_PORT, HTTP_PORT } from './processes.ts'

/**
 * Two server processes on one private MariaDB, as two replicas behind a load balancer would run,
 * then the database killed and started again under them. Everything shared lives in the database:
 * sessions end on both, the sign-in throttle counts on both, each queued message goes out once.
 */
const demo = JSON.parse(readFileSync('data/demo-studies.json', 'utf8')) as { studies: { inputs: Record<string, unknown> }[] }
const ethanolCase = demo.studies[0]!.inputs
const PASSWORD = 'scrubwright-demo'

const db = new PrivateMariaDb(DB_PORT)
let a: ServerProcess
let b: ServerProcess
let smtp: SMTPServer
const delivered: string[] = []
const SMTP_PORT = HTTP_PORT + 5

async function call(server: ServerProcess, method: string, path: string, opts: { token?: string; body?: unknown } = {}) {
  const res = await fetch(`${server.url}/api/v1${path}`, {
    method,
    headers: { 'content-type': 'application/json', ...(opts.token ? { authorization: `Bearer ${opts.token}` } : {}) },
    body: opts.body === undefined ? undefined : JSON.stringify(opts.body),
  })
  const text = await res.text()
  let body: unknown = null
  try {
    body = text ? JSON.parse(text) : null
  } catch {
    body = text
  }
  return { status: res.status, headers: res.headers, body: body as Record<string, unknown> & { error?: { code: string; message: string; details: unknown[]; requestId: string } } }
}

async function signIn(server: ServerProcess, email: string, password = PASSWORD): Promise<string> {
  const r = await call(server, 'POST', '/auth/login', { body: { email, password } })
  expect(r.status).toBe(200)
  return r.body.token as string
}

beforeAll(async () => {
  smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, _session, cb) {
      let raw = ''
      stream.on('data', (c: Buffer) => (raw += c.toString()))
      stream.on('end', () => {
        const subject = /^Subject: (.*)$/m.exec(raw)?.[1]?.trim() ?? ''
        delivered.push(subject)
        cb()
      })
    },
  })
  await new Promise<void>((resolve) => smtp.listen(SMTP_PORT, '127.0.0.1', resolve))
  await db.init()
  migrateAndSeed(db.url)
  const env = {
    DATABASE_URL: db.url, JWT_SECRET: 'reliability-secret-0123456789', MAIL_MODE: 'smtp', SMTP_HOST: '127.0.0.1', SMTP_PORT: String(SMTP_PORT),
    MAIL_POLL_MS: '100', LOGIN_ACCOUNT_LIMIT: '3', LOGIN_RATE_LIMIT: '1000',
  }
  a = new ServerProcess(HTTP_PORT, env)
  b = new ServerProcess(HTTP_PORT + 1, env)
  await Promise.all([a.start(), b.start()])
}, 480_000)

afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()])
  await db.stop()
  await new Promise<void>((resolve) => smtp.close(() => resolve()))
}, 60_000)

describe('two replicas on one database', () => {
  it('a token from one works on the other, and signing out on one ends it on both', async () => {
    const t = await signIn(a, 'reviewer@halvard.example')
    expect((await call(b, 'GET', '/auth/me', { token: t })).status).toBe(200)
    expect((await call(b, 'POST', '/auth/logout', { token: t })).status).toBe(204)
    expect((await call(a, 'GET', '/auth/me', { token: t })).status).toBe(401)
    expect((await call(b, 'GET', '/auth/me', { token: t })).status).toBe(401)
  })

  it('the sign-in throttle counts failures made on either replica', async () => {
    const email = 'economist@halvard.example'
    const codes = [
      (await call(a, 'POST', '/auth/login', { body: { email, password: 'not it at all' } })).status,
      (await call(b, 'POST', '/auth/login', { body: { email, password: 'not it at all' } })).status,
      (await call(a, 'POST', '/auth/login', { body: { email, password: 'not it at all' } })).status,
      (await call(b, 'POST', '/auth/login', { body: { email, password: PASSWORD } })).status,
      (await call(a, 'POST', '/auth/login', { body: { email, password: PASSWORD } })).status,
    ]
    expect(codes).toEqual([401, 401, 401, 429, 429])
  })

  it('optimistic locking holds across replicas', async () => {
    const t = await signIn(a, 'engineer@halvard.example')
    const sites = await call(a, 'GET', '/sites', { token: t })
    const site = (sites.body as unknown as { id: number; code: string }[]).find((s) => s.code === 'cobalt-ridge')!.id
    const s = await call(a, 'POST', `/sites/${site}/studies`, { token: t, body: { name: 'Two writers', inputs: ethanolCase } })
    expect(s.status).toBe(201)
    const v = s.body.lockVersion as number
    const [first, second] = [
      await call(a, 'PUT', `/sites/${site}/studies/${s.body.id}`, { token: t, body: { name: 'Edited on A', lockVersion: v } }),
      await call(b, 'PUT', `/sites/${site}/studies/${s.body.id}`, { token: t, body: { name: 'Edited on B', lockVersion: v } }),
    ]
    expect(first.status).toBe(200)
    expect(second.status).toBe(409)
    expect((await call(b, 'GET', `/sites/${site}/studies/${s.body.id}`, { token: t })).body.name).toBe('Edited on A')
  })

  it('each queued message is delivered exactly once while both replicas send', async () => {
    const values = Array.from({ length: 40 }, (_, i) => `('ops${i}@halvard.example', 'Queued message ${i}', 'body', 'pending', 0, NOW(3), NOW(3))`)
    db.sql(`INSERT INTO mail_messages (to_address, subject, body, status, attempts, created_at, updated_at) VALUES ${values.join(',')}`, 'sw_rel')
    await waitFor('every message to be sent', async () => db.sql("SELECT COUNT(*) FROM mail_messages WHERE status <> 'sent'", 'sw_rel').trim() === '0', 60_000)
    const ours = delivered.filter((s) => s.startsWith('Queued message '))
    expect(ours).toHaveLength(40)
    expect(new Set(ours).size).toBe(40)
  })
})

describe('the database goes away and comes back', () => {
  it('503 with Retry-After and the error shape while it is down; readiness follows it; no restart needed', async () => {
    const t = await signIn(a, 'engineer@halvard.example')
    expect((await call(a, 'GET', '/health/ready')).status).toBe(200)
    await db.kill()
    for (const server of [a, b]) {
      const r = await call(server, 'GET', '/sites', { token: t })
      expect(r.status).toBe(503)
      expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(0)
      expect(r.body.error).toMatchObject({ code: 'unavailable' })
      expect(typeof r.body.error!.requestId).toBe('string')
      expect(Array.isArray(r.body.error!.details)).toBe(true)
      const login = await call(server, 'POST', '/auth/login', { body: { email: 'engineer@halvard.example', password: PASSWORD } })
      expect(login.status).toBe(503)
      const ready = await call(server, 'GET', '/health/ready')
      expect(ready.status).toBe(503)
      expect(ready.headers.get('retry-after')).toBeTruthy()
      expect((await call(server, 'GET', '/health/live')).status).toBe(200)
    }
    await db.start()
    for (const server of [a, b]) {
      await waitFor('readiness after the restart', async () => (await call(server, 'GET', '/health/ready')).status === 200, 60_000)
      expect((await call(server, 'GET', '/sites', { token: t })).status).toBe(200)
    }
  })
})
