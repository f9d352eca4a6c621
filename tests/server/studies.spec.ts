import pkg from '../../package.json' with { type: 'json' }
import { describe, it, expect } from 'vitest'
import { readFileSync } from 'node:fs'
import { api, tokenFor, siteIds } from './helpers.ts'
import { CostBasis } from '../../server/db/models/index.ts'

const demo = JSON.parse(readFileSync('data/demo-studies.json', 'utf8')) as { studies: { inputs: Record<string, unknown> }[] }
const ethanolCase = demo.studies[0]!.inputs

describe('studies', () => {
  it('lists the seeded studies with paging, filtering and sorting', async () => {
    const { cobalt } = await siteIds()
    const auth = { Authorization: `Bearer ${await tokenFor('reviewer')}` }
    const all = await api().get(`/api/v1/sites/${cobalt}/studies?sort=name`).set(auth)
    expect(all.status).toBe(200)
    expect(all.body.total).toBeGreaterThanOrEqual(2)
    // the optimum TACs are in the currency of the site's cost basis in force (the demo's is USD)
    expect(all.body.currency).toBe('USD')
    const names = all.body.items.map((s: { name: string }) => s.name)
    // The database orders by its collation; names other tests create may start with punctuation,
    // which collations and JavaScript order differently. Names starting with a letter must come in
    // alphabetical order of their initials whatever the case.
    const initials = (names as string[]).filter((n) => /^[A-Za-z]/.test(n)).map((n) => n[0]!.toUpperCase())
    expect(initials.length).toBeGreaterThanOrEqual(2)
    expect([...initials].sort()).toEqual(initials)
    const page = await api().get(`/api/v1/sites/${cobalt}/studies?pageSize=1&page=2&sort=name`).set(auth)
    expect(page.body.items).toHaveLength(1)
    expect(page.body.items[0].name).toBe(names[1])
    const q = await api().get(`/api/v1/sites/${cobalt}/studies?q=FV-201`).set(auth)
    expect(q.body.items.map((s: { name: string }) => s.name)).toEqual(['Fermenter vent scrubber FV-201'])
    expect(q.body.items[0].optimumTac).toBeGreaterThan(0)
    const bad = await api().get(`/api/v1/sites/${cobalt}/studies?sort=password`).set(auth)
    expect(bad.status).toBe(400)
    expect(bad.body.error.details[0].path).toBe('query.sort')
  })

  it('create, edit with optimistic locking, run, pin, compare; reviewers cannot edit', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const created = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Test study A', inputs: ethanolCase })
    expect(created.status).toBe(201)
    const id = created.body.id as number
    expect(created.body.can.edit).toBe(true)

    const badInputs = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Bad', inputs: { ...ethanolCase, recovery: 'high' } })
    expect(badInputs.status).toBe(400)
    expect(badInputs.body.error.details[0].path).toBe('body.inputs.recovery')

    const edit = await api().put(`/api/v1/sites/${cobalt}/studies/${id}`).set(eng).send({ inputs: { ...ethanolCase, recovery: 0.98 }, lockVersion: created.body.lockVersion })
    expect(edit.status).toBe(200)
    expect(edit.body.targetRecovery).toBe(0.98)
    const stale = await api().put(`/api/v1/sites/${cobalt}/studies/${id}`).set(eng).send({ name: 'Mine', lockVersion: created.body.lockVersion })
    expect(stale.status).toBe(409)

    const rev = { Authorization: `Bearer ${await tokenFor('reviewer')}` }
    expect((await api().put(`/api/v1/sites/${cobalt}/studies/${id}`).set(rev).send({ name: 'x', lockVersion: edit.body.lockVersion })).status).toBe(403)
    const asReviewer = await api().get(`/api/v1/sites/${cobalt}/studies/${id}`).set(rev)
    expect(asReviewer.body.can.edit).toBe(false)

    const d = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/runs`).set(eng).send({ kind: 'design' })
    expect(d.status).toBe(201)
    expect(d.body.costBasisVersion).toBeGreaterThanOrEqual(1)
    expect(d.body.engineVersion).toBe(pkg.version)
    expect(d.body.result.totalAnnualCost).toBeGreaterThan(0)
    const o = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/runs`).set(eng).send({ kind: 'optimize' })
    expect(o.status).toBe(201)
    expect(o.body.result.optimum.totalAnnualCost).toBeLessThanOrEqual(d.body.result.totalAnnualCost * 1.000001)

    const p1 = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/options`).set(eng).send({ runId: d.body.id, name: 'As specified' })
    const p2 = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/options`).set(eng).send({ runId: o.body.id, name: 'Lowest cost' })
    expect(p1.status).toBe(201)
    expect(p2.status).toBe(201)
    const opts = await api().get(`/api/v1/sites/${cobalt}/studies/${id}/options`).set(rev)
    expect(opts.body.map((x: { name: string }) => x.name)).toEqual(['As specified', 'Lowest cost'])
    expect(opts.body[1].summary.totalAnnualCost).toBeCloseTo(o.body.result.optimum.totalAnnualCost, 6)

    const list = await api().get(`/api/v1/sites/${cobalt}/studies/${id}/runs`).set(rev)
    expect(list.body.map((r: { kind: string }) => r.kind)).toEqual(['optimize', 'design'])

    const foreign = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/options`).set(eng).send({ runId: 999999, name: 'x' })
    expect(foreign.status).toBe(409)
  })

  it('a stored run reproduces bit for bit after the cost basis moves on', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const econ = { Authorization: `Bearer ${await tokenFor('economist')}` }
    const s = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Reproducibility', inputs: ethanolCase })
    const run = await api().post(`/api/v1/sites/${cobalt}/studies/${s.body.id}/runs`).set(eng).send({ kind: 'design' })
    const before = await api().get(`/api/v1/sites/${cobalt}/studies/${s.body.id}/runs/${run.body.id}`).set(eng)

    // The economist publishes a dearer electricity price, effective today.
    for (const v of (await api().get(`/api/v1/sites/${cobalt}/cost-bases`).set(econ)).body.filter((x: { status: string }) => x.status === 'draft')) {
      await api().delete(`/api/v1/sites/${cobalt}/cost-bases/${v.id}`).set(econ)
    }
    const draft = await api().post(`/api/v1/sites/${cobalt}/cost-bases`).set(econ).send({})
    const data = structuredClone(draft.body.data)
    data.utilities.electricityPrice *= 2
    const upd = await api().put(`/api/v1/sites/${cobalt}/cost-bases/${draft.body.id}`).set(econ).send({ data, lockVersion: draft.body.lockVersion })
    const today = new Date().toISOString().slice(0, 10)
    const pub = await api().post(`/api/v1/sites/${cobalt}/cost-bases/${draft.body.id}/publish`).set(econ).send({ effectiveDate: today, lockVersion: upd.body.lockVersion })
    expect(pub.status).toBe(200)

    const after = await api().get(`/api/v1/sites/${cobalt}/studies/${s.body.id}/runs/${run.body.id}`).set(eng)
    expect(JSON.stringify(after.body.result)).toBe(JSON.stringify(before.body.result))
    expect(after.body.costBasisVersion).toBe(before.body.costBasisVersion)

    const cmp = await api().post(`/api/v1/sites/${cobalt}/studies/${s.body.id}/runs/${run.body.id}/compare-current`).set(eng).send({})
    expect(cmp.status).toBe(200)
    expect(cmp.body.current.costBasisVersion).toBe(pub.body.version)
    const tac = cmp.body.changes.find((c: { key: string }) => c.key === 'totalAnnualCost')
    expect(tac.after).toBeGreaterThan(tac.before)
    // The stored basis version is still there, unchanged.
    const old = await CostBasis.findByPk(run.body.costBasisId)
    expect(old!.status).toBe('published')
  })

  it('archiving hides a study from the default list', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const s = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'To archive', inputs: ethanolCase })
    const a = await api().post(`/api/v1/sites/${cobalt}/studies/${s.body.id}/archive`).set(eng).send({})
    expect(a.status).toBe(200)
    expect(a.body.status).toBe('archived')
    const list = await api().get(`/api/v1/sites/${cobalt}/studies?q=To%20archive`).set(eng)
    expect(list.body.total).toBe(0)
    const withArchived = await api().get(`/api/v1/sites/${cobalt}/studies?q=To%20archive&status=archived`).set(eng)
    expect(withArchived.body.total).toBe(1)
    expect((await api().put(`/api/v1/sites/${cobalt}/studies/${s.body.id}`).set(eng).send({ name: 'x', lockVersion: a.body.lockVersion })).status).toBe(409)
  })

  it('studies of another site stay invisible', async () => {
    const { cobalt } = await siteIds()
    const r = await api().get(`/api/v1/sites/${cobalt}/studies`).set('Authorization', `Bearer ${await tokenFor('bayEngineer')}`)
    expect(r.status).toBe(403)
  })
})
