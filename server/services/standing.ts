/**
 * The standing (as-built) column of an approved study, for the rating screen.
 */
import { OperatingEntry } from '../db/models/index.ts'
import { rateCaseToSI, rateSI } from '../engine/rating/rate.ts'
import { approvedDesign, approvedStudy } from './operating.ts'
import { standingCase } from './monitoring.ts'
import { siteLibrary } from './runs.ts'
import { toApiError } from './engine-gateway.ts'

/**
 * The standing column of an approved study: its rating case (as built, design flows), the
 * rating at the design flows with the window, and the logged months for the window chart.
 */
export async function standingColumn(siteId: number, studyId: number) {
  const s = await approvedStudy(siteId, studyId)
  const d = await approvedDesign(s)
  const raw = standingCase(d.run, d.summary)
  const entries = await OperatingEntry.findAll({ where: { studyId }, order: [['month', 'ASC']] })
  const solvents = [d.summary.solventFlow, ...entries.map((e) => e.solventFlow)]
  try {
    const rating = rateSI(rateCaseToSI(raw, await siteLibrary(siteId)), { window: { solventFlowMin: 0.3 * Math.min(...solvents), solventFlowMax: 2 * Math.max(...solvents) } })
    return {
      ratingCase: raw,
      designPoint: { gasFlow: d.summary.gasFlow, solventFlow: d.summary.solventFlow, recovery: d.summary.recovery },
      rating,
      months: entries.map((e) => ({ month: e.month.slice(0, 7), gasFlow: e.gasFlow, solventFlow: e.solventFlow })),
    }
  } catch (e) {
    return toApiError(e, 'design')
  }
}
