/**
 * The balances of a standing column: the outlet a given number of theoretical stages
 * reaches at fixed gas and solvent flows, and (the inverse) the stages a measured
 * recovery took.
 *
 * Same balances as the design path: Kremser with the geometric-mean absorption factor of
 * the two ends (kremser1930 in the form of benitez2009 Illus. 5.1) for dilute straight
 * lines, or stage-by-stage on the solute-free basis (benitez2009 ch. 5, treybal1980 ch. 8)
 * for curved lines or concentrated gas. Both are solved for the outlet by bisection on a
 * bracket in which the stage count is monotone (more stages -> cleaner outlet).
 */
import type { EquilibriumCurve } from '../equilibrium/models.ts'
import { stagesKremser } from '../balances/kremser.ts'
import { eqXofY, eqYofX, stepStages } from '../balances/stageByStage.ts'
import { ConvergenceError, InfeasibleDesignError } from '../errors.ts'

const MAX_STAGES = 2000
const BISECTIONS = 200

/** Fixed flows and the equilibrium of one rating (SI, mol/s). */
export interface BalanceInput {
  eq: EquilibriumCurve
  method: 'kremser' | 'stageByStage'
  K0: number // dilute K (slope at x = 0)
  V: number // inlet gas, mol/s
  yIn: number
  L0: number // lean solvent incl. its solute, mol/s
  x0: number
}

/** The column outlet at fixed flows. */
export interface BalanceOutlet {
  y1: number // outlet gas mole fraction
  xN: number // rich solvent mole fraction
  recovery: number // solute-free basis: 1 - Y1/Y_in
  N: number // theoretical stages this outlet needs
  absorptionFactor: number // geometric mean of the ends (secant K)
  Ktop: number
  Kbot: number
}

function derived(b: BalanceInput) {
  const Vp = b.V * (1 - b.yIn)
  const YIn = b.yIn / (1 - b.yIn)
  const X0 = b.x0 / (1 - b.x0)
  const Lp = b.L0 / (1 + X0)
  return { Vp, YIn, X0, Lp, s: Lp / Vp }
}

/** Stages needed for an outlet Y1 (solute-free ratio); Infinity when the outlet cannot be reached. */
function stagesForY1(b: BalanceInput, Y1: number): number {
  const { Vp, YIn, X0, Lp, s } = derived(b)
  const XN = X0 + (YIn - Y1) / s
  if (!(XN < eqXofY(b.eq, YIn))) return Infinity // rich solvent at or above equilibrium with the inlet gas
  if (b.method === 'kremser') {
    const K = b.K0
    const y1 = Y1 / (1 + Y1)
    const V1 = Vp * (1 + Y1)
    const LN = Lp * (1 + XN)
    const A = Math.sqrt((b.L0 / (K * V1)) * (LN / (K * b.V)))
    return stagesKremser(b.yIn, y1, K * b.x0, A)
  }
  const r = stepStages(b.eq, true, Y1, X0, YIn, s, MAX_STAGES, null)
  return r ? r.N : Infinity
}

function outletOf(b: BalanceInput, Y1: number, N: number): BalanceOutlet {
  const { Vp, YIn, X0, Lp, s } = derived(b)
  const XN = X0 + (YIn - Y1) / s
  const y1 = Y1 / (1 + Y1)
  const xN = XN / (1 + XN)
  const V1 = Vp * (1 + Y1)
  const LN = Lp * (1 + XN)
  const Ktop = b.x0 > 0 ? b.eq.y(b.x0) / b.x0 : b.K0
  const Kbot = xN > 0 ? b.eq.y(xN) / xN : b.K0
  const A = Math.sqrt((b.L0 / (Ktop * V1)) * (LN / (Kbot * b.V)))
  return { y1, xN, recovery: 1 - Y1 / YIn, N, absorptionFactor: A, Ktop, Kbot }
}

/**
 * Outlet reached with N theoretical stages at fixed flows.
 * Bisection on the outlet Y1 between the gas in equilibrium with the lean solvent and the
 * inlet gas; N(Y1) falls as Y1 rises.
 * @param N installed theoretical stages [-] (> 0)
 * @throws InfeasibleDesignError when the lean solvent is at or above equilibrium with the inlet gas
 */
export function outletForStages(b: BalanceInput, N: number): BalanceOutlet {
  const { YIn, X0 } = derived(b)
  let lo = eqYofX(b.eq, X0) // outlet cannot be cleaner than the lean-solvent equilibrium
  let hi = YIn
  if (!(lo < hi)) {
    throw new InfeasibleDesignError([
      { path: 'solvent.soluteMoleFraction', code: 'leanSolventLoaded', message: 'The lean solvent is at or above equilibrium with the inlet gas: it cannot absorb any solute' },
    ])
  }
  for (let i = 0; i < BISECTIONS && hi - lo > 1e-15 * YIn; i++) {
    const mid = 0.5 * (lo + hi)
    if (stagesForY1(b, mid) <= N) hi = mid
    else lo = mid
  }
  const Nhi = stagesForY1(b, hi)
  if (!Number.isFinite(Nhi)) throw new ConvergenceError('Outlet of the installed stages not bracketed', BISECTIONS, hi - lo)
  return outletOf(b, hi, Math.min(N, Nhi))
}

/**
 * Theoretical stages a recovery takes at fixed flows (the inverse of outletForStages):
 * Kremser N from the outlet, or the stage-by-stage count.
 * @param recovery fraction absorbed on the solute-free basis, (0, 1)
 * @returns stages [-]; Infinity when this recovery cannot be reached with these flows
 */
export function stagesForRecovery(b: BalanceInput, recovery: number): number {
  const { YIn } = derived(b)
  return stagesForY1(b, (1 - recovery) * YIn)
}
