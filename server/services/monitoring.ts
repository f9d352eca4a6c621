/**
 * Monitoring of an approved study's running column: each logged month rated with the as-built
 * column (engine/rating/monitoring.ts), the achieved tray efficiency with the drift warning,
 * months outside the operating window, and the split of each month's cost gap.
 */
import { CostBasis } from '../db/models/index.ts'
import type { Run } from '../db/models/index.ts'
import type { ComponentLibrary } from '../engine/case.ts'
import type { DesignSummary } from '../../shared/schemas/results.ts'
import { summaryToSI } from '../../shared/summaryUnits.ts'
import { costDesign, type CostBreakdown } from '../engine/costing/index.ts'
import { daysInMonth, type MonthResult } from '../engine/tracking/operating.ts'
import { ratingCaseOfDesign } from '../engine/rating/fromDesign.ts'
import { monitorMonths, splitCostGap } from '../engine/rating/monitoring.ts'
import type { Monitoring } from '../../shared/schemas/rating.ts'
import { rateCaseToSI, rateSI } from '../engine/rating/rate.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import { toApiError } from './engine-gateway.ts'

export const DRIFT_MARGIN = 0.15
export const DRIFT_MONTHS = 3

export interface MonitoringEntry {
  month: string // YYYY-MM
  gasFlow: number
  solventFlow: number
  inletMoleFraction: number | null
}

/** The monitoring answer (shared/schemas/rating.ts). */
export type MonitoringView = Monitoring

/** The design's month cost (currency) at throughput ratio phi for a month of `days`, priced by `c`. */
function designMonth(c: CostBreakdown, phi: number, days: number): number {
  const capital = (c.annualisedCapital * days) / 365
  const variable = c.operatingCost * phi * ((days * 24) / 8760)
  return capital + variable
}

/** The rating case of the approved design (the as-built column at its design flows). */
export function standingCase(run: Run, summary: DesignSummary): Record<string, unknown> {
  return ratingCaseOfDesign(run.inputs as Record<string, unknown>, summary)
}

export async function monitoringOf(
  siteId: number,
  run: Run,
  summary: DesignSummary,
  library: ComponentLibrary,
  entries: MonitoringEntry[],
  priced: (MonthResult & { basis: CostBasisData })[],
): Promise<MonitoringView> {
  const raw = standingCase(run, summary)
  try {
    const rc = rateCaseToSI(raw, library)
    const solvents = [summary.solventFlow, ...entries.map((e) => e.solventFlow)]
    const atDesign = rateSI(rc, { window: { solventFlowMin: 0.5 * Math.min(...solvents), solventFlowMax: 1.5 * Math.max(...solvents) } })
    const window = atDesign.window
    const { months, drift } = monitorMonths(
      { rating: rc, designRecovery: summary.recovery },
      entries.map((e, i) => ({ month: e.month, gasFlow: e.gasFlow, solventFlow: e.solventFlow, inletMoleFraction: e.inletMoleFraction, measuredRecovery: priced[i]?.recovery ?? null })),
      DRIFT_MARGIN,
      DRIFT_MONTHS,
    )
    const approval = run.costBasisVersion === null ? null : await CostBasis.findOne({ where: { siteId, version: run.costBasisVersion } })
    const approvalBasis = approval ? (approval.data as CostBasisData) : null
    const costCache = new Map<CostBasisData, CostBreakdown>()
    const cost = (b: CostBasisData) => {
      let c = costCache.get(b)
      if (!c) costCache.set(b, (c = costDesign(summaryToSI(summary), b)))
      return c
    }
    const ms = months.map((m, i) => {
      const p = priced[i]
      const e = entries[i]!
      if (!p) return { ...m, costGap: null }
      const days = daysInMonth(e.month)
      const inForce = cost(p.basis)
      const atApproval = approvalBasis ? cost(approvalBasis) : inForce
      const m3PerKmol = summary.solventVolumetricFlow / summary.solventFlow
      const pumpKwhPerKmol = inForce.power.pumpElectric / 1000 / summary.solventFlow
      const u = p.basis.utilities
      const costGap = splitCostGap({
        actualTotal: p.actual.total,
        designAtDesignApproval: designMonth(atApproval, 1, days),
        designAtDesignInForce: designMonth(inForce, 1, days),
        designAtMonthInForce: designMonth(inForce, p.throughputRatio, days),
        solventFlow: e.solventFlow,
        solventNeeded: m.solventNeeded,
        solventPricePerKmol: m3PerKmol * u.solventCost + pumpKwhPerKmol * u.electricityPrice,
        hours: p.hours,
        expectedRecovery: m.expectedRecovery,
        measuredRecovery: m.measuredRecovery,
        soluteInKgPerHour: e.gasFlow * m.inletMoleFraction * (summary.soluteInGas / (summary.gasFlow * rc.case.gas.soluteMoleFraction)),
        lostSolutePricePerKg: u.productValue + u.emissionCharge,
      })
      return { ...m, costGap }
    })
    return {
      ratingCase: raw,
      designPoint: { gasFlow: summary.gasFlow, solventFlow: summary.solventFlow, recovery: summary.recovery, overallEfficiency: atDesign.summary.overallEfficiency },
      drift,
      window,
      months: ms,
    }
  } catch (e) {
    return toApiError(e, 'design')
  }
}

