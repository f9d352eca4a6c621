/**
 * POST /designs/uncertainty and the robust optimum of POST /designs/optimize: answers parse with
 * the shared schemas, bad input is a 400 with field paths, and the seed reproduces the answer.
 */
import { describe, it, expect } from 'vitest'
import { readFileSync } from 'node:fs'
import { api, tokenFor } from './helpers.ts'
import { robustResultSchema, uncertaintyResultSchema } from '../../shared/schemas/uncertainty.ts'

const example = JSON.parse(readFileSync('data/examples/uncertainty.json', 'utf8')) as { case: Record<string, unknown>; costBasis: unknown; uncertainty: Record<string, unknown> }
const optimizeFile = JSON.parse(readFileSync('data/examples/optimize.json', 'utf8')) as { case: Record<string, unknown>; search: Record<string, unknown> }

async function auth() {
  return { Authorization: `Bearer ${await tokenFor('engineer')}` }
}

describe('POST /designs/uncertainty', () => {
  it('answers the chance of meeting the target with the fixed keys; the same seed gives the same answer', async () => {
    const body = { ...example, uncertainty: { ...example.uncertainty, samples: 2000 } }
    const [a, b] = await Promise.all([
      api().post('/api/v1/designs/uncertainty').set(await auth()).send(body),
      api().post('/api/v1/designs/uncertainty').set(await auth()).send({ ...body, uncertainty: { ...body.uncertainty, seed: 99 } }),
    ])
    expect(a.status).toBe(200)
    const r = uncertaintyResultSchema.parse(a.body)
    expect(r.samples).toBe(2000)
    for (const k of ['recovery', 'percentFlood', 'totalAnnualCost'] as const) {
      expect(r[k].p05).toBeLessThanOrEqual(r[k].p50)
      expect(r[k].p50).toBeLessThanOrEqual(r[k].p95)
    }
    expect(r.probabilityMeetsTarget).toBeGreaterThan(0)
    expect(r.probabilityMeetsTarget).toBeLessThan(1)
    expect(r.histogram.counts.reduce((s, k) => s + k, 0)).toBe(2000)
    expect(r.contributions[0]!.key).toBe('K')
    expect(r.cautions.join(' ')).toMatch(/licensed engineer/i)
    expect(b.status).toBe(200)
    expect(b.body.probabilityMeetsTarget).not.toBe(r.probabilityMeetsTarget)
    const again = await api().post('/api/v1/designs/uncertainty').set(await auth()).send(body)
    expect(again.body.probabilityMeetsTarget).toBe(r.probabilityMeetsTarget)
    expect(again.body.recovery).toEqual(r.recovery)
  })

  it('an emission limit becomes the target', async () => {
    const r = await api().post('/api/v1/designs/uncertainty').set(await auth()).send({ ...example, search: { emissionLimit: 2 }, uncertainty: { samples: 500 } })
    expect(r.status).toBe(200)
    expect(r.body.target).toMatchObject({ kind: 'emissionLimit', emissionLimit: 2 })
  })

  it('bad distributions and cases are refused with field paths', async () => {
    const bad = await api().post('/api/v1/designs/uncertainty').set(await auth()).send({ ...example, uncertainty: { samples: 10, K: { distribution: 'uniform', low: 2, high: 1 } } })
    expect(bad.status).toBe(400)
    const paths = bad.body.error.details.map((d: { path: string }) => d.path)
    expect(paths).toEqual(expect.arrayContaining(['body.uncertainty.samples', 'body.uncertainty.K.high']))
    const noCase = await api().post('/api/v1/designs/uncertainty').set(await auth()).send({ case: { ...example.case, gas: undefined } })
    expect(noCase.status).toBe(400)
    expect(noCase.body.error.details[0].path).toMatch(/^body\.case\.gas/)
  })

  it('needs a signed-in person', async () => {
    const r = await api().post('/api/v1/designs/uncertainty').send(example)
    expect(r.status).toBe(401)
  })
})

describe('POST /designs/optimize with robust', () => {
  it('gives the robust optimum beside the nominal one, with the margin and both probabilities', async () => {
    const body = {
      case: optimizeFile.case,
      costBasis: { preset: 'halvard-cobalt-ridge' },
      search: { ...optimizeFile.search, recovery: { min: 0.985, max: 0.999 }, sensitivity: false },
      robust: { confidence: 0.9, searchSamples: 300, uncertainty: { samples: 2000, gasFlow: { distribution: 'normal', relativeSd: 0.1 } } },
    }
    const r = await api().post('/api/v1/designs/optimize').set(await auth()).send(body)
    expect(r.status).toBe(200)
    const rob = robustResultSchema.parse(r.body.robust)
    // flows in the answer's unit (kmol/h), the same as the nominal optimum's design summary
    expect(rob.nominal.solventFlow).toBeCloseTo(r.body.optimum.design.summary.solventFlow, 9)
    expect(rob.nominal.totalAnnualCost).toBeCloseTo(r.body.optimum.totalAnnualCost, 6)
    if (rob.found) {
      expect(rob.robust!.probabilityMeetsFloor).toBeGreaterThanOrEqual(0.9)
      expect(rob.margin!.extraTrays).toBe(rob.robust!.actualTrays - rob.nominal.actualTrays)
    } else {
      expect(rob.reason).toMatch(/confidence/)
    }
    const bad = await api().post('/api/v1/designs/optimize').set(await auth()).send({ ...body, robust: { confidence: 2 } })
    expect(bad.status).toBe(400)
    expect(bad.body.error.details[0].path).toBe('body.robust.confidence')
  })
})
