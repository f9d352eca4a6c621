/**
 * Watching a standing column run: each logged month rated at its own flows and inlet
 * concentration with the as-built column, the overall efficiency the column achieved
 * (back-calculated from the measured recovery), a drift warning, months outside the
 * operating window, and the split of the month's cost gap against the approved optimum.
 *
 * Method
 *  - expected recovery: the rating balance (balance.ts) at the installed theoretical stages
 *    N = trays x E_design, at the month's gas flow, inlet mole fraction and solvent flow;
 *  - achieved efficiency: the stages the measured recovery took at the month's flows
 *    (stagesForRecovery), divided by the installed trays (common practice: a falling value
 *    points at fouling, damaged trays or foaming);
 *  - drift: the achieved efficiency more than `margin` (default 15 %) below the design
 *    efficiency for `run` (default 3) logged months in a row (our own rule; the margin is
 *    a setting);
 *  - window: the month is outside when any tray limit of the operating window is passed at
 *    its flows (window.ts limits: 85 % flood, entrainment 0.1, hole Froude 0.5, backup);
 *  - cost gap (our own bookkeeping): gap = actual month cost - approved optimum's month cost
 *    at design throughput priced with the approval basis, split in turn into
 *      prices       = design month (basis in force) - design month (approval basis)
 *      throughput   = design month at the month's gas rate - at the design gas rate (basis in force)
 *      solvent      = (solvent flow - solvent the recovery needed) x (solvent + pumping price),
 *                     the need being the solvent at which the as-built column at design
 *                     efficiency reaches the design recovery with the month's gas
 *      efficiency   = (expected - measured recovery) x solute in x (product value + emission charge)
 *      other        = the rest (measured power against the estimate, recovery beyond the above)
 *    so that the parts add up to the gap exactly.
 */
import type { CaseSI } from '../case.ts'
import type { CostGapSplit, DriftStatus, MonthRating as MonthRatingAnswer } from '../../../shared/schemas/rating.ts'
import { outletForStages, stagesForRecovery, type BalanceInput } from './balance.ts'
import { RATING_LIMITS, worstEnd } from './checks.ts'
import { balanceOf, endStreams, geometryOf, installedOutlet, type RateCaseSI } from './rate.ts'
import { trayStateAt } from './trayState.ts'

const KMOLH = 3.6

export type { CostGapSplit, DriftStatus }

export interface MonitorEntry {
  month: string // YYYY-MM
  gasFlow: number // kmol/h
  solventFlow: number // kmol/h
  inletMoleFraction: number | null // null: the design's
  measuredRecovery: number | null
}

/** A month rated with the as-built column (flows in kmol/h); the cost gap is added by the service. */
export type MonthRating = MonthRatingAnswer

/** The as-built rating context of an approved design. */
export interface MonitorContext {
  rating: RateCaseSI // the approved design's case and column, design flows
  designRecovery: number
}

function caseAt(base: CaseSI, gasFlow: number, yIn: number): CaseSI {
  return { ...base, gas: { ...base.gas, flow: gasFlow / KMOLH, soluteMoleFraction: yIn } }
}

/** Solvent [kmol/h] at which the installed column at efficiency E reaches recovery r; null if none up to 50x. */
function solventNeeded(b: BalanceInput, N: number, r: number, start: number): number | null {
  const rec = (L: number) => outletForStages({ ...b, L0: L / KMOLH }, N).recovery
  let hi = Math.max(start, 1e-6)
  let k = 0
  while (rec(hi) < r) {
    hi *= 2
    if (++k > 6) return null
  }
  let lo = hi / 2
  k = 0
  while (rec(lo) >= r) {
    lo /= 2
    if (++k > 40) return lo
  }
  for (let i = 0; i < 50; i++) {
    const mid = 0.5 * (lo + hi)
    if (rec(mid) >= r) hi = mid
    else lo = mid
  }
  return hi
}

/**
 * Rate each logged month with the as-built column.
 * @param margin fractional drop below the design efficiency that counts (default 0.15)
 * @param run months in a row below the margin for the warning (default 3)
 */
export function monitorMonths(ctx: MonitorContext, entries: MonitorEntry[], margin = 0.15, run = 3): { months: MonthRating[]; drift: DriftStatus } {
  const base = ctx.rating
  const trays = base.column.actualTrays
  const design = base.case
  // design efficiency: the as-built column at the design flows
  const bD = balanceOf(design, base.solventFlow).b
  const Edesign = installedOutlet(design, bD, trays).Eo
  // the geometry is fixed at the design flows (absent items filled there)
  const dOut = installedOutlet(design, bD, trays)
  const dStreams = endStreams(design, bD, dOut.out)
  const g = geometryOf(design, base.column, dStreams.bot, dStreams.top, [])

  const months: MonthRating[] = []
  for (const e of entries) {
    const yIn = e.inletMoleFraction ?? design.gas.soluteMoleFraction
    const c = caseAt(design, e.gasFlow, yIn)
    const { b } = balanceOf(c, e.solventFlow / KMOLH)
    const { out, Eo } = installedOutlet(c, b, trays)
    const s = endStreams(c, b, out)
    const w = worstEnd(trayStateAt(s.bot, g), trayStateAt(s.top, g))
    const violated: MonthRating['violated'] = []
    if (w.fractionFlood > RATING_LIMITS.flood) violated.push('flooding')
    if (w.psi > RATING_LIMITS.entrainment) violated.push('entrainment')
    if (w.Fr < RATING_LIMITS.weepFroude) violated.push('weeping')
    if (w.backupRatio > RATING_LIMITS.backupRatio) violated.push('downcomerBackup')
    let achieved: number | null = null
    let note: string | undefined
    if (e.measuredRecovery !== null) {
      const N = stagesForRecovery(b, e.measuredRecovery)
      if (Number.isFinite(N)) achieved = N / trays
      else note = 'The measured recovery is beyond what any number of stages gives at these flows: check the measurement.'
    }
    months.push({
      month: e.month,
      gasFlow: e.gasFlow,
      solventFlow: e.solventFlow,
      inletMoleFraction: yIn,
      expectedRecovery: out.recovery,
      measuredRecovery: e.measuredRecovery,
      achievedEfficiency: achieved,
      designEfficiency: Eo,
      belowDriftMargin: achieved !== null && achieved < (1 - margin) * Eo,
      percentFlood: 100 * w.fractionFlood,
      insideWindow: violated.length === 0,
      violated,
      solventNeeded: solventNeeded(b, trays * Eo, ctx.designRecovery, e.solventFlow),
      ...(note ? { note } : {}),
    })
  }
  // drift: the latest run of consecutive measured months below the margin
  let count = 0
  let since: string | null = null
  let warnSince: string | null = null
  for (const m of months) {
    if (m.achievedEfficiency === null) continue
    if (m.belowDriftMargin) {
      if (count === 0) since = m.month
      count++
      if (count >= run) warnSince = since
    } else {
      count = 0
      since = null
      warnSince = null
    }
  }
  const warning = warnSince !== null
  return {
    months,
    drift: {
      margin,
      run,
      warning,
      since: warnSince,
      message: warning
        ? `Tray efficiency has been more than ${Math.round(margin * 100)} % below the design value (${(Edesign * 100).toFixed(0)} %) for ${count} months in a row since ${warnSince}: look for fouling, damaged or dislodged trays, or foaming.`
        : null,
    },
  }
}

/** The parts of one month's cost gap (currency); they add up to `gap`. */
export interface CostGapInput {
  actualTotal: number
  /** Design month cost at design throughput priced with the approval basis and with the basis in force; and at the month's throughput (basis in force). */
  designAtDesignApproval: number
  designAtDesignInForce: number
  designAtMonthInForce: number
  solventFlow: number // kmol/h
  solventNeeded: number | null // kmol/h
  /** Price of one kmol of solvent delivered (solvent + pumping electricity), basis in force. */
  solventPricePerKmol: number
  hours: number
  expectedRecovery: number
  measuredRecovery: number | null
  soluteInKgPerHour: number
  lostSolutePricePerKg: number // product value + emission charge
}

export function splitCostGap(i: CostGapInput): CostGapSplit {
  const gap = i.actualTotal - i.designAtDesignApproval
  const prices = i.designAtDesignInForce - i.designAtDesignApproval
  const throughput = i.designAtMonthInForce - i.designAtDesignInForce
  const excessSolvent = i.solventNeeded === null ? 0 : (i.solventFlow - i.solventNeeded) * i.hours * i.solventPricePerKmol
  const efficiencyLoss = i.measuredRecovery === null ? 0 : (i.expectedRecovery - i.measuredRecovery) * i.soluteInKgPerHour * i.hours * i.lostSolutePricePerKg
  const other = gap - prices - throughput - excessSolvent - efficiencyLoss
  return { reference: i.designAtDesignApproval, actual: i.actualTotal, gap, prices, throughput, excessSolvent, efficiencyLoss, other }
}
