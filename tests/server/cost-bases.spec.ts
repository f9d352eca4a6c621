import { describe, it, expect } from 'vitest'
import { api, tokenFor, siteIds } from './helpers.ts'
import { AuditEntry } from '../../server/db/models/index.ts'

describe('site cost bases', () => {
  it('the demo sites start with a published basis in force', async () => {
    const { cobalt } = await siteIds()
    const r = await api().get(`/api/v1/sites/${cobalt}/cost-bases/current`).set('Authorization', `Bearer ${await tokenFor('reviewer')}`)
    expect(r.status).toBe(200)
    expect(r.body.status).toBe('published')
    expect(r.body.data.general.currency).toBeTruthy()
  })

  it('draft -> edit -> publish; published is immutable; stale writers get 409; all audited', async () => {
    const { marrow } = await siteIds()
    const econ = await tokenFor('economist')
    const auth = { Authorization: `Bearer ${econ}` }
    const draft = await api().post(`/api/v1/sites/${marrow}/cost-bases`).set(auth).send({ name: 'Electricity update' })
    expect(draft.status).toBe(201)
    expect(draft.body.status).toBe('draft')
    // Only one draft at a time.
    expect((await api().post(`/api/v1/sites/${marrow}/cost-bases`).set(auth).send({})).status).toBe(409)

    const data = structuredClone(draft.body.data)
    data.utilities.electricityPrice = data.utilities.electricityPrice * 1.25
    const v0 = draft.body.lockVersion
    const first = await api().put(`/api/v1/sites/${marrow}/cost-bases/${draft.body.id}`).set(auth).send({ data, lockVersion: v0 })
    expect(first.status).toBe(200)
    expect(first.body.lockVersion).toBe(v0 + 1)
    // A second writer who opened the same version loses, never overwrites silently.
    const second = await api().put(`/api/v1/sites/${marrow}/cost-bases/${draft.body.id}`).set(auth).send({ notes: 'mine', lockVersion: v0 })
    expect(second.status).toBe(409)
    expect(second.body.error.code).toBe('conflict')

    const bad = await api().put(`/api/v1/sites/${marrow}/cost-bases/${draft.body.id}`).set(auth)
      .send({ data: { ...data, utilities: { ...data.utilities, electricityPrice: -1 } }, lockVersion: first.body.lockVersion })
    expect(bad.status).toBe(400)
    expect(bad.body.error.details[0].path).toBe('body.data.utilities.electricityPrice')

    const pub = await api().post(`/api/v1/sites/${marrow}/cost-bases/${draft.body.id}/publish`).set(auth)
      .send({ effectiveDate: '2026-12-01', lockVersion: first.body.lockVersion })
    expect(pub.status).toBe(200)
    expect(pub.body.status).toBe('published')
    const edit = await api().put(`/api/v1/sites/${marrow}/cost-bases/${draft.body.id}`).set(auth).send({ notes: 'late', lockVersion: pub.body.lockVersion })
    expect(edit.status).toBe(409)

    const list = await api().get(`/api/v1/sites/${marrow}/cost-bases`).set(auth)
    expect(list.body[0].version).toBeGreaterThan(list.body[1].version)
    const log = await AuditEntry.findAll({ where: { entity: 'cost_basis', entityId: String(draft.body.id) }, order: [['id', 'ASC']] })
    expect(log.map((l) => l.action)).toEqual(['create_draft', 'update_draft', 'publish'])
  })

  it('engineers and reviewers read but cannot draft', async () => {
    const { cobalt } = await siteIds()
    for (const who of ['engineer', 'reviewer'] as const) {
      const r = await api().post(`/api/v1/sites/${cobalt}/cost-bases`).set('Authorization', `Bearer ${await tokenFor(who)}`).send({})
      expect(r.status).toBe(403)
    }
  })

  it('a draft can start from a shipped preset', async () => {
    const { cobalt } = await siteIds()
    const auth = { Authorization: `Bearer ${await tokenFor('economist')}` }
    const presets = await api().get('/api/v1/cost-presets').set(auth)
    expect(presets.body.length).toBeGreaterThanOrEqual(2)
    const key = presets.body[0].key as string
    const drafts = (await api().get(`/api/v1/sites/${cobalt}/cost-bases`).set(auth)).body.filter((v: { status: string }) => v.status === 'draft')
    for (const d of drafts) expect((await api().delete(`/api/v1/sites/${cobalt}/cost-bases/${d.id}`).set(auth)).status).toBe(204)
    const d = await api().post(`/api/v1/sites/${cobalt}/cost-bases`).set(auth).send({ preset: key })
    expect(d.status).toBe(201)
    expect(d.body.name).toBe(presets.body[0].name)
    const unknown = await api().post(`/api/v1/sites/${cobalt}/cost-bases`).set(auth).send({ preset: 'nope' })
    expect([400, 409]).toContain(unknown.status)
    // names every object has (constructor, toString) are not presets either
    for (const key of ['constructor', 'toString']) {
      expect((await api().get(`/api/v1/cost-presets/${key}`).set(auth)).status).toBe(404)
      expect([400, 409]).toContain((await api().post(`/api/v1/sites/${cobalt}/cost-bases`).set(auth).send({ preset: key })).status)
    }
  })
})
