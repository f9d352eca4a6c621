/**
 * The robust optimum: it meets the confidence with the full sample count, costs no more in
 * expectation than a dense grid over the same variables finds, and leaves the nominal optimum as
 * it was. The command lines: the uncertainty file and optimize with `robust`.
 */
import { describe, expect, it } from 'vitest'
import { readFileSync } from 'node:fs'
import { caseToSI } from '../../server/engine/index.ts'
import { loadPreset } from '../../server/engine/costing/presets.ts'
import { designSI } from '../../server/engine/design.ts'
import { optimise } from '../../server/engine/optimisation/optimise.ts'
import { Evaluator, toU } from '../../server/engine/optimisation/evaluator.ts'
import { recoveryBounds, soluteInKgPerHour } from '../../server/engine/optimisation/driver.ts'
import { robustOptimum } from '../../server/engine/uncertainty/robust.ts'
import { fixColumn } from '../../server/engine/uncertainty/column.ts'
import { drawSamples, rateAll } from '../../server/engine/uncertainty/propagate.ts'
import { searchSpecSchema } from '../../shared/schemas/search.ts'
import { robustSpecSchema } from '../../shared/schemas/uncertainty.ts'
import { runOptimizeFile } from '../../server/cli/optimize.ts'
import { runUncertaintyFile } from '../../server/cli/uncertainty.ts'
import { InvalidInputError } from '../../server/engine/errors.ts'
import { robustToPublic } from '../../shared/summaryUnits.ts'

const ex = JSON.parse(readFileSync('data/examples/optimize.json', 'utf8')) as { case: Record<string, unknown>; search: Record<string, unknown> }
const basis = loadPreset('halvard-cobalt-ridge')
const c = caseToSI(ex.case)
const search = searchSpecSchema.parse({ ...ex.search, recovery: { min: 0.985, max: 0.999 }, sensitivity: false, curvePoints: 5 })
const robust = robustSpecSchema.parse({ confidence: 0.9, searchSamples: 400, uncertainty: { samples: 1000, seed: 5, gasFlow: { distribution: 'normal', relativeSd: 0.1 } } })

describe('robust optimum', () => {
  const nominal = optimise(c, basis, search)
  const r = robustOptimum(c, basis, search, nominal, robust)

  it('meets the confidence with the full sample count, and the nominal optimum stays as it was', () => {
    expect(r.found).toBe(true)
    expect(r.robust!.probabilityMeetsFloor).toBeGreaterThanOrEqual(0.9)
    expect(r.nominal.totalAnnualCost).toBe(nominal.optimum.totalAnnualCost)
    expect(optimise(c, basis, search).optimum).toEqual(nominal.optimum)
    expect(r.margin!.extraTrays).toBe(r.robust!.actualTrays - nominal.optimum.actualTrays)
    // SI inside the engine (mol/s); the edge converts to kmol/h (1 kmol/h = 1000/3600 mol/s, exact)
    expect(r.nominal.solventFlow).toBeCloseTo(nominal.optimum.design.summary.solventFlow, 12)
    const pub = robustToPublic(r)
    expect(pub.nominal.solventFlow).toBeCloseTo((r.nominal.solventFlow * 3600) / 1000, 9)
    expect(pub.robust!.solventFlow).toBeCloseTo((r.robust!.solventFlow * 3600) / 1000, 9)
    expect(pub.margin!.extraSolventFlow).toBeCloseTo((r.margin!.extraSolventFlow * 3600) / 1000, 9)
    // the nominal optimum is designed for the lowest TAC at nominal values: it cannot beat it there
    expect(r.robust!.totalAnnualCost).toBeGreaterThanOrEqual(nominal.optimum.totalAnnualCost - 1e-6)
  })

  it('costs no more in expectation than a dense grid over the same variables finds (same samples)', () => {
    const [rLo, rHi] = recoveryBounds(search, soluteInKgPerHour(c))
    const o = nominal.optimum
    const set = drawSamples(robust.uncertainty!, c, o.design.summary.overallEfficiency ?? 1, robust.uncertainty!.samples)
    const ev = new Evaluator((v) => designSI(c, v, { profile: false, detail: false }), search, rLo, rHi)
    const t = search.traySpacings.indexOf(o.traySpacing)
    let best = Infinity
    for (let i = 0; i <= 14; i++) {
      const rec = rLo + ((rHi - rLo) * i) / 14
      for (let j = 0; j <= 10; j++) {
        const s = search.solventFactor.min + ((search.solventFactor.max - search.solventFactor.min) * j) / 10
        const x = { u: toU(rec), s, f: o.floodFraction, t }
        if (typeof ev.designAt(x) === 'string') continue
        const d = ev.resultAt(x)
        const out = rateAll(fixColumn(c, d, basis), set, { kind: 'recovery', recovery: rLo, emissionLimit: null })
        let k = 0, sum = 0
        for (let n = 0; n < set.n; n++) {
          k += out.meets[n]!
          sum += out.totalAnnualCost[n]!
        }
        if (k / set.n >= 0.9) best = Math.min(best, sum / set.n)
      }
    }
    expect(Number.isFinite(best)).toBe(true)
    // within 1 % of the grid's best (the search tests fewer points, the grid is coarse in places)
    expect(r.robust!.expectedTotalAnnualCost).toBeLessThanOrEqual(best * 1.01)
  })

  it('says so when no design reaches the confidence', () => {
    const hard = robustSpecSchema.parse({ confidence: 0.99, searchSamples: 200, uncertainty: { samples: 500, K: { distribution: 'lognormal', sigma: 1.5 } } })
    const none = robustOptimum(c, basis, search, nominal, hard)
    expect(none.found).toBe(false)
    expect(none.robust).toBeNull()
    expect(none.reason).toMatch(/confidence/)
  })
})

describe('command lines', () => {
  it('uncertainty: the example file gives the fixed keys', () => {
    const raw = JSON.parse(readFileSync('data/examples/uncertainty.json', 'utf8')) as Record<string, unknown>
    const out = runUncertaintyFile({ ...raw, uncertainty: { ...(raw.uncertainty as object), samples: 1000 } })
    for (const k of ['probabilityMeetsTarget', 'probabilityFlooding'] as const) expect(out[k]).toBeGreaterThanOrEqual(0)
    expect(Object.keys(out.recovery)).toEqual(['mean', 'p05', 'p50', 'p95'])
    expect(() => runUncertaintyFile({ ...raw, extra: 1 })).toThrow(InvalidInputError)
  })
  it('optimize with robust adds the robust optimum; a bad confidence names its path', () => {
    const file = { case: ex.case, search: { ...ex.search, recovery: { min: 0.985, max: 0.999 }, sensitivity: false, curvePoints: 5 }, robust: { confidence: 0.9, searchSamples: 200, uncertainty: { samples: 500 } } }
    const out = runOptimizeFile(file) as { robust?: { found: boolean } }
    expect(out.robust).toBeDefined()
    try {
      runOptimizeFile({ ...file, robust: { confidence: 1.5 } })
      expect.unreachable()
    } catch (e) {
      expect((e as InvalidInputError).path).toBe('robust.confidence')
    }
  })
})
