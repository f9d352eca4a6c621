/**
 * Changing one's own password: the current password is checked under the sign-in throttle (kept in
 * MariaDB), the new one under the one password rule, the change is audited and ends other sessions.
 * Each test uses a person of its own, so the demo people keep their passwords.
 */
import { describe, it, expect } from 'vitest'
import request from 'supertest'
import { api, tokenFor } from './helpers.ts'
import { createApp } from '../../server/app.ts'
import { AuditEntry } from '../../server/db/models/index.ts'

const tag = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e6).toString(36)}`

async function newPerson(password = 'first-password-of-mine'): Promise<{ id: number; email: string; password: string; token: string }> {
  const email = `account-${tag()}@halvard.example`
  const created = await api().post('/api/v1/people').set('Authorization', `Bearer ${await tokenFor('admin')}`).send({ email, name: 'Account Tester', password, isAdmin: false })
  expect(created.status).toBe(201)
  const login = await api().post('/api/v1/auth/login').send({ email, password })
  expect(login.status).toBe(200)
  return { id: created.body.id as number, email, password, token: login.body.token as string }
}

describe('change own password', () => {
  it('changes it with the current password: the old one stops working, other sessions end, an audit entry is written', async () => {
    const p = await newPerson()
    const other = (await api().post('/api/v1/auth/login').send({ email: p.email, password: p.password })).body.token as string
    const res = await api().post('/api/v1/auth/password').set('Authorization', `Bearer ${p.token}`).send({ currentPassword: p.password, newPassword: 'a brand new passphrase' })
    expect(res.status).toBe(200)
    expect(res.body.user.email).toBe(p.email)
    expect(String(res.headers['set-cookie'])).toMatch(/sw_session=/)
    // the fresh session of the answer works; the sessions from before do not
    expect((await api().get('/api/v1/auth/me').set('Authorization', `Bearer ${res.body.token as string}`)).status).toBe(200)
    expect((await api().get('/api/v1/auth/me').set('Authorization', `Bearer ${other}`)).status).toBe(401)
    expect((await api().post('/api/v1/auth/login').send({ email: p.email, password: p.password })).status).toBe(401)
    expect((await api().post('/api/v1/auth/login').send({ email: p.email, password: 'a brand new passphrase' })).status).toBe(200)
    const entries = await AuditEntry.findAll({ where: { entity: 'user', entityId: String(p.id), action: 'change_password' } })
    expect(entries).toHaveLength(1)
    // the audit entry never holds a password or its hash
    expect(JSON.stringify(entries[0]!.toJSON())).not.toMatch(/passphrase|\$2[aby]\$/)
  })

  it('refuses a wrong current password on its field (400, the person stays signed in)', async () => {
    const p = await newPerson()
    const res = await api().post('/api/v1/auth/password').set('Authorization', `Bearer ${p.token}`).send({ currentPassword: 'not-my-password', newPassword: 'a brand new passphrase' })
    expect(res.status).toBe(400)
    expect(res.body.error.details).toEqual([{ path: 'body.currentPassword', message: 'is not right' }])
    expect((await api().get('/api/v1/auth/me').set('Authorization', `Bearer ${p.token}`)).status).toBe(200)
  })

  it('applies the one password rule to the new password, the e-mail address included', async () => {
    const p = await newPerson()
    const send = (newPassword: string) => api().post('/api/v1/auth/password').set('Authorization', `Bearer ${p.token}`).send({ currentPassword: p.password, newPassword })
    const short = await send('short')
    expect(short.status).toBe(400)
    expect(short.body.error.details[0]).toMatchObject({ path: 'body.newPassword', message: 'must be at least 12 characters' })
    const same = await send(p.password)
    expect(same.body.error.details[0]).toMatchObject({ path: 'body.newPassword', message: 'must differ from the current password' })
    const mine = await send(p.email)
    expect(mine.status).toBe(400)
    expect(mine.body.error.details[0]).toMatchObject({ path: 'body.newPassword', message: 'must not be your e-mail address' })
    // nothing changed: the old password still signs in
    expect((await api().post('/api/v1/auth/login').send({ email: p.email, password: p.password })).status).toBe(200)
  })

  it('is throttled with sign-in: after the account limit of wrong current passwords, 429 even with the right one', async () => {
    const p = await newPerson()
    const strict = createApp({ LOGIN_ACCOUNT_LIMIT: 3, LOGIN_RATE_LIMIT: 10000 })
    const codes: number[] = []
    for (let i = 0; i < 3; i++) {
      codes.push((await request(strict).post('/api/v1/auth/password').set('Authorization', `Bearer ${p.token}`).send({ currentPassword: `wrong-${i}`, newPassword: 'a brand new passphrase' })).status)
    }
    expect(codes).toEqual([400, 400, 400])
    const right = await request(strict).post('/api/v1/auth/password').set('Authorization', `Bearer ${p.token}`).send({ currentPassword: p.password, newPassword: 'a brand new passphrase' })
    expect(right.status).toBe(429)
    expect(right.body.error.code).toBe('rate_limited')
    // the count is the sign-in count of the account (in the database): signing in is held back too
    expect((await request(strict).post('/api/v1/auth/login').send({ email: p.email, password: p.password })).status).toBe(429)
  })

  it('needs a signed-in person', async () => {
    expect((await api().post('/api/v1/auth/password').send({ currentPassword: 'x', newPassword: 'a brand new passphrase' })).status).toBe(401)
  })
})
