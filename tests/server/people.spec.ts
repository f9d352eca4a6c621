import { describe, it, expect } from 'vitest'
import { api, tokenFor, siteIds } from './helpers.ts'
import { AuditEntry } from '../../server/db/models/index.ts'

describe('people and memberships', () => {
  it('an admin creates a person, gives and removes a role; each change is audited', async () => {
    const t = await tokenFor('admin')
    const { marrow } = await siteIds()
    const email = `new-${Date.now()}@halvard.example`
    const p = await api().post('/api/v1/people').set('Authorization', `Bearer ${t}`).send({ email, name: 'New Person', password: 'long-enough-pw' })
    expect(p.status).toBe(201)
    const dup = await api().post('/api/v1/people').set('Authorization', `Bearer ${t}`).send({ email, name: 'Again', password: 'long-enough-pw' })
    expect(dup.status).toBe(409)
    const set = await api().put(`/api/v1/sites/${marrow}/members/${p.body.id}`).set('Authorization', `Bearer ${t}`).send({ role: 'reviewer' })
    expect(set.status).toBe(200)
    const change = await api().put(`/api/v1/sites/${marrow}/members/${p.body.id}`).set('Authorization', `Bearer ${t}`).send({ role: 'engineer' })
    expect(change.body.role).toBe('engineer')
    const members = await api().get(`/api/v1/sites/${marrow}/members`).set('Authorization', `Bearer ${t}`)
    expect(members.body.find((m: { userId: number }) => m.userId === p.body.id).role).toBe('engineer')
    expect((await api().delete(`/api/v1/sites/${marrow}/members/${p.body.id}`).set('Authorization', `Bearer ${t}`)).status).toBe(204)
    const log = await AuditEntry.findAll({ where: { entity: 'membership', entityId: `${marrow}:${p.body.id}` }, order: [['id', 'ASC']] })
    expect(log.map((l) => [l.action, l.before, l.after])).toEqual([
      ['set_role', null, { role: 'reviewer' }],
      ['set_role', { role: 'reviewer' }, { role: 'engineer' }],
      ['remove_role', { role: 'engineer' }, null],
    ])
  })
})
