import { describe, it, expect } from 'vitest'
import { api, tokenFor, siteIds } from './helpers.ts'

describe('site solvent allocation', () => {
  it('splits a limited supply between the demo absorbers and saves it', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const studies = (await api().get(`/api/v1/sites/${cobalt}/studies?q=vent%20scrubber`).set(eng)).body.items as { id: number; name: string }[]
    expect(studies.length).toBeGreaterThanOrEqual(2)
    const ids = studies.slice(0, 2).map((s) => s.id)
    const free = await api().post(`/api/v1/sites/${cobalt}/allocations/solve`).set(eng).send({ supplyLimit: 1000, units: ids.map((studyId) => ({ studyId })) })
    expect(free.status).toBe(200)
    const unconstrained = free.body.used as number
    expect(free.body.shadowPrice).toBe(0)

    const limit = unconstrained * 0.8
    const tight = await api().post(`/api/v1/sites/${cobalt}/allocations/solve`).set(eng).send({ name: 'Dry summer', supplyLimit: limit, units: ids.map((studyId) => ({ studyId })), save: true })
    expect(tight.status).toBe(200)
    expect(tight.body.used).toBeLessThanOrEqual(limit + 1e-6)
    expect(tight.body.totalCost).toBeGreaterThan(free.body.totalCost)
    expect(tight.body.shadowPrice).toBeGreaterThan(0)
    expect(tight.body.units.every((u: { recovery: number }) => u.recovery > 0 && u.recovery < 1)).toBe(true)
    expect(tight.body.id).toBeGreaterThan(0)
    const saved = await api().get(`/api/v1/sites/${cobalt}/allocations/${tight.body.id}`).set({ Authorization: `Bearer ${await tokenFor('reviewer')}` })
    expect(saved.body.name).toBe('Dry summer')
  })

  it('bad requests name the field', async () => {
    const { cobalt, marrow } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const none = await api().post(`/api/v1/sites/${cobalt}/allocations/solve`).set(eng).send({ supplyLimit: 10, units: [] })
    expect(none.status).toBe(400)
    expect(none.body.error.details[0].path).toBe('body.units')
    const foreign = (await api().get(`/api/v1/sites/${marrow}/studies`).set(eng)).body.items[0].id as number
    const other = await api().post(`/api/v1/sites/${cobalt}/allocations/solve`).set(eng).send({ supplyLimit: 10, units: [{ studyId: foreign }] })
    expect(other.status).toBe(400)
    expect(other.body.error.details[0].path).toBe('body.units.0.studyId')
    const rev = await api().post(`/api/v1/sites/${cobalt}/allocations/solve`).set({ Authorization: `Bearer ${await tokenFor('reviewer')}` }).send({ supplyLimit: 10, units: [{ studyId: foreign }] })
    expect(rev.status).toBe(403)
  })

  it('lists each absorber with its design solvent flow before solving', async () => {
    const { cobalt } = await siteIds()
    const rev = { Authorization: `Bearer ${await tokenFor('reviewer')}` }
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const res = await api().get(`/api/v1/sites/${cobalt}/allocations/absorbers`).set(rev)
    expect(res.status).toBe(200)
    const list = res.body as { studyId: number; name: string; designFlow: number | null }[]
    const withRun = list.filter((a) => a.designFlow !== null).slice(0, 2)
    expect(withRun.length).toBe(2)
    // the same design flows the solver uses (its default bounds are half and twice them)
    const solved = await api().post(`/api/v1/sites/${cobalt}/allocations/solve`).set(eng).send({ supplyLimit: 1000, units: withRun.map((a) => ({ studyId: a.studyId })) })
    expect(solved.status).toBe(200)
    for (const a of withRun) {
      const u = (solved.body.units as { id: number; designFlow: number; minFlow: number }[]).find((x) => x.id === a.studyId)
      expect(u?.designFlow).toBeCloseTo(a.designFlow as number, 9)
      expect(u?.minFlow).toBeCloseTo(0.5 * (a.designFlow as number), 9)
    }
  })

  it('an infeasible supply is not saved unless asked', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const list = (await api().get(`/api/v1/sites/${cobalt}/allocations/absorbers`).set(eng)).body as { studyId: number; designFlow: number | null }[]
    const two = list.filter((a) => a.designFlow !== null).slice(0, 2)
    // a supply below the sum of the lowest flows (half the design flows) cannot be split
    const tiny = two.reduce((x, a) => x + 0.5 * (a.designFlow as number), 0) * 0.5
    const before = ((await api().get(`/api/v1/sites/${cobalt}/allocations`).set(eng)).body as unknown[]).length
    const r = await api().post(`/api/v1/sites/${cobalt}/allocations/solve`).set(eng).send({ name: 'Too little', supplyLimit: tiny, units: two.map((a) => ({ studyId: a.studyId })), save: true })
    expect(r.status).toBe(200)
    expect(r.body.feasible).toBe(false)
    expect(r.body.saved).toBe(false)
    expect(r.body.id).toBeNull()
    expect(((await api().get(`/api/v1/sites/${cobalt}/allocations`).set(eng)).body as unknown[]).length).toBe(before)
    const forced = await api().post(`/api/v1/sites/${cobalt}/allocations/solve`).set(eng).send({ name: 'Too little, kept', supplyLimit: tiny, units: two.map((a) => ({ studyId: a.studyId })), save: true, saveInfeasible: true })
    expect(forced.body.saved).toBe(true)
    expect(forced.body.id).toBeGreaterThan(0)
  })
})
