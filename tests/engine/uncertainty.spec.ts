/**
 * Uncertainty propagation: verified against an independent calculation, reproducible from its
 * seed, and the fast per-sample rating held to the standing-column rating path.
 */
import { describe, expect, it } from 'vitest'
import { readFileSync } from 'node:fs'
import { erf } from 'mathjs'
import { caseToSI } from '../../server/engine/index.ts'
import { loadPreset } from '../../server/engine/costing/presets.ts'
import { designSI } from '../../server/engine/design.ts'
import { rateCase } from '../../server/engine/rating/index.ts'
import { ratingCaseOfDesign } from '../../server/engine/rating/fromDesign.ts'
import { parseUncertainty, uncertaintySI } from '../../server/engine/uncertainty/index.ts'
import { fixColumn, rateSample, scratchOf, type SampleMultipliers, type SampleRating } from '../../server/engine/uncertainty/column.ts'
import { latinHypercube, samplerOf } from '../../server/engine/uncertainty/distributions.ts'
import { normalCdf, normalQuantile, seedRng } from '../../server/engine/uncertainty/random.ts'
import { proportionError, spreadOf } from '../../server/engine/uncertainty/statistics.ts'
import { InvalidInputError } from '../../server/engine/errors.ts'
import { summaryToPublic, uncertaintyToPublic } from '../../shared/summaryUnits.ts'

const basis = loadPreset('halvard-cobalt-ridge')
/** Standard normal CDF from mathjs's erf: an implementation independent of the product's. */
const Phi = (x: number) => 0.5 * (1 + (erf(x / Math.SQRT2) as number))

/** A dilute gas (y_in = 1e-5), straight equilibrium line, fixed tray efficiency: the Kremser case. */
const diluteCase = {
  gas: { flow: 100, temperature: 25, pressure: 101.325, soluteMoleFraction: 1e-5, carrier: 'air' },
  solute: 'acetone',
  solvent: { name: 'water', temperature: 25, soluteMoleFraction: 0 },
  equilibrium: { model: 'constantK', K: 1.2 },
  recovery: 0.95,
  solventFactor: 1.4,
  efficiency: { model: 'fixed', value: 0.5 },
  method: 'kremser',
}

describe('propagation against an independent Kremser calculation', () => {
  // Source: Kremser equation (kremser1930), fraction absorbed with a solute-free lean solvent
  //   phi = (A^(N+1) - A) / (A^(N+1) - 1), A = L / (K V), N = installed trays x efficiency.
  // With K = K0 mK (mK lognormal, sigma 0.2) and E = E0 mE (mE normal, sd 0.15, truncated to
  // (0.01, 1/E0]) the target phi >= 0.95 holds when mK <= mK*(mE) (phi falls as K rises), so
  //   P = int f(mE) Phi(ln mK*(mE) / sigma) dmE / int f(mE) dmE,
  // integrated here by Simpson's rule with erf from mathjs (not the product's own functions).
  it('the probability of meeting the target agrees within the sampling error it reports', () => {
    const c = caseToSI(diluteCase)
    const spec = parseUncertainty({ samples: 10000, seed: 7, K: { distribution: 'lognormal', sigma: 0.2 }, efficiency: { distribution: 'normal', relativeSd: 0.15 } })
    const r = uncertaintySI(c, basis, spec)
    expect(r.design.method).toBe('kremser')
    const d = designSI(c)
    const L = summaryToPublic(d.summary).solventFlow // kmol/h
    const V = 100 // kmol/h
    const K0 = 1.2
    const E0 = 0.5
    const trays = d.summary.actualTrays
    const phi = (mK: number, mE: number) => {
      const A = L / (K0 * mK * V)
      const N = trays * E0 * mE
      const AN1 = Math.pow(A, N + 1)
      return (AN1 - A) / (AN1 - 1)
    }
    const threshold = (mE: number) => {
      let lo = -12, hi = 12 // ln mK
      if (phi(Math.exp(lo), mE) < 0.95) return 0
      if (phi(Math.exp(hi), mE) >= 0.95) return Infinity
      for (let i = 0; i < 200; i++) {
        const mid = 0.5 * (lo + hi)
        if (phi(Math.exp(mid), mE) >= 0.95) lo = mid
        else hi = mid
      }
      return Math.exp(lo)
    }
    const pdf = (x: number) => Math.exp(-0.5 * ((x - 1) / 0.15) ** 2)
    const a = 0.01, b = 1 / E0, M = 4000
    let num = 0, den = 0
    for (let i = 0; i <= M; i++) {
      const x = a + ((b - a) * i) / M
      const w = i === 0 || i === M ? 1 : i % 2 ? 4 : 2
      const t = threshold(x)
      const pK = t === 0 ? 0 : t === Infinity ? 1 : Phi(Math.log(t) / 0.2)
      num += w * pdf(x) * pK
      den += w * pdf(x)
    }
    const reference = num / den
    const se = r.samplingError.probabilityMeetsTarget.standardError
    // the reference is a real uncertainty (neither 0 nor 1), so the comparison can fail
    expect(reference).toBeGreaterThan(0.2)
    expect(reference).toBeLessThan(0.9)
    expect(se).toBeGreaterThan(0)
    expect(Math.abs(r.probabilityMeetsTarget - reference)).toBeLessThanOrEqual(3 * se)
    // the reported error is the binomial one of 10,000 samples
    expect(se).toBeCloseTo(Math.sqrt((r.probabilityMeetsTarget * (1 - r.probabilityMeetsTarget)) / 9999), 12)
    expect(r.samplingError.probabilityMeetsTarget.low95).toBeLessThan(reference + 3 * se)
  })

  it('the same seed reproduces every number bit for bit; another seed does not', () => {
    const c = caseToSI(diluteCase)
    const run = (seed: number) => {
      const r = uncertaintySI(c, basis, parseUncertainty({ samples: 2000, seed, gasFlow: { distribution: 'triangular', low: 0.8, mode: 1, high: 1.3 }, productValue: { distribution: 'uniform', low: 0.5, high: 1.5 } }))
      const { stats: _s, ...rest } = r
      return JSON.stringify(rest)
    }
    expect(run(11)).toBe(run(11))
    expect(run(12)).not.toBe(run(11))
  })
})

describe('the per-sample rating is the standing-column rating', () => {
  const raw = (JSON.parse(readFileSync('data/examples/optimize.json', 'utf8')) as { case: Record<string, unknown> }).case
  const c = caseToSI(raw)
  const d = designSI(c)
  const fc = fixColumn(c, d, basis)
  const ones: SampleMultipliers = { K: 1, efficiency: 1, gasFlow: 1, soluteMoleFraction: 1, electricity: 1, solventCost: 1, productValue: 1, emissionCharge: 1, capitalCost: 1 }
  const rated = (m: Partial<SampleMultipliers>) => rateSample(fc, { ...ones, ...m }, scratchOf(fc), {} as SampleRating)
  const viaRatingPath = (m: { K: number; gasFlow: number; soluteMoleFraction: number }) => {
    const rc = ratingCaseOfDesign(raw, summaryToPublic(d.summary)) as Record<string, Record<string, unknown>>
    const gas = { ...rc.gas, flow: (raw.gas as { flow: number }).flow * m.gasFlow, soluteMoleFraction: (raw.gas as { soluteMoleFraction: number }).soluteMoleFraction * m.soluteMoleFraction }
    // the samples keep the balance method of the nominal design (no jump between methods)
    return rateCase({ ...rc, gas, equilibrium: { model: 'constantK', K: 0.62 * m.K }, method: fc.nominal.method })
  }
  for (const m of [
    { K: 1, gasFlow: 1, soluteMoleFraction: 1 },
    { K: 1.3, gasFlow: 1.1, soluteMoleFraction: 0.8 },
    { K: 0.7, gasFlow: 0.85, soluteMoleFraction: 1.25 },
  ]) {
    it(`recovery and percent flood agree at K x${m.K}, gas x${m.gasFlow}, y_in x${m.soluteMoleFraction}`, () => {
      const fast = rated(m)
      const ref = viaRatingPath(m)
      expect(fast.recovery).toBeCloseTo(ref.summary.recovery, 9)
      expect(fast.percentFlood / ref.summary.percentFlood).toBeCloseTo(1, 9)
      expect(fast.overallEfficiency).toBeCloseTo(ref.summary.overallEfficiency, 9)
    })
  }
  it('TAC at nominal values differs from the design price only by the lost product the rounded-up trays save and the rated pressure drop', () => {
    const nominal = rated({})
    // common practice check, no source: same capital, same solvent; within 5 % of the design's price
    expect(Math.abs(nominal.totalAnnualCost / fc.cost.nominalTotalAnnualCost - 1)).toBeLessThan(0.05)
    // a higher product value raises the cost of what escapes, and only that
    const dearer = rated({ productValue: 2 })
    const lost = nominal.soluteLost * basis.general.operatingHours * basis.utilities.productValue
    expect(dearer.totalAnnualCost - nominal.totalAnnualCost).toBeCloseTo(lost, 6)
  })
})

describe('sampling', () => {
  it('the normal quantile and CDF match an independent erf (mathjs)', () => {
    for (const p of [1e-6, 0.001, 0.02, 0.1, 0.3, 0.5, 0.7, 0.975, 0.999999]) {
      const x = normalQuantile(p)
      expect(Math.abs(Phi(x) - p) / Math.min(p, 1 - p)).toBeLessThan(1e-7)
    }
    for (const x of [-4, -1.5, 0, 0.3, 2.5]) expect(Math.abs(normalCdf(x) - Phi(x))).toBeLessThan(2e-7)
  })
  it('a Latin hypercube uses every stratum once, and its mean is close to the distribution mean', () => {
    const s = samplerOf({ distribution: 'lognormal', sigma: 0.2, median: 1 }, 0.01, Infinity)!
    const n = 5000
    const { values, ranks } = latinHypercube(s, n, 3, 0)
    expect([...ranks].sort((a, b) => a - b)).toEqual(Array.from({ length: n }, (_, i) => i))
    for (let i = 0; i < n; i++) {
      const u = Phi(Math.log(values[i]!) / 0.2)
      expect(Math.floor(u * n + 1e-9 * n)).toBeGreaterThanOrEqual(ranks[i]! - 1)
      expect(Math.floor(u * n - 1e-9 * n)).toBeLessThanOrEqual(ranks[i]!)
    }
    // lognormal mean exp(sigma^2 / 2) (textbook identity)
    let sum = 0
    for (const v of values) sum += v
    expect(sum / n).toBeCloseTo(Math.exp(0.02), 3)
  })
  it('a truncated normal efficiency multiplier never exceeds its bound', () => {
    const s = samplerOf({ distribution: 'normal', relativeSd: 0.5, mean: 1 }, 0.01, 1.25)!
    const { values } = latinHypercube(s, 4000, 9, 1)
    expect(Math.max(...values)).toBeLessThanOrEqual(1.25)
    expect(Math.min(...values)).toBeGreaterThanOrEqual(0.01)
    expect(s.mass).toBeCloseTo(Phi(0.5) - Phi(-1.98), 6)
  })
  it('the generator is reproducible and spreads evenly', () => {
    const a = seedRng(42), b = seedRng(42)
    const counts = new Array(10).fill(0)
    for (let i = 0; i < 100000; i++) {
      const x = a.next()
      expect(x).toBe(b.next())
      counts[Math.floor(x * 10)]++
    }
    // chi-square with 9 degrees of freedom: below 27.9 with probability 0.999 (statistical table)
    const chi = counts.reduce((s, k) => s + (k - 10000) ** 2 / 10000, 0)
    expect(chi).toBeLessThan(27.9)
  })
  it('percentiles and the Wilson interval', () => {
    const v = new Float64Array(Array.from({ length: 101 }, (_, i) => i))
    expect(spreadOf(v)).toEqual({ mean: 50, p05: 5, p50: 50, p95: 95 })
    // Wilson score interval for 0 of 100 (wilson1927): upper bound z^2/(n + z^2) = 0.0370
    const e = proportionError(0, 100)
    expect(e.low95).toBe(0)
    expect(e.high95).toBeCloseTo(0.0370, 4)
  })
})

describe('bad input', () => {
  it('a distribution with no weight on physical values is refused with its path', () => {
    const c = caseToSI(diluteCase)
    expect(() => uncertaintySI(c, basis, parseUncertainty({ gasFlow: { distribution: 'uniform', low: 0, high: 0.005 } }))).toThrow(InvalidInputError)
    try {
      parseUncertainty({ K: { distribution: 'uniform', low: 2, high: 1 } })
    } catch (e) {
      expect((e as InvalidInputError).path).toBe('uncertainty.K.high')
    }
    expect(() => parseUncertainty({ samples: 5 })).toThrow(InvalidInputError)
  })
})

describe('units of the answer', () => {
  // SI inside the engine: the propagation reports the design's solvent flow in mol/s, and the edge
  // (shared/summaryUnits.ts) gives kmol/h, the case-file unit (1 kmol/h = 1000/3600 mol/s, exact).
  it('the engine answers in mol/s; uncertaintyToPublic converts to kmol/h', () => {
    const c = caseToSI(diluteCase)
    const r = uncertaintySI(c, basis, parseUncertainty({ samples: 200, seed: 3 }))
    const d = designSI(c)
    expect(r.design.solventFlow).toBeCloseTo(d.summary.solventFlow, 12)
    expect(uncertaintyToPublic(r).design.solventFlow).toBeCloseTo((d.summary.solventFlow * 3600) / 1000, 9)
    expect(uncertaintyToPublic(r).probabilityMeetsTarget).toBe(r.probabilityMeetsTarget)
  })
})
