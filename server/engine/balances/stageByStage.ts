/**
 * Stage-by-stage calculation (McCabe-Thiele stepping, top down) on a solute-free
 * basis: X = x/(1-x), Y = y/(1-y), with constant solute-free flows L' and V', so the
 * operating line is straight: Y_{n+1} = Y_1 + (L'/V')(X_n - X_0).
 *
 * The last fractional stage: see LAST_STAGE_CONVENTION.
 *
 * Source: benitez2009 ch. 5; treybal1980 ch. 8 (solute-free basis).
 */

/**
 * Convention for the last, partial stage of a stage-by-stage count.
 *
 * Two conventions are in use: the linear fraction of the last step, need/step (usual in hand
 * McCabe-Thiele work), and the geometric fraction f = ln(1 + (A - 1) need/step)/ln A, with A the
 * ratio of the last two step heights. The engine uses the geometric one: on straight operating
 * and equilibrium lines the steps grow by the absorption factor A per stage, so this fraction
 * makes the stepped count equal the Kremser N exactly (kremser1930), and the two methods agree
 * where both apply. The linear fraction is never smaller by more than one stage's fraction.
 * Source: commonPractice (both conventions; the geometric form follows from kremser1930).
 */
export const LAST_STAGE_CONVENTION =
  'Geometric fraction of the last step, ln(1 + (A - 1) need/step) / ln A with A the ratio of the last two steps: on straight lines the count equals the Kremser equation exactly (the linear fraction need/step of hand McCabe-Thiele work is the other common convention).'
import type { EquilibriumCurve } from '../equilibrium/models.ts'

export interface SteppingResult {
  /** Fractional number of ideal stages. */
  N: number
  /** Whole stages stepped (ceil of N). */
  steps: number
  /** Fraction of the last stepped stage counted in N (0..1]: N = steps - 1 + lastStageFraction. */
  lastStageFraction: number
  /** Liquid and gas compositions leaving each stage, top = index 0 (mole fractions, or ratios when ratio=false was used on ratio data). */
  x: number[]
  y: number[]
}

/**
 * Step stages from the top. Coordinates: when `ratio` is true, Y1, X0, Yin and slope
 * are solute-free ratios and the equilibrium curve (in mole fractions) is converted;
 * when false, the curve is used directly in the given coordinates (mole fractions with
 * constant L/V).
 * Returns null when more than maxStages are needed (a pinch).
 */
export function stepStages(
  eq: EquilibriumCurve,
  ratio: boolean,
  Y1: number,
  X0: number,
  Yin: number,
  slope: number,
  maxStages: number,
  out: SteppingResult | null,
): SteppingResult | null {
  // fictitious Y0: gas in equilibrium with the lean solvent
  let Yprev = ratio ? eqYofX(eq, X0) : eq.y(X0)
  let Yn = Y1
  let dPrev = Yn - Yprev
  const xs = out ? out.x : null
  const ys = out ? out.y : null
  for (let n = 1; n <= maxStages; n++) {
    const Xn = ratio ? eqXofY(eq, Yn) : eq.x(Yn)
    if (xs && ys) {
      if (ratio) {
        xs.push(Xn / (1 + Xn))
        ys.push(Yn / (1 + Yn))
      } else {
        xs.push(Xn)
        ys.push(Yn)
      }
    }
    const Ynext = Y1 + slope * (Xn - X0)
    if (Ynext >= Yin * (1 - 1e-12)) {
      const d = Ynext - Yn
      const need = Yin - Yn
      let f: number
      const Aloc = dPrev > 0 ? d / dPrev : 1
      if (need <= 0) f = 0
      else if (Math.abs(Aloc - 1) < 1e-6 || !(Aloc > 0)) f = need / d
      else {
        const arg = 1 + ((Aloc - 1) * need) / d
        f = arg > 0 ? Math.log(arg) / Math.log(Aloc) : need / d
      }
      if (f > 1) f = 1
      if (f < 0) f = 0
      const res = out ?? { N: 0, steps: 0, lastStageFraction: 0, x: [], y: [] }
      res.N = n - 1 + f
      res.steps = n
      res.lastStageFraction = f
      return res
    }
    const d = Ynext - Yn
    if (!(d > 0)) return null // pinched: operating line touches the equilibrium curve
    dPrev = d
    Yprev = Yn
    Yn = Ynext
  }
  return null
}

/** Equilibrium in solute-free ratios: Y*(X). */
export function eqYofX(eq: EquilibriumCurve, X: number): number {
  const y = eq.y(X / (1 + X))
  return y / (1 - y)
}

/** Equilibrium in solute-free ratios: X*(Y). */
export function eqXofY(eq: EquilibriumCurve, Y: number): number {
  const x = eq.x(Y / (1 + Y))
  return x / (1 - x)
}
