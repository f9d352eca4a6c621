import { describe, it, expect } from 'vitest'
import { readFileSync } from 'node:fs'
import { api, tokenFor, siteIds } from './helpers.ts'
import { setOptimiseQueueLimit } from '../../server/services/optimise-pool.ts'

const demo = JSON.parse(readFileSync('data/demo-studies.json', 'utf8')) as { studies: { inputs: Record<string, unknown> }[] }
const ethanolCase = demo.studies[0]!.inputs

async function auth() {
  return { Authorization: `Bearer ${await tokenFor('engineer')}` }
}

describe('POST /designs/evaluate', () => {
  it('designs a case and returns the fixed summary keys, checks and the vessel caution', async () => {
    const r = await api().post('/api/v1/designs/evaluate').set(await auth()).send(ethanolCase)
    expect(r.status).toBe(200)
    for (const k of [
      'minimumSolventFlow', 'solventFlow', 'absorptionFactor', 'theoreticalStages', 'actualTrays', 'outletGasSoluteMoleFraction',
      'richSolventSoluteMoleFraction', 'gasDensity', 'flowParameter', 'capacityFactor', 'floodingVelocity', 'downcomerAreaFraction',
      'holeAreaFraction', 'traySpacing', 'diameter', 'selectedDiameter', 'pressureDropPerTray', 'columnPressureDrop', 'columnHeight',
    ]) expect(typeof r.body.summary[k], k).toBe('number')
    expect(r.body.checks.length).toBeGreaterThanOrEqual(5)
    expect(r.body.cautions.join(' ')).toMatch(/licensed engineer/i)
    expect(r.body.totalAnnualCost).toBeUndefined()
  })

  it('prices the design with a preset or the site basis in force', async () => {
    const { cobalt } = await siteIds()
    const a = await api().post('/api/v1/designs/evaluate').set(await auth()).send({ case: ethanolCase, costBasis: { preset: 'halvard-cobalt-ridge' } })
    expect(a.status).toBe(200)
    expect(a.body.totalAnnualCost).toBeGreaterThan(0)
    const b = await api().post('/api/v1/designs/evaluate').set(await auth()).send({ case: ethanolCase, siteId: cobalt })
    expect(b.body.totalAnnualCost).toBeGreaterThan(0)
  })

  it('a batch answers in order', async () => {
    const two = { ...ethanolCase, recovery: 0.95 }
    const r = await api().post('/api/v1/designs/evaluate').set(await auth()).send({ cases: [ethanolCase, two] })
    expect(r.status).toBe(200)
    expect(r.body).toHaveLength(2)
    expect(r.body[0].summary.recovery).toBeCloseTo(0.985, 6)
    expect(r.body[1].summary.recovery).toBeCloseTo(0.95, 6)
  })

  it('bad input: 400 with the field path', async () => {
    const neg = structuredClone(ethanolCase) as { gas: Record<string, unknown> }
    neg.gas.flow = -5
    const r = await api().post('/api/v1/designs/evaluate').set(await auth()).send(neg)
    expect(r.status).toBe(400)
    expect(r.body.error.details.map((d: { path: string }) => d.path)).toContain('body.gas.flow')

    const unit = structuredClone(ethanolCase) as { gas: Record<string, unknown> }
    unit.gas.pressure = { value: 1, unit: 'furlong' }
    const u = await api().post('/api/v1/designs/evaluate').set(await auth()).send(unit)
    expect(u.status).toBe(400)
    expect(u.body.error.details[0].path).toMatch(/^body\.gas\.pressure/)

    const missing = structuredClone(ethanolCase) as Record<string, unknown>
    delete missing.recovery
    expect((await api().post('/api/v1/designs/evaluate').set(await auth()).send(missing)).status).toBe(400)

  })

  it('a batch keeps going: each refused case gets its own error slot, the others their design', async () => {
    const neg = structuredClone(ethanolCase) as { gas: Record<string, unknown> }
    neg.gas.flow = -5
    // lean solvent already richer than the gas leaving at the target: valid input, no design
    const loaded = { ...ethanolCase, solvent: { name: 'water', soluteMoleFraction: 0.05 } }
    const batch = await api().post('/api/v1/designs/evaluate').set(await auth()).send({ cases: [ethanolCase, neg, loaded, { ...ethanolCase, recovery: 0.95 }] })
    expect(batch.status).toBe(200)
    expect(batch.body).toHaveLength(4)
    expect(batch.body[0].summary.recovery).toBeCloseTo(0.985, 6)
    expect(batch.body[1].error.code).toBe('validation_failed')
    expect(batch.body[1].error.issues[0].path).toBe('body.cases.1.gas.flow')
    expect(typeof batch.body[1].error.issues[0].message).toBe('string')
    expect(batch.body[2].error.code).toBe('infeasible_design')
    expect(batch.body[2].error.issues[0].path).toBe('body.cases.2.solvent.soluteMoleFraction')
    expect(batch.body[3].summary.recovery).toBeCloseTo(0.95, 6)
    expect(batch.headers['x-cases-refused']).toBe('2')
  })

  it('infeasible input: 400/422 with a reason a person understands', async () => {
    const low = { ...ethanolCase, solventFactor: 0.9 }
    const r = await api().post('/api/v1/designs/evaluate').set(await auth()).send(low)
    expect([400, 422]).toContain(r.status)
    expect(r.body.error.details[0].path).toBe('body.solventFactor')
    const full = { ...ethanolCase, recovery: 1 }
    const f = await api().post('/api/v1/designs/evaluate').set(await auth()).send(full)
    expect([400, 422]).toContain(f.status)
    expect(f.body.error.details[0].path).toBe('body.recovery')
  })

  it('a non-member cannot borrow another site\'s cost basis', async () => {
    const { cobalt } = await siteIds()
    const r = await api().post('/api/v1/designs/evaluate').set('Authorization', `Bearer ${await tokenFor('bayEngineer')}`).send({ case: ethanolCase, siteId: cobalt })
    expect(r.status).toBe(403)
  })
})

describe('POST /designs/optimize', () => {
  it('returns the optimum, curves, sensitivity and the evaluation count', async () => {
    const r = await api().post('/api/v1/designs/optimize').set(await auth()).send({ case: ethanolCase, costBasis: { preset: 'halvard-cobalt-ridge' } })
    expect(r.status).toBe(200)
    const o = r.body.optimum
    for (const k of ['recovery', 'solventFactor', 'traySpacing', 'floodFraction', 'actualTrays', 'selectedDiameter', 'totalAnnualCost']) expect(typeof o[k], k).toBe('number')
    expect(r.body.evaluations).toBeGreaterThan(10)
    expect(r.body.curves.recovery.length).toBeGreaterThan(3)
    expect(r.body.curves.solventFactor.length).toBeGreaterThan(3)
    expect(r.body.sensitivity.length).toBeGreaterThan(3)
  })

  it('an unreachable emission limit comes back from the worker thread as a 422 with its field', async () => {
    const r = await api().post('/api/v1/designs/optimize').set(await auth())
      .send({ case: ethanolCase, search: { emissionLimit: 0, recovery: { min: 0.8, max: 0.99 } } })
    expect(r.status).toBe(422)
    expect(r.body.error.details[0]).toMatchObject({ path: 'body.search.emissionLimit', code: 'emissionLimitUnreachable' })
  })

  it('the same optimisation twice gives the same answer', async () => {
    const body = { case: { ...ethanolCase, recovery: 0.97 }, costBasis: { preset: 'halvard-marrow-bay' }, search: { sensitivity: false } }
    const a = await api().post('/api/v1/designs/optimize').set(await auth()).send(body)
    const b = await api().post('/api/v1/designs/optimize').set(await auth()).send(body)
    expect(a.status).toBe(200)
    expect(b.body).toEqual(a.body)
  })

  it('a full optimisation queue answers 503 with Retry-After in the usual error shape; queued ones finish', async () => {
    const old = setOptimiseQueueLimit(1)
    try {
      const token = await auth()
      const flows = Array.from({ length: 8 }, (_, i) => 400 + i * 3.1)
      const answers = await Promise.all(
        flows.map((flow) =>
          api().post('/api/v1/designs/optimize').set(token)
            .send({ case: { ...ethanolCase, gas: { ...(ethanolCase.gas as object), flow } }, search: { sensitivity: false } }),
        ),
      )
      const busy = answers.filter((a) => a.status === 503)
      expect(busy.length).toBeGreaterThan(0)
      for (const b of busy) {
        expect(Number(b.headers['retry-after'])).toBeGreaterThanOrEqual(1)
        expect(b.body.error.code).toBe('busy')
        expect(typeof b.body.error.message).toBe('string')
      }
      expect(answers.filter((a) => a.status === 200).length + busy.length).toBe(flows.length)
    } finally {
      setOptimiseQueueLimit(old)
    }
  })

  it('bad search settings: 400 with the path', async () => {
    const r = await api().post('/api/v1/designs/optimize').set(await auth()).send({ case: ethanolCase, search: { recovery: { min: 0.99, max: 0.9 } } })
    expect(r.status).toBe(400)
    expect(r.body.error.details[0].path).toMatch(/^body\.search\.recovery/)
  })
})

describe('GET /components', () => {
  it('lists the library with hazards', async () => {
    const r = await api().get('/api/v1/components').set(await auth())
    expect(r.status).toBe(200)
    const names = r.body.map((c: { name: string }) => c.name)
    for (const n of ['water', 'carbon dioxide', 'nitrogen', 'air', 'ethanol', 'methanol', 'acetone', 'ammonia', 'isopropanol']) expect(names).toContain(n)
  })
})

describe('POST /designs/rate', () => {
  const rating = JSON.parse(readFileSync('data/examples/rate.json', 'utf8')) as Record<string, unknown>

  it('rates a standing column: the fixed summary keys, checks and the window', async () => {
    const r = await api().post('/api/v1/designs/rate').set(await auth()).send({ case: rating })
    expect(r.status).toBe(200)
    for (const k of [
      'recovery', 'outletGasSoluteMoleFraction', 'richSolventSoluteMoleFraction', 'theoreticalStages', 'overallEfficiency',
      'percentFlood', 'floodingGasFlow', 'weepingGasFlow', 'pressureDropPerTray', 'columnPressureDrop',
    ]) expect(typeof r.body.summary[k], k).toBe('number')
    expect(r.body.checks.map((c: { key: string }) => c.key)).toEqual(expect.arrayContaining(['flooding', 'weeping', 'entrainment', 'downcomerBackup']))
    expect(r.body.window.boundaries).toHaveLength(4)
    expect(r.body.window.current.gasFlow).toBeCloseTo(504, 6)
  })

  it('takes the same units as a design case (US customary in, SI kmol/h out)', async () => {
    const us = { ...rating, solventFlow: { value: 340 / 0.45359237, unit: 'lbmol/h' }, column: { ...(rating.column as object), diameter: { value: 1.45 / 0.3048, unit: 'ft' } } }
    const [a, b] = await Promise.all([
      api().post('/api/v1/designs/rate').set(await auth()).send({ case: rating }),
      api().post('/api/v1/designs/rate').set(await auth()).send({ case: us }),
    ])
    expect(b.status).toBe(200)
    expect(b.body.summary.recovery).toBeCloseTo(a.body.summary.recovery, 9)
    expect(b.body.operation.solventFlow).toBeCloseTo(340, 6)
  })

  it('a batch answers in order; a bad case is refused with its field path', async () => {
    const more = { ...rating, solventFlow: 400 }
    const ok = await api().post('/api/v1/designs/rate').set(await auth()).send({ cases: [rating, more] })
    expect(ok.status).toBe(200)
    expect(ok.body).toHaveLength(2)
    expect(ok.body[1].summary.recovery).toBeGreaterThan(ok.body[0].summary.recovery)
    const bad = await api().post('/api/v1/designs/rate').set(await auth()).send({ cases: [rating, { ...rating, column: { ...(rating.column as object), actualTrays: 0 } }] })
    expect(bad.status).toBe(400)
    expect(bad.body.error.details[0].path).toBe('body.cases.1.column.actualTrays')
  })

  it('needs a signed-in person', async () => {
    const r = await api().post('/api/v1/designs/rate').send({ case: rating })
    expect(r.status).toBe(401)
  })
})
