/** Rating of a standing column and its monitoring in the operating log. Types from the shared schemas. */
import type { RatingResult, WindowOptionsInput, OperatingWindow, StandingColumn, CostGapSplit, MonthRating, Monitoring } from '@shared/schemas/rating.ts'
import { http } from './http.ts'

export type { RatingResult, OperatingWindow, StandingColumn, CostGapSplit, MonthRating, Monitoring }

export const ratingApi = {
  rate: (c: Record<string, unknown>, window?: WindowOptionsInput): Promise<RatingResult> => http.post('/designs/rate', window ? { case: c, window } : { case: c }),
  standing: (siteId: number, studyId: number): Promise<StandingColumn> => http.get(`/sites/${siteId}/studies/${studyId}/standing-column`),
}
