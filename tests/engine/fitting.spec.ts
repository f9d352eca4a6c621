import { describe, expect, it } from 'vitest'
import { Matrix, inverse, pseudoInverse } from 'ml-matrix'
import { convertLogBase, costFromFit, fitCostCurve, FitError, logSpacedSizes, type FitPoint } from '../../server/engine/fitting/index.ts'
import { costFromCurve } from '../../server/engine/costing/index.ts'
import { loadPreset } from '../../server/engine/costing/presets.ts'

function near(actual: number, expected: number, relTol: number): void {
  expect(Math.abs(actual - expected) / Math.max(Math.abs(expected), 1e-300)).toBeLessThanOrEqual(relTol)
}

/** A fixed, repeatable scatter (no random numbers: the test must be the same every run). */
const SCATTER = [0.07, -0.05, 0.11, -0.09, 0.02, -0.12, 0.06, 0.0, -0.03, 0.08]

describe('log-space least squares of cost curves', () => {
  it('recovers a power law from exact data; exponent equals the closed-form two-point slope', () => {
    // Closed form: for C = A S^n, n = ln(C2/C1) / ln(S2/S1) and ln A = ln C1 − n ln S1 (algebra of logarithms).
    const A = 2150
    const n = 0.62
    const pts: FitPoint[] = [2, 5, 13, 40, 110].map((S) => ({ size: S, cost: A * Math.pow(S, n) }))
    const fit = fitCostCurve(pts, 'power', 'e')
    const p0 = pts[0]!
    const p4 = pts[4]!
    const nTwoPoint = Math.log(p4.cost / p0.cost) / Math.log(p4.size / p0.size)
    const lnATwoPoint = Math.log(p0.cost) - nTwoPoint * Math.log(p0.size)
    near(fit.coefficients[1]!, nTwoPoint, 1e-12)
    near(fit.coefficients[0]!, lnATwoPoint, 1e-12)
    near(fit.coefficients[1]!, n, 1e-12)
    near(Math.exp(fit.coefficients[0]!), A, 1e-12)
    expect(fit.r2).toBeCloseTo(1, 12)
    expect(fit.dof).toBe(3)
    for (const r of fit.residuals) expect(Math.abs(r.relativeError)).toBeLessThan(1e-12)
  })

  it('recovers the Turton sieve-tray curve (base 10) from exact data and reproduces its check value', () => {
    // Source: Turton et al., Analysis, Synthesis and Design of Chemical Processes, 3rd ed., Appendix A:
    // sieve trays log10 Cp = 2.9949 + 0.4465 log10 A + 0.3961 (log10 A)^2, A in m2 (0.07-12.3), CEPCI 397.
    // Check value: A = 7.0686 m2 (3 m tower) -> 4569.4 USD (reproduced from Turton Example 7.13, 5 digits).
    const turtonTrays = loadPreset('turton-3rd-cepci397').correlations.trays.curve
    expect(turtonTrays.coefficients).toEqual([2.9949, 0.4465, 0.3961])
    const pts = logSpacedSizes(0.07, 12.3, 9).map((S) => ({ size: S, cost: costFromCurve(S, turtonTrays) }))
    const fit = fitCostCurve(pts, 'quadraticLog', '10')
    near(fit.coefficients[0]!, 2.9949, 1e-10)
    near(fit.coefficients[1]!, 0.4465, 1e-10)
    near(fit.coefficients[2]!, 0.3961, 1e-10)
    expect(fit.r2).toBeCloseTo(1, 12)
    near(costFromFit(7.0686, fit.coefficients, '10'), 4569.4, 1e-5)
  })

  it('recovers the Seider centrifugal-pump curve (base e, quadratic in ln S) from exact data', () => {
    // Source: Seider, Seader, Lewin, Product and Process Design Principles, 3rd ed. (from memory):
    // C_B = exp{9.7171 − 0.6019 ln S + 0.0519 (ln S)^2}, S = Q(gpm)·H(ft)^0.5, 400–1e5, CE 500.
    const c = [9.7171, -0.6019, 0.0519]
    const pts = [400, 1200, 5000, 20000, 100000].map((S) => ({ size: S, cost: Math.exp(c[0]! + c[1]! * Math.log(S) + c[2]! * Math.log(S) ** 2) }))
    const fit = fitCostCurve(pts, 'quadraticLog', 'e')
    fit.coefficients.forEach((v, k) => near(v, c[k]!, 1e-9))
    expect(fit.r2).toBeCloseTo(1, 12)
  })

  it('matches the normal-equations solution computed with ml-matrix on scattered data', () => {
    // General-purpose check: c = (XᵀX)^-1 Xᵀy with ml-matrix's inverse, and X⁺y with its pseudo-inverse.
    const sizes = [3, 7, 12, 25, 60, 140, 300, 650, 1500, 4000]
    const pts = sizes.map((S, i) => ({ size: S, cost: 5000 * Math.pow(S, 0.55) * Math.exp(SCATTER[i]!) }))
    for (const form of ['power', 'quadraticLog'] as const) {
      const k = form === 'power' ? 2 : 3
      const X = new Matrix(sizes.map((S) => Array.from({ length: k }, (_, j) => Math.log(S) ** j)))
      const y = Matrix.columnVector(pts.map((p) => Math.log(p.cost)))
      const Xt = X.transpose()
      const normal = inverse(Xt.mmul(X)).mmul(Xt).mmul(y)
      const pinv = pseudoInverse(X).mmul(y)
      const fit = fitCostCurve(pts, form, 'e')
      for (let j = 0; j < k; j++) {
        near(fit.coefficients[j]!, normal.get(j, 0), 1e-9)
        near(fit.coefficients[j]!, pinv.get(j, 0), 1e-9)
      }
      // R² from its definition, 1 − SS_res/SS_tot, with the normal-equations coefficients.
      const yv = y.to1DArray()
      const mean = yv.reduce((s, v) => s + v, 0) / yv.length
      const fitted = X.mmul(normal).to1DArray()
      const ssRes = yv.reduce((s, v, i) => s + (v - fitted[i]!) ** 2, 0)
      const ssTot = yv.reduce((s, v) => s + (v - mean) ** 2, 0)
      near(fit.r2, 1 - ssRes / ssTot, 1e-9)
      expect(fit.r2).toBeLessThan(1)
      expect(fit.r2).toBeGreaterThan(0.9)
    }
  })

  it('the six-tenths rule comes back as the exponent (common practice, no source)', () => {
    const pts = [1, 2, 4, 8].map((S) => ({ size: S, cost: 10000 * Math.pow(S, 0.6) }))
    const fit = fitCostCurve(pts, 'power', '10')
    near(fit.coefficients[1]!, 0.6, 1e-12)
    near(fit.coefficients[0]!, 4, 1e-12) // log10 10000
  })

  it('base conversion keeps the curve: the same costs in base e and base 10', () => {
    const pts = [5, 9, 30, 70, 200].map((S, i) => ({ size: S, cost: 800 * Math.pow(S, 0.7) * Math.exp(SCATTER[i]!) }))
    const fe = fitCostCurve(pts, 'quadraticLog', 'e')
    const f10 = fitCostCurve(pts, 'quadraticLog', '10')
    const conv = convertLogBase(fe.coefficients, 'e', '10')
    conv.forEach((v, k) => near(v, f10.coefficients[k]!, 1e-9))
    for (const S of [5, 50, 200]) near(costFromFit(S, fe.coefficients, 'e'), costFromFit(S, f10.coefficients, '10'), 1e-12)
    near(fe.r2, f10.r2, 1e-12)
    // Example in the doc block: [ln 1000, 0.6] from e to 10 is [3, 0.6].
    const ex = convertLogBase([Math.log(1000), 0.6], 'e', '10')
    near(ex[0]!, 3, 1e-14)
    near(ex[1]!, 0.6, 1e-14)
  })

  it('refuses too few points, no size spread and non-positive numbers', () => {
    const two = [{ size: 1, cost: 10 }, { size: 2, cost: 15 }]
    expect(() => fitCostCurve(two, 'power')).toThrow(FitError)
    const same = [1, 1, 1].map((S, i) => ({ size: S, cost: 10 + i }))
    try {
      fitCostCurve(same, 'power')
      expect.unreachable()
    } catch (e) {
      expect((e as FitError).code).toBe('noSizeSpread')
    }
    const twoSizes = [1, 1, 2, 2].map((S, i) => ({ size: S, cost: 10 + i }))
    expect(() => fitCostCurve(twoSizes, 'quadraticLog')).toThrow(/3 different sizes/)
    expect(fitCostCurve(twoSizes, 'power').n).toBe(4)
    expect(() => fitCostCurve([{ size: 1, cost: 1 }, { size: 2, cost: 0 }, { size: 3, cost: 2 }], 'power')).toThrow(/positive/)
  })

  it('log-spaced sizes run from the first bound to the second', () => {
    const s = logSpacedSizes(1, 100, 3)
    expect(s).toHaveLength(3)
    near(s[1]!, 10, 1e-14)
    expect(s[2]).toBe(100)
  })
})
