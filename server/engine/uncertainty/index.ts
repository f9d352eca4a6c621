/**
 * Uncertainty entry points: parse (zod) the request { case, costBasis?, search?, uncertainty? },
 * normalise the case, propagate. The robust optimum is in ./robust.ts.
 */
import type { UncertaintyResultSI } from '../../../shared/summaryUnits.ts'
import { uncertaintySpecSchema, type UncertaintySpec } from '../../../shared/schemas/uncertainty.ts'
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import type { CaseSI } from '../case.ts'
import { invalidFromZod } from '../index.ts'
import { propagate } from './propagate.ts'

/** Parse the `uncertainty` object of a request (defaults for what it leaves out). */
export function parseUncertainty(raw: unknown, prefix = 'uncertainty.'): UncertaintySpec {
  const r = uncertaintySpecSchema.safeParse(raw ?? {})
  if (!r.success) throw invalidFromZod(r.error, prefix)
  return r.data
}

/** Propagate a normalised case with a cost basis and a parsed spec. */
export function uncertaintySI(c: CaseSI, basis: CostBasisData, spec: UncertaintySpec, emissionLimit?: number): UncertaintyResultSI {
  return propagate({ c, basis, spec, emissionLimit })
}

export { propagate, drawSamples, rateAll, targetOf, type SampleSet, type Target } from './propagate.ts'
export { fixColumn, rateSample, kremserOutlet } from './column.ts'
export { robustOptimum } from './robust.ts'
