/**
 * Vapour-liquid equilibrium models, all reduced to y = f(x) in mole fractions at the
 * column temperature and pressure, with the inverse x = f^-1(y).
 */
import type { EngineWarning } from '../contract.ts'
import { T_REF_HENRY } from '../properties/constants.ts'
import { checkRange, type ValidityRange } from '../numerics/validity.ts'
import { ConvergenceError } from '../errors.ts'

/** An equilibrium curve at fixed T and P. */
export interface EquilibriumCurve {
  /** y = K x exactly (constant K, Henry, modified Raoult with constant gamma). */
  readonly linear: boolean
  /** Slope dy/dx at x -> 0 (the dilute K value). */
  readonly K0: number
  /** Largest x where the model is defined (1 for models, the last table point for tables). */
  readonly xMax: number
  y(x: number): number
  x(y: number): number
}

/** y = K x. */
export class LinearEquilibrium implements EquilibriumCurve {
  readonly linear = true
  readonly K0: number
  readonly xMax = 1
  constructor(K: number) {
    this.K0 = K
  }
  y(x: number): number {
    return this.K0 * x
  }
  x(y: number): number {
    return y / this.K0
  }
}

/**
 * Henry's law constant at temperature T with van 't Hoff temperature dependence.
 *
 * Equation: H(T) = H0 exp[B (1/T - 1/T0)], T0 = 298.15 K
 * @param H0 solubility constant H^cp at T0 [mol/(m3 Pa)]
 * @param B d ln H / d(1/T) [K]
 * @param T temperature [K]
 * @returns H^cp(T) [mol/(m3 Pa)]
 * Validity: about 0-60 degC for the library values (the van 't Hoff form assumes a
 *   constant enthalpy of solution).
 * Source: sander2015, sander2023.
 * Example: henryAtT(1.9, 6400, 293.15) = 2.740 mol/(m3 Pa) (ethanol at 20 degC)
 */
export function henryAtT(H0: number, B: number, T: number, warnings?: EngineWarning[], path?: string): number {
  checkRange(warnings, "Henry's law van 't Hoff form", henryValidity, T, path)
  return H0 * Math.exp(B * (1 / T - 1 / T_REF_HENRY))
}
export const henryValidity: ValidityRange = { arg: 'T', min: 273.15, max: 333.15, unit: 'K' }

/**
 * K value (y = K x) from a Henry solubility constant, dilute solution.
 *
 * Equation: x = c_aq/c_w, y = p/P, H^cp = c_aq/p  =>  K = c_w / (H^cp P)
 * @param Hcp Henry solubility constant at column T [mol/(m3 Pa)]
 * @param cw molar density of the solvent [mol/m3] (rho_w / M_w)
 * @param P total pressure [Pa]
 * Validity: dilute solute (x < about 0.05).
 * Source: sander2015 (definitions); the check values are derived from them (tag D).
 * Example: kFromHenry(1.9, 55344, 101325) = 0.2875 (ethanol at 25 degC, 1 atm)
 */
export function kFromHenry(Hcp: number, cw: number, P: number): number {
  return cw / (Hcp * P)
}

/**
 * Modified Raoult's law, y P = gamma x Psat, with gamma from the infinite-dilution
 * value: either constant (gamma = gammaInf: linear) or the two-suffix Margules form
 * ln gamma = ln(gammaInf) (1 - x)^2 (curved).
 *
 * Equation: K = gamma Psat / P
 * Validity: Margules form needs ln(gammaInf) < 2 (no liquid-liquid split).
 * Source: seaderHenley2011 (modified Raoult, Margules), values per component library.
 * Example: gammaInf 4.5, Psat 10.4 kPa, P 110 kPa -> K0 = 0.4255
 */
export class MargulesRaoultEquilibrium implements EquilibriumCurve {
  readonly linear = false
  readonly K0: number
  readonly xMax = 1
  private readonly lnG: number
  private readonly k: number
  constructor(gammaInf: number, PsatOverP: number) {
    this.lnG = Math.log(gammaInf)
    this.k = PsatOverP
    this.K0 = gammaInf * PsatOverP
  }
  y(x: number): number {
    const u = 1 - x
    return this.k * x * Math.exp(this.lnG * u * u)
  }
  x(y: number): number {
    // y(x) rises monotonically to y(1) = Psat/P (ln gammaInf < 2): above it, no liquid
    // composition is in equilibrium (the gas is above its dew point); 1 is returned and
    // the designer reports it as out of range.
    if (y >= this.k) return 1
    // Newton from the dilute guess, safeguarded by bisection on [0, 1]
    let lo = 0
    let hi = 1
    let x = Math.min(y / this.K0, 0.999)
    for (let i = 0; i < 60; i++) {
      const u = 1 - x
      const g = Math.exp(this.lnG * u * u)
      const f = this.k * x * g - y
      if (f > 0) hi = x
      else lo = x
      const df = this.k * g * (1 - 2 * this.lnG * x * u)
      let xn = x - f / df
      if (!(xn > lo && xn < hi)) xn = 0.5 * (lo + hi)
      if (Math.abs(xn - x) < 1e-15 + 1e-13 * x) return xn
      x = xn
    }
    const r = this.y(x) - y
    if (Math.abs(r) > 1e-9 * Math.max(y, 1e-12)) throw new ConvergenceError('Modified Raoult (Margules) inverse x(y) did not converge', 60, r)
    return x
  }
}

/**
 * x-y table interpolated with a monotone cubic Hermite spline (Fritsch-Carlson), so
 * the curve never overshoots between data points; linear extrapolation with the
 * end slope beyond the last point (the designer warns when that is used).
 *
 * Source: fritschCarlson1980.
 * Example: points (0,0), (0.1,0.2), (0.2,0.35) -> y(0.15) is between 0.2 and 0.35
 */
export class TableEquilibrium implements EquilibriumCurve {
  readonly linear = false
  readonly K0: number
  readonly xMax: number
  readonly xs: Float64Array
  readonly ys: Float64Array
  readonly ms: Float64Array
  constructor(xs: ArrayLike<number>, ys: ArrayLike<number>) {
    this.xs = Float64Array.from(xs)
    this.ys = Float64Array.from(ys)
    this.ms = fritschCarlsonSlopes(this.xs, this.ys)
    this.K0 = this.ms[0]!
    this.xMax = this.xs[this.xs.length - 1]!
  }
  y(x: number): number {
    const xs = this.xs
    const ys = this.ys
    const ms = this.ms
    const n = xs.length
    if (x <= xs[0]!) return ys[0]! + ms[0]! * (x - xs[0]!)
    if (x >= xs[n - 1]!) return ys[n - 1]! + ms[n - 1]! * (x - xs[n - 1]!)
    let lo = 0
    let hi = n - 1
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1
      if (xs[mid]! <= x) lo = mid
      else hi = mid
    }
    return hermite(xs[lo]!, xs[hi]!, ys[lo]!, ys[hi]!, ms[lo]!, ms[hi]!, x)
  }
  x(y: number): number {
    const xs = this.xs
    const ys = this.ys
    const ms = this.ms
    const n = xs.length
    if (y <= ys[0]!) return xs[0]! + (y - ys[0]!) / ms[0]!
    if (y >= ys[n - 1]!) return xs[n - 1]! + (y - ys[n - 1]!) / ms[n - 1]!
    let lo = 0
    let hi = n - 1
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1
      if (ys[mid]! <= y) lo = mid
      else hi = mid
    }
    const x0 = xs[lo]!
    const x1 = xs[hi]!
    const y0 = ys[lo]!
    const y1 = ys[hi]!
    const m0 = ms[lo]!
    const m1 = ms[hi]!
    // the Hermite piece is monotone on [x0, x1]: safeguarded Newton
    let a = x0
    let b = x1
    let x = x0 + ((y - y0) / (y1 - y0)) * (x1 - x0)
    for (let i = 0; i < 60; i++) {
      const f = hermite(x0, x1, y0, y1, m0, m1, x) - y
      if (f > 0) b = x
      else a = x
      const df = hermiteSlope(x0, x1, y0, y1, m0, m1, x)
      let xn = df > 0 ? x - f / df : 0.5 * (a + b)
      if (!(xn >= a && xn <= b)) xn = 0.5 * (a + b)
      if (Math.abs(xn - x) < 1e-15 + 1e-13 * Math.abs(x)) return xn
      x = xn
    }
    const r = hermite(x0, x1, y0, y1, m0, m1, x) - y
    if (Math.abs(r) > 1e-9 * Math.max(Math.abs(y), 1e-12)) throw new ConvergenceError('Equilibrium table inverse x(y) did not converge', 60, r)
    return x
  }
}

function hermite(x0: number, x1: number, y0: number, y1: number, m0: number, m1: number, x: number): number {
  const h = x1 - x0
  const t = (x - x0) / h
  const t2 = t * t
  const t3 = t2 * t
  return (2 * t3 - 3 * t2 + 1) * y0 + (t3 - 2 * t2 + t) * h * m0 + (-2 * t3 + 3 * t2) * y1 + (t3 - t2) * h * m1
}

function hermiteSlope(x0: number, x1: number, y0: number, y1: number, m0: number, m1: number, x: number): number {
  const h = x1 - x0
  const t = (x - x0) / h
  const t2 = t * t
  return ((6 * t2 - 6 * t) * y0) / h + (3 * t2 - 4 * t + 1) * m0 + ((-6 * t2 + 6 * t) * y1) / h + (3 * t2 - 2 * t) * m1
}

/**
 * Fritsch-Carlson slopes for strictly increasing data (three-point start, then the
 * alpha^2 + beta^2 <= 9 limiter).
 */
export function fritschCarlsonSlopes(xs: Float64Array, ys: Float64Array): Float64Array {
  const n = xs.length
  const m = new Float64Array(n)
  const d = new Float64Array(Math.max(n - 1, 1))
  for (let i = 0; i < n - 1; i++) d[i] = (ys[i + 1]! - ys[i]!) / (xs[i + 1]! - xs[i]!)
  if (n === 2) {
    m[0] = d[0]!
    m[1] = d[0]!
    return m
  }
  m[0] = d[0]!
  m[n - 1] = d[n - 2]!
  for (let i = 1; i < n - 1; i++) {
    m[i] = d[i - 1]! * d[i]! <= 0 ? 0 : 0.5 * (d[i - 1]! + d[i]!)
  }
  for (let i = 0; i < n - 1; i++) {
    const di = d[i]!
    if (di === 0) {
      m[i] = 0
      m[i + 1] = 0
      continue
    }
    const a = m[i]! / di
    const b = m[i + 1]! / di
    const s = a * a + b * b
    if (s > 9) {
      const tau = 3 / Math.sqrt(s)
      m[i] = tau * a * di
      m[i + 1] = tau * b * di
    }
  }
  return m
}

/**
 * Validate an x-y table: at least 2 points, x and y finite, sorted, strictly
 * increasing, x within [0, 1), y within [0, 1), no duplicates. Returns the reason for
 * the first problem, or null.
 */
export function validateTable(xs: ArrayLike<number>, ys: ArrayLike<number>): { index: number; reason: string } | null {
  if (xs.length !== ys.length) return { index: 0, reason: 'x and y must have the same number of points' }
  if (xs.length < 2) return { index: 0, reason: 'an equilibrium table needs at least 2 points' }
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i]!
    const y = ys[i]!
    if (!Number.isFinite(x) || !Number.isFinite(y)) return { index: i, reason: 'x and y must be finite numbers' }
    if (x < 0 || x >= 1) return { index: i, reason: `x = ${x} must be within [0, 1)` }
    if (y < 0 || y >= 1) return { index: i, reason: `y = ${y} must be within [0, 1)` }
    if (i > 0) {
      if (x === xs[i - 1]!) return { index: i, reason: `duplicate x = ${x}` }
      if (x < xs[i - 1]!) return { index: i, reason: 'x values must be sorted in increasing order' }
      if (y <= ys[i - 1]!) return { index: i, reason: 'y must increase strictly with x' }
    }
  }
  return null
}
