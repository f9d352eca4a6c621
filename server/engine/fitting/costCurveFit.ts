/**
 * Least-squares fits of purchased-cost curves to vendor quotes, in log space. Pure functions,
 * no I/O. The fitted coefficients come out in the cost basis's curve form
 * (shared/schemas/costBasis.ts, costCurveSchema) so an economist can adopt them in a draft:
 *
 *   C = a · B^( c0 + c1·L + c2·L² ),  L = log_B(S),  a = 1, linear size coefficient b = 0
 *
 * Sizes S are in the curve's own size unit; costs in one currency at one cost index (the caller
 * escalates the quotes first).
 */
import { Matrix, QrDecomposition } from 'ml-matrix'

/** 'power': log C = c0 + c1·log S;  'quadraticLog': log C = c0 + c1·log S + c2·(log S)². */
export type FitForm = 'power' | 'quadraticLog'
export type LogBase = 'e' | '10'

export const FIT_FORMS: readonly FitForm[] = ['power', 'quadraticLog']

/** Number of coefficients of each form. */
export const FORM_TERMS: Record<FitForm, number> = { power: 2, quadraticLog: 3 }

export interface FitPoint {
  size: number // in the curve's size unit, > 0
  cost: number // currency at one cost index, > 0
}

export interface FitResidual {
  size: number
  cost: number
  fitted: number // cost on the fitted curve at this size
  logResidual: number // log_B(cost) − log_B(fitted)
  relativeError: number // (cost − fitted) / fitted
}

export interface CostCurveFit {
  form: FitForm
  logBase: LogBase
  /** c0, c1[, c2] of the polynomial in L = log_B(S), constant term first. */
  coefficients: number[]
  /** Coefficient of determination in log space: 1 − SS_res / SS_tot of log_B(C). */
  r2: number
  /** Root-mean-square log residual (log_B units). */
  rmsLogResidual: number
  n: number
  /** Degrees of freedom left: n − number of coefficients (0 means the curve passes through every point). */
  dof: number
  residuals: FitResidual[]
  sizeMin: number
  sizeMax: number
}

/** Why a fit cannot be made; `code` is stable for the API. */
export class FitError extends Error {
  readonly code: 'tooFewPoints' | 'noSizeSpread' | 'nonPositive' | 'singular'
  constructor(code: FitError['code'], message: string) {
    super(message)
    this.name = 'FitError'
    this.code = code
  }
}

/** Smallest number of quotes a fit accepts (common practice, no source: fewer gives no check at all). */
export const MIN_FIT_POINTS = 3

const logOf = (base: LogBase) => (v: number) => (base === 'e' ? Math.log(v) : Math.log10(v))

/**
 * Evaluate a fitted (or any a = 1, b = 0) cost curve.
 *
 * C = B^( Σ c_k · L^k ),  L = log_B(S)
 *
 * @param S            size [curve size unit], > 0
 * @param coefficients c0, c1, ... [-]
 * @param logBase      'e' or '10'
 * @returns            cost [currency at the fit's cost index]
 * Validity: S within the quoted sizes; outside it the curve is extrapolated.
 * Source: the cost-curve form of costFromCurve (../costing/correlations.ts; seider2009, turton2009).
 * Example: c = [ln 1000, 0.6], B = e, S = 10 -> 1000 · 10^0.6 = 3981.07.
 */
export function costFromFit(S: number, coefficients: readonly number[], logBase: LogBase): number {
  const L = logOf(logBase)(S)
  let poly = 0
  for (let k = coefficients.length - 1; k >= 0; k--) poly = poly * L + (coefficients[k] ?? 0)
  return logBase === 'e' ? Math.exp(poly) : Math.pow(10, poly)
}

/**
 * Least-squares fit of a cost curve in log space.
 *
 * minimise Σ_i ( log_B C_i − Σ_k c_k (log_B S_i)^k )²,  k = 0..1 (power) or 0..2 (quadraticLog)
 *
 * solved as the overdetermined linear system X c = y (X_ik = L_i^k, y_i = log_B C_i) by a QR
 * decomposition (ml-matrix), which gives the same c as the normal equations XᵀX c = Xᵀy with
 * better conditioning.
 *
 * @param points   quotes: size [curve size unit] and cost [currency at one index], both > 0
 * @param form     'power' (C = A·S^n) or 'quadraticLog'
 * @param logBase  'e' or '10': the base of the cost basis curve the result will replace
 * @returns        coefficients, R² in log space, residuals per point, size range
 * Validity: n ≥ 3 points, at least as many distinct sizes as coefficients.
 * Source: ordinary least squares (press2007 sec. 15.4); the log-space fit of cost-capacity data is common practice, no source.
 * Example: (10, 1000), (100, 3981.07), (1000, 15848.9) with 'power', base e ->
 *          c0 = ln(251.189) = 5.5262, c1 = 0.6, R² = 1.
 */
export function fitCostCurve(points: readonly FitPoint[], form: FitForm, logBase: LogBase = 'e'): CostCurveFit {
  const k = FORM_TERMS[form]
  const n = points.length
  if (n < MIN_FIT_POINTS) {
    throw new FitError('tooFewPoints', `A fit needs at least ${MIN_FIT_POINTS} quotes; there ${n === 1 ? 'is' : 'are'} ${n}.`)
  }
  points.forEach((p, i) => {
    if (!(Number.isFinite(p.size) && p.size > 0) || !(Number.isFinite(p.cost) && p.cost > 0)) {
      throw new FitError('nonPositive', `Quote ${i + 1}: size and cost must be positive numbers for a log-space fit.`)
    }
  })
  const distinct = new Set(points.map((p) => p.size)).size
  if (distinct < 2) throw new FitError('noSizeSpread', 'All quotes have the same size; a cost curve needs quotes at different sizes.')
  if (distinct < k) {
    throw new FitError('noSizeSpread', `The '${form}' form has ${k} coefficients and needs at least ${k} different sizes; there are ${distinct}.`)
  }
  const lg = logOf(logBase)
  const L = points.map((p) => lg(p.size))
  const y = points.map((p) => lg(p.cost))
  const X = new Matrix(n, k)
  for (let i = 0; i < n; i++) {
    let v = 1
    for (let j = 0; j < k; j++) {
      X.set(i, j, v)
      v *= L[i]!
    }
  }
  const qr = new QrDecomposition(X)
  if (!qr.isFullRank()) throw new FitError('singular', 'The sizes do not determine the coefficients (the system is singular).')
  const sol = qr.solve(Matrix.columnVector(y))
  const coefficients = Array.from({ length: k }, (_, j) => sol.get(j, 0))

  const mean = y.reduce((s, v) => s + v, 0) / n
  let ssRes = 0
  let ssTot = 0
  const residuals: FitResidual[] = points.map((p, i) => {
    const fitted = costFromFit(p.size, coefficients, logBase)
    const r = y[i]! - lg(fitted)
    ssRes += r * r
    ssTot += (y[i]! - mean) ** 2
    return { size: p.size, cost: p.cost, fitted, logResidual: r, relativeError: (p.cost - fitted) / fitted }
  })
  // All costs equal: a flat line fits exactly; R² is 1 when the residuals vanish too.
  const r2 = ssTot > 0 ? 1 - ssRes / ssTot : ssRes === 0 ? 1 : 0
  const sizes = points.map((p) => p.size)
  return {
    form,
    logBase,
    coefficients,
    r2,
    rmsLogResidual: Math.sqrt(ssRes / n),
    n,
    dof: n - k,
    residuals,
    sizeMin: Math.min(...sizes),
    sizeMax: Math.max(...sizes),
  }
}

/**
 * Sizes spaced evenly in log between two bounds, for drawing a cost curve.
 *
 * S_j = S_min · (S_max / S_min)^( j / (m − 1) ),  j = 0..m−1
 *
 * @param sMin, sMax  bounds [size unit], 0 < sMin ≤ sMax
 * @param m           number of sizes, ≥ 2
 * @returns           sizes [size unit]
 * Validity: sMin > 0.
 * Source: none needed (geometric spacing).
 * Example: (1, 100, 3) -> [1, 10, 100].
 */
export function logSpacedSizes(sMin: number, sMax: number, m = 41): number[] {
  if (m < 2 || sMax <= sMin) return [sMin]
  const r = Math.log(sMax / sMin)
  return Array.from({ length: m }, (_, j) => (j === m - 1 ? sMax : sMin * Math.exp((r * j) / (m - 1))))
}

/**
 * Convert log-polynomial coefficients between bases e and 10.
 *
 * ln C = Σ c_k (ln S)^k  <=>  log10 C = Σ c'_k (log10 S)^k  with  c'_k = c_k · (ln 10)^(k−1)
 *
 * @param coefficients  c_k in the `from` base
 * @returns             c_k in the `to` base
 * Validity: any polynomial degree.
 * Source: none needed (change of logarithm base, ln x = ln 10 · log10 x).
 * Example: [ln 1000, 0.6] e -> 10: [3, 0.6].
 */
export function convertLogBase(coefficients: readonly number[], from: LogBase, to: LogBase): number[] {
  if (from === to) return [...coefficients]
  const f = from === 'e' ? Math.LN10 : 1 / Math.LN10
  return coefficients.map((c, k) => c * Math.pow(f, k - 1))
}
