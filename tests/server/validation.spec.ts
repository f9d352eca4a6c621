import { describe, it, expect } from 'vitest'
import { api, tokenFor, siteIds } from './helpers.ts'

describe('bad request bodies get 400 with field paths', () => {
  it('missing fields', async () => {
    const r = await api().post('/api/v1/auth/login').send({})
    expect(r.status).toBe(400)
    expect(r.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['body.email', 'body.password'])
  })
  it('wrong types', async () => {
    const r = await api().post('/api/v1/people').set('Authorization', `Bearer ${await tokenFor('admin')}`)
      .send({ email: 42, name: ['x'], password: true, isAdmin: 'yes' })
    expect(r.status).toBe(400)
    const paths = r.body.error.details.map((d: { path: string }) => d.path)
    expect(paths).toEqual(expect.arrayContaining(['body.email', 'body.name', 'body.password', 'body.isAdmin']))
  })
  it('huge strings', async () => {
    const r = await api().post('/api/v1/people').set('Authorization', `Bearer ${await tokenFor('admin')}`)
      .send({ email: 'big@halvard.example', name: 'x'.repeat(5000), password: 'p'.repeat(10) })
    expect(r.status).toBe(400)
    expect(r.body.error.details[0]).toMatchObject({ path: 'body.name', message: 'must be at most 120 characters' })
  })
  it('a body over the size limit', async () => {
    const r = await api().post('/api/v1/auth/login').set('Content-Type', 'application/json')
      .send(JSON.stringify({ email: 'a@b.c', password: 'x'.repeat(600 * 1024) }))
    expect(r.status).toBe(413)
    expect(r.body.error.code).toBe('payload_too_large')
  })
  it('malformed JSON', async () => {
    const r = await api().post('/api/v1/auth/login').set('Content-Type', 'application/json').send('{"email": ')
    expect(r.status).toBe(400)
    expect(r.body.error.code).toBe('bad_request')
  })
  it('an unknown role and a bad id', async () => {
    const { cobalt } = await siteIds()
    const t = await tokenFor('admin')
    const a = await api().put(`/api/v1/sites/${cobalt}/members/3`).set('Authorization', `Bearer ${t}`).send({ role: 'owner' })
    expect(a.status).toBe(400)
    expect(a.body.error.details[0].path).toBe('body.role')
    const b = await api().put(`/api/v1/sites/${cobalt}/members/abc`).set('Authorization', `Bearer ${t}`).send({ role: 'engineer' })
    expect(b.status).toBe(400)
    expect(b.body.error.details[0].path).toBe('params.userId')
  })
  it('unknown API paths answer with the JSON error shape', async () => {
    const r = await api().get('/api/v1/does-not-exist')
    expect(r.status).toBe(404)
    expect(r.body).toMatchObject({ error: { code: 'not_found' } })
  })
})
