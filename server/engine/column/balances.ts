/**
 * Material balances of the absorber: targets on the solute-free basis, the choice of method,
 * the minimum solvent from the exact pinch analysis, the solvent at L/Lmin, and the ideal
 * stages (Kremser or stage by stage).
 *
 * Source: benitez2009 ch. 5 and treybal1980 ch. 8 (solute-free basis, minimum absorbent with end
 * or tangent pinch); kremser1930 (absorption-factor method).
 */
import type { CaseSI } from '../case.ts'
import type { EngineWarning } from '../contract.ts'
import { InfeasibleDesignError } from '../errors.ts'
import { LinearEquilibrium, type EquilibriumCurve } from '../equilibrium/models.ts'
import { fractionAbsorbedKremser, stagesKremser } from '../balances/kremser.ts'
import { eqXofY, eqYofX, LAST_STAGE_CONVENTION, stepStages, type SteppingResult } from '../balances/stageByStage.ts'
import { minimumSlope, type MinSlope } from '../balances/minimumSolvent.ts'

/** Mole fraction up to which a phase counts as dilute for the Kremser equation (commonPractice). */
export const DILUTE_LIMIT = 0.05
/**
 * Largest deviation of the equilibrium line from its chord, on the solute-free basis, between the
 * lean solvent and the liquid in equilibrium with the inlet gas, as a fraction of the rise along
 * the chord, for which 'auto' takes the Kremser equation (commonPractice). At 0.5 % the
 * Kremser count stays within about 1 % of the stage-by-stage count.
 */
export const KREMSER_STRAIGHTNESS_TOLERANCE = 0.005
export const MAX_STAGES = 2000

export type Method = 'kremser' | 'stageByStage'

export interface MethodChoice {
  method: Method
  /** A sentence saying which method ran and why. */
  note: string
  /** Deviation of the solute-free equilibrium line from its chord, fraction of the rise [-]. */
  straightness: number
  /** true when the Kremser conditions (dilute both phases, straight line) hold */
  kremserValid: boolean
}

/** Largest distance of Y*(X) from the chord between X0 and X*_N, as a fraction of the rise. */
export function straightnessDeviation(eq: EquilibriumCurve, X0: number, XstarN: number): number {
  const Y0 = eqYofX(eq, X0)
  const YN = eqYofX(eq, XstarN)
  const rise = YN - Y0
  if (!(rise > 0)) return 0
  let dev = 0
  const n = 16
  for (let i = 1; i < n; i++) {
    const X = X0 + ((XstarN - X0) * i) / n
    const d = Math.abs(eqYofX(eq, X) - (Y0 + (rise * i) / n))
    if (d > dev) dev = d
  }
  return dev / rise
}

const pct = (v: number): string => `${Number((100 * v).toPrecision(2))} %`

/**
 * The last choice: it depends on the case alone (not on the recovery or the solvent factor), and
 * its note is a sentence built from formatted numbers, so the optimiser and a batch would
 * otherwise build the same sentence thousands of times. A straight line (y = K x) is compared by
 * its K, any other curve by the object.
 */
let lastChoice: { requested: 'auto' | Method; eq: EquilibriumCurve; linearK: number; yIn: number; xStarN: number; X0: number; XstarN: number; choice: MethodChoice } | null = null

/** Which method runs, and a note that says why, in words. */
export function chooseMethod(requested: 'auto' | Method, eq: EquilibriumCurve, yIn: number, xStarN: number, X0: number, XstarN: number): MethodChoice {
  const linearK = eq instanceof LinearEquilibrium ? eq.K0 : NaN
  const m = lastChoice
  if (m && m.requested === requested && (m.eq === eq || m.linearK === linearK) && m.yIn === yIn && m.xStarN === xStarN && m.X0 === X0 && m.XstarN === XstarN) return m.choice
  const choice = Object.freeze(buildChoice(requested, eq, yIn, xStarN, X0, XstarN))
  lastChoice = { requested, eq, linearK, yIn, xStarN, X0, XstarN, choice }
  return choice
}

function buildChoice(requested: 'auto' | Method, eq: EquilibriumCurve, yIn: number, xStarN: number, X0: number, XstarN: number): MethodChoice {
  const straightness = straightnessDeviation(eq, X0, XstarN)
  const reasons: string[] = []
  if (yIn > DILUTE_LIMIT) reasons.push(`the inlet gas is concentrated (solute mole fraction ${yIn.toPrecision(3)}, above ${DILUTE_LIMIT})`)
  if (xStarN > DILUTE_LIMIT) reasons.push(`the liquid in equilibrium with the inlet gas is concentrated (solute mole fraction ${xStarN.toPrecision(3)}, above ${DILUTE_LIMIT})`)
  if (straightness > KREMSER_STRAIGHTNESS_TOLERANCE) reasons.push(`the equilibrium line on the solute-free basis bends by ${pct(straightness)} of its rise, more than the ${pct(KREMSER_STRAIGHTNESS_TOLERANCE)} allowed`)
  const kremserValid = reasons.length === 0
  const conditions = `both phases dilute (at most ${DILUTE_LIMIT} solute mole fraction) and the equilibrium line on the solute-free basis straight within ${pct(KREMSER_STRAIGHTNESS_TOLERANCE)}`
  let method: Method
  let note: string
  if (requested === 'auto') {
    method = kremserValid ? 'kremser' : 'stageByStage'
    note = kremserValid
      ? `Kremser equation (absorption-factor method), chosen automatically: the inlet gas (${yIn.toPrecision(3)}) and the liquid in equilibrium with it (${xStarN.toPrecision(3)}) are dilute and the equilibrium line on the solute-free basis is straight within ${pct(KREMSER_STRAIGHTNESS_TOLERANCE)} (it deviates ${pct(straightness)}).`
      : `Stage by stage on the solute-free basis, chosen automatically because ${reasons.join('; ')}. The Kremser equation needs ${conditions}.`
  } else if (requested === 'kremser') {
    method = 'kremser'
    note = kremserValid
      ? `Kremser equation (absorption-factor method), as chosen in the case; its conditions hold (${conditions}).`
      : `Kremser equation (absorption-factor method), as chosen in the case, although ${reasons.join('; ')}; stage by stage is recommended.`
  } else {
    method = 'stageByStage'
    note = 'Stage by stage on the solute-free basis, as chosen in the case.'
  }
  return { method, note: `${note} Minimum solvent from the pinch analysis on the solute-free basis (rich-end or tangent pinch).`, straightness, kremserValid }
}

/**
 * The pinches of the last curve, by the outlet Y1: the pinch depends on the case and the recovery
 * alone (not on the solvent factor), and a scan with a golden-section refinement costs as much as
 * a tenth of a design; the optimiser, a sensitivity study and a batch ask for the same recoveries
 * over and over. At most 256 entries per curve (then it starts again), compared like chooseMethod.
 */
let pinches: { eq: EquilibriumCurve; linearK: number; X0: number; YIn: number; byY1: Map<number, MinSlope> } | null = null

function pinchOf(eq: EquilibriumCurve, Y1: number, X0: number, YIn: number): MinSlope {
  const linearK = eq instanceof LinearEquilibrium ? eq.K0 : NaN
  let pc = pinches
  if (!pc || !(pc.eq === eq || pc.linearK === linearK) || pc.X0 !== X0 || pc.YIn !== YIn) pc = pinches = { eq, linearK, X0, YIn, byY1: new Map() }
  let p = pc.byY1.get(Y1)
  if (!p) {
    if (pc.byY1.size >= 256) pc.byY1.clear()
    p = Object.freeze(minimumSlope(eq, Y1, X0, YIn))
    pc.byY1.set(Y1, p)
  }
  return p
}

export interface Balances {
  method: Method
  choice: MethodChoice
  pinch: MinSlope
  /** inlet gas, outlet gas [mol/s] */
  V: number
  V1: number
  /** solute-free gas and solvent [mol/s] */
  Vp: number
  Lp: number
  /** lean and rich solvent incl. solute, and the minimum lean solvent [mol/s] */
  L0: number
  LN: number
  Lmin0: number
  yIn: number
  YIn: number
  y1: number
  Y1: number
  x0: number
  X0: number
  xN: number
  XN: number
  xStarN: number
  /** operating slope L'/V' [-] */
  slope: number
  absorbed: number // mol/s
  Ktop: number
  Kbot: number
  Atop: number
  Abot: number
  /** reported absorption factor: geometric mean of the ends [-] */
  A: number
  /** ideal stages [-] */
  N: number
  stepping: SteppingResult | null
  /** fraction of the last ideal stage counted (0..1], convention in LAST_STAGE_CONVENTION */
  lastStageFraction: number
}

/**
 * Targets, minimum solvent, solvent and ideal stages.
 * @throws InfeasibleDesignError with structured issues
 */
export function solveBalances(
  c: CaseSI,
  eq: EquilibriumCurve,
  K0: number,
  recovery: number,
  solventFactor: number,
  wantProfile: boolean,
  warnings: EngineWarning[],
): Balances {
  const V = c.gas.flow
  const yIn = c.gas.soluteMoleFraction
  const Vp = V * (1 - yIn)
  const YIn = yIn / (1 - yIn)
  const Y1 = (1 - recovery) * YIn
  const y1 = Y1 / (1 + Y1)
  const x0 = c.solvent.soluteMoleFraction
  const X0 = x0 / (1 - x0)
  const yEqLean = eq.y(x0)
  if (y1 <= yEqLean) {
    throw new InfeasibleDesignError([
      {
        path: 'solvent.soluteMoleFraction',
        code: 'leanSolventLoaded',
        message: `The lean solvent is already too loaded: the target outlet gas y = ${y1.toExponential(4)} is at or below the gas in equilibrium with the lean solvent (K x0 = ${yEqLean.toExponential(4)}); lower the recovery or use cleaner solvent`,
      },
    ])
  }
  const xStarN = eq.x(yIn)
  if (!(xStarN > 0 && xStarN < 0.99) || Math.abs(eq.y(xStarN) - yIn) > 1e-7 * yIn) {
    throw new InfeasibleDesignError([
      { path: 'equilibrium', code: 'equilibriumOutOfRange', message: `No liquid is in equilibrium with the inlet gas (y = ${yIn}): the model gives x* = ${xStarN.toPrecision(4)}; the gas may be above its dew point or the equilibrium model does not apply at this composition` },
    ])
  }
  if (xStarN > eq.xMax) {
    warnings.push({ code: 'equilibriumExtrapolated', message: `The equilibrium table ends at x = ${eq.xMax}; it is extrapolated linearly to x* = ${xStarN.toFixed(5)} in equilibrium with the inlet gas`, path: 'equilibrium.points' })
  }
  const XstarN = xStarN / (1 - xStarN)

  // ---- method
  const choice = chooseMethod(c.method, eq, yIn, xStarN, X0, XstarN)
  const method = choice.method
  if (method === 'kremser' && !choice.kremserValid) {
    warnings.push({ code: 'kremserOutsideValidity', message: choice.note, path: 'method' })
  }

  // ---- minimum solvent (exact pinch for every method) and solvent
  const pinch = pinchOf(eq, Y1, X0, YIn)
  if (!(pinch.slope > 0) || !Number.isFinite(pinch.slope)) {
    throw new InfeasibleDesignError([{ path: 'equilibrium', code: 'noPinch', message: 'No minimum solvent rate could be found for this equilibrium and target' }])
  }
  const slope = solventFactor * pinch.slope
  const Lp = slope * Vp
  const L0 = Lp * (1 + X0)
  const Lmin0 = pinch.slope * Vp * (1 + X0)
  const XN = X0 + (YIn - Y1) / slope
  const xN = XN / (1 + XN)
  if (XN > XstarN * (1 + 1e-9)) {
    throw new InfeasibleDesignError([{ path: 'solventFactor', code: 'richAboveEquilibrium', message: `The rich solvent (x = ${xN.toExponential(4)}) would be above equilibrium with the inlet gas (x* = ${xStarN.toExponential(4)}); use more solvent` }])
  }
  const LN = Lp * (1 + XN)
  const V1 = Vp * (1 + Y1)
  const absorbed = Vp * (YIn - Y1)

  // absorption factor (reported): geometric mean of the ends, secant K at each end
  const Ktop = x0 > 0 ? yEqLean / x0 : K0
  const Kbot = eq.y(xN) / xN
  const Atop = L0 / (Ktop * V1)
  const Abot = LN / (Kbot * V)
  const A = Math.sqrt(Atop * Abot)

  // ---- ideal stages
  let N: number
  let stepping: SteppingResult | null = null
  let lastStageFraction: number
  if (method === 'kremser') {
    const Ak = Math.sqrt((L0 / (K0 * V1)) * (LN / (K0 * V)))
    N = stagesKremser(yIn, y1, K0 * x0, Ak)
    if (!Number.isFinite(N)) {
      const hint = choice.kremserValid ? '' : '; the Kremser equation does not hold for this concentrated or curved case: choose the stage-by-stage method'
      throw new InfeasibleDesignError([{ path: 'solventFactor', code: 'pinch', message: `The target cannot be reached with this solvent rate: the Kremser absorption factor ${Ak.toFixed(4)} is too small for the recovery${hint}` }])
    }
    lastStageFraction = N - Math.ceil(N) + 1
  } else {
    stepping = stepStages(eq, true, Y1, X0, YIn, slope, MAX_STAGES, wantProfile ? { N: 0, steps: 0, lastStageFraction: 0, x: [], y: [] } : null)
    if (!stepping) {
      throw new InfeasibleDesignError([{ path: 'solventFactor', code: 'tooManyStages', message: `More than ${MAX_STAGES} ideal stages are needed (operating line pinches the equilibrium curve); raise the solvent factor or lower the recovery` }])
    }
    N = stepping.N
    lastStageFraction = stepping.lastStageFraction
  }
  if (N < 1e-6) N = 1e-6
  return { method, choice, pinch, V, V1, Vp, Lp, L0, LN, Lmin0, yIn, YIn, y1, Y1, x0, X0, xN, XN, xStarN, slope, absorbed, Ktop, Kbot, Atop, Abot, A, N, stepping, lastStageFraction }
}

/** The convention of the last fractional stage, for the result detail. */
export const lastStageConvention = LAST_STAGE_CONVENTION

/** Recovery reached with a given number of ideal stages at the fixed solvent rate. */
export function recoveryWithStages(eq: EquilibriumCurve, b: Balances, K: number, Navail: number, rTarget: number): number {
  const s = b.Lp / b.Vp
  if (b.method === 'kremser') {
    // absorption factor at the design point is kept (dilute)
    const A = (b.Lp * (1 + b.X0)) / (K * b.V)
    const f = fractionAbsorbedKremser(A, Navail)
    const y1 = b.yIn - f * (b.yIn - K * b.x0)
    const Y1 = y1 / (1 - y1)
    return Math.max(rTarget, 1 - Y1 / b.YIn)
  }
  // bisection on the outlet Y1 (more stages -> lower Y1), operating slope fixed
  let lo = eqYofX(eq, b.X0) // can't go below the lean-solvent equilibrium
  let hi = (1 - rTarget) * b.YIn
  for (let i = 0; i < 50; i++) {
    const mid = 0.5 * (lo + hi)
    const XN = b.X0 + (b.YIn - mid) / s
    const feasible = XN <= eqXofY(eq, b.YIn)
    const r = feasible ? stepStages(eq, true, mid, b.X0, b.YIn, s, MAX_STAGES, null) : null
    if (r && r.N <= Navail) hi = mid
    else lo = mid
  }
  return Math.max(rTarget, 1 - hi / b.YIn)
}
