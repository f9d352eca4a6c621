/**
 * Rating entry points: parse (zod) -> normalise (units, library) -> rate.
 */
import type { RatingResult } from '../../../shared/schemas/rating.ts'
import { mergeLibraries, type ComponentLibrary } from '../case.ts'
import { COMPONENT_LIBRARY } from '../index.ts'
import { rateBatchToSI, rateCaseToSI, rateSI, type RateOptions } from './rate.ts'

export interface RateEvaluateOptions extends RateOptions {
  /** Site components added to (or replacing) the library entries. */
  library?: ComponentLibrary
}

/** True when parsed JSON is a batch ({ cases: [...] } or an array). */
export function isRateBatch(raw: unknown): boolean {
  return Array.isArray(raw) || (typeof raw === 'object' && raw !== null && 'cases' in raw)
}

/**
 * Rate one raw case.
 * @throws InvalidInputError | InfeasibleDesignError | ConvergenceError
 */
export function rateCase(raw: unknown, opts?: RateEvaluateOptions): RatingResult {
  return rateSI(rateCaseToSI(raw, mergeLibraries(COMPONENT_LIBRARY, opts?.library)), opts)
}

/** Rate a batch { cases: [...] } (or a bare array), results in order; the first bad case throws with its path. */
export function rateBatch(raw: unknown, opts?: RateEvaluateOptions): RatingResult[] {
  return rateBatchToSI(raw, mergeLibraries(COMPONENT_LIBRARY, opts?.library)).map((r) => rateSI(r, opts))
}

export { rateSI, rateCaseToSI, normaliseRateCase } from './rate.ts'
export type { RateCaseSI, AsBuiltSI } from './rate.ts'
