/** Rating of a standing column and its monitoring in the operating log. Types from the shared schemas. */
import type { RatingResult, WindowOptionsInput, OperatingWindow } from '@shared/schemas/rating.ts'
import { http } from './http.ts'

export type { RatingResult, OperatingWindow }

export interface StandingColumn {
  ratingCase: Record<string, unknown>
  designPoint: { gasFlow: number; solventFlow: number; recovery: number }
  rating: RatingResult
  months: { month: string; gasFlow: number; solventFlow: number }[]
}

export interface CostGapSplit {
  reference: number
  actual: number
  gap: number
  prices: number
  throughput: number
  excessSolvent: number
  efficiencyLoss: number
  other: number
}

export interface MonthRating {
  month: string
  gasFlow: number
  solventFlow: number
  inletMoleFraction: number
  expectedRecovery: number
  measuredRecovery: number | null
  achievedEfficiency: number | null
  designEfficiency: number
  belowDriftMargin: boolean
  percentFlood: number
  insideWindow: boolean
  violated: string[]
  solventNeeded: number | null
  note?: string
  costGap: CostGapSplit | null
}

export interface Monitoring {
  ratingCase: Record<string, unknown>
  designPoint: { gasFlow: number; solventFlow: number; recovery: number; overallEfficiency: number }
  drift: { margin: number; run: number; warning: boolean; since: string | null; message: string | null }
  window: OperatingWindow
  months: MonthRating[]
}

export const ratingApi = {
  rate: (c: Record<string, unknown>, window?: WindowOptionsInput): Promise<RatingResult> => http.post('/designs/rate', window ? { case: c, window } : { case: c }),
  standing: (siteId: number, studyId: number): Promise<StandingColumn> => http.get(`/sites/${siteId}/studies/${studyId}/standing-column`),
}
