/**
 * Capital-cost correlations, escalation and annualisation. Pure functions, no I/O.
 * Each function keeps its published equation in the doc block; the coefficients live in the
 * cost basis (shared/schemas/costBasis.ts) so an economist can edit or replace them.
 * Sources by key in ./references.ts.
 */
import type { CostCurveData } from '../../../shared/schemas/costBasis.ts'

/**
 * Purchased cost from a generic published cost curve.
 *
 * C = a · B^( c0 + c1·L + c2·L² + c3·L³ + c4·L⁴ + b·S ),  L = log_B(S),  S = size_SI · sizeFactor
 *
 * which holds, e.g., Seider et al. ln C = c0 + c1 ln S + c2 (ln S)² (B = e), Turton et al.
 * log10 C° = K1 + K2 log10 A + K3 (log10 A)² (B = 10), and Seider's C_BT = 468 exp(0.1739 D).
 *
 * @param sizeSI  [SI unit of the size: kg, m³, m, m², W, m³/s, or m³/s·m^0.5 for Q·H^0.5]
 * @param curve   coefficients, units, validity (sizeMin..sizeMax in the curve's own unit) and base index
 * @returns       purchased cost [currency at curve.baseIndex]
 * Validity: curve.sizeMin ≤ S ≤ curve.sizeMax (outside: caller warns; no clamp).
 * Source: the curve's own `source` field (seider2009, turton2009 for the presets).
 * Example: Turton sieve tray, A = 7.0686 m² -> 10^(2.9949 + 0.4465·0.84933 + 0.3961·0.84933²) = 4569.4 USD (CEPCI 397):
 * Example: costFromCurve(7.0686, { sizeFactor: 1, coefficients: [2.9949, 0.4465, 0.3961], logBase: '10', linearCoefficient: 0, multiplier: 1 }) = 4569.4
 */
export function costFromCurve(sizeSI: number, curve: CostCurveData): number {
  const S = sizeSI * curve.sizeFactor
  const c = curve.coefficients
  const L = curve.logBase === 'e' ? Math.log(S) : Math.log10(S)
  let poly = 0
  for (let k = c.length - 1; k >= 0; k--) poly = poly * L + (c[k] ?? 0)
  poly += curve.linearCoefficient * S
  return curve.multiplier * (curve.logBase === 'e' ? Math.exp(poly) : Math.pow(10, poly))
}

/**
 * Escalate a cost between cost-index values.
 *
 * C_B = C_A · (I_B / I_A)
 *
 * @param cost        [currency at index I_A]
 * @param baseIndex   I_A [-]
 * @param targetIndex I_B [-]
 * @returns           [currency at index I_B]
 * Validity: indices > 0 of the same series (e.g. CEPCI).
 * Source: cepci (index values), turton2009 eq. 7.3.
 * Example: escalateCost(4569.4, 397, 500) = 5754.9 (USD at CEPCI 397 -> at CEPCI 500)
 */
export function escalateCost(cost: number, baseIndex: number, targetIndex: number): number {
  return (cost * targetIndex) / baseIndex
}

/**
 * Capital recovery factor (uniform annual payment per unit of present capital).
 *
 * CRF = i(1+i)^n / ((1+i)^n − 1)
 *
 * @param i interest rate [1/yr, fraction]
 * @param n economic life [yr]
 * @returns [1/yr]
 * Validity: i > 0, n ≥ 1 (at i -> 0 the limit is 1/n).
 * Source: crf.
 * Example: capitalRecoveryFactor(0.1, 10) = 0.162745 (i = 10 %, n = 10 yr)
 */
export function capitalRecoveryFactor(i: number, n: number): number {
  if (i <= 0) return 1 / n
  const g = Math.pow(1 + i, n)
  return (i * g) / (g - 1)
}

/**
 * Purchased cost of platforms and ladders of a tower.
 *
 * C_PL = a · D_i^p · L^q   (Seider: a = 300.9, p = 0.63316, q = 0.80161, D and L in ft, CE = 500)
 *
 * @param D  inside diameter [m]
 * @param L  tangent-to-tangent height [m]
 * @param a, p, q  coefficients; lengthFactor converts m to the correlation unit (3.28084 for ft)
 * @returns  [currency at the correlation's base index]
 * Validity (Seider towers): 3 ≤ D ≤ 24 ft, 27 ≤ L ≤ 170 ft.
 * Source: seider2009 (from memory; confirm).
 * Example: platformsCost(1.524, 15.24, 300.9, 0.63316, 0.80161, 3.28084) = 19182 USD (D = 5 ft, L = 50 ft, CE 500)
 */
export function platformsCost(D: number, L: number, a: number, p: number, q: number, lengthFactor: number): number {
  if (a === 0) return 0
  return a * Math.pow(D * lengthFactor, p) * Math.pow(L * lengthFactor, q)
}

/**
 * Tray count factor for small numbers of trays.
 *
 * geometric (Seider):          F_NT = c0 / c1^N          for N < N*, else 1  (c0 = 2.25, c1 = 1.0414, N* = 20)
 * logPolynomial10 (Turton):    F_q = 10^(c0 + c1 log N + c2 (log N)²) for N < N*, else 1
 *                              (c0 = 0.4771, c1 = 0.08516, c2 = −0.3473, N* = 20)
 *
 * @param N  number of trays [-]
 * @returns  [-]
 * Validity: N ≥ 1.
 * Source: seider2009 (from memory), turton2009 Appendix A.
 * Example: trayCountFactor(5, 'geometric', [2.25, 1.0414], 20) = 1.8369 (Seider; N = 10 gives 1.4997)
 * Example: trayCountFactor(5, 'logPolynomial10', [0.4771, 0.08516, -0.3473], 20) = 2.328 (Turton)
 */
export function trayCountFactor(
  N: number,
  form: 'geometric' | 'logPolynomial10' | 'none',
  c: readonly number[],
  below: number,
): number {
  if (form === 'none' || N >= below) return 1
  if (form === 'geometric') return (c[0] ?? 1) / Math.pow(c[1] ?? 1, N)
  const l = Math.log10(N)
  let poly = 0
  for (let k = c.length - 1; k >= 0; k--) poly = poly * l + (c[k] ?? 0)
  return Math.pow(10, poly)
}

/**
 * Pressure factor of a process vessel (Turton eq. 7.10).
 *
 * F_P = [ (P+1) D / (2[850 − 0.6(P+1)]) + 0.00315 ] / 0.0063 ; F_P = 1 if below 1; 1.25 for P < −0.5 barg
 *
 * @param P  design pressure [barg]
 * @param D  diameter [m]
 * @returns  [-]
 * Validity: assumes S = 944 bar, E = 0.9, CA = 3.15 mm, t_min = 6.3 mm (as published).
 * Source: turton2009 eq. 7.10.
 * Example: pressureFactorVesselTurton(20, 3) = 6.4709 (P = 20 barg, D = 3 m)
 */
export function pressureFactorVesselTurton(P: number, D: number): number {
  if (P < -0.5) return 1.25
  const fp = ((P + 1) * D / (2 * (850 - 0.6 * (P + 1))) + 0.00315) / 0.0063
  return fp < 1 ? 1 : fp
}

/**
 * Bare-module factor for vessels and pumps in module costing.
 *
 * F_BM = B1 + B2 F_M F_P   (C_BM = C_p° F_BM)
 *
 * @returns [-]
 * Source: turton2009 eq. A.4; vessels B1 = 2.25, B2 = 1.82; centrifugal pumps B1 = 1.89, B2 = 1.35.
 * Example: bareModuleFactorTurton(2.25, 1.82, 3.11, 6.4709) = 38.877 (vessel, F_M = 3.11, F_P = 6.4709)
 */
export function bareModuleFactorTurton(B1: number, B2: number, FM: number, FP: number): number {
  return B1 + B2 * FM * FP
}
