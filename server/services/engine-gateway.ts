import { costBasisSchema, type CostBasisData } from '../../shared/schemas/costBasis.ts'
import { searchSpecSchema, type SearchSpec } from '../../shared/schemas/search.ts'
import { mergeLibraries, type ComponentLibrary, type CaseSI } from '../engine/case.ts'
import { caseToSI } from '../engine/index.ts'
import { designSI } from '../engine/design.ts'
import { InvalidInputError, InfeasibleDesignError, ConvergenceError } from '../engine/errors.ts'
import { priceDesign } from '../engine/costing/index.ts'
import { optimise, NoFeasibleDesignError, type OptimiseResult } from '../engine/optimisation/index.ts'
import { optimiseAsync, uncertaintyAsync } from './optimise-pool.ts'
import type { RobustSpec, UncertaintySpec } from '../../shared/schemas/uncertainty.ts'
import type { DesignResult as EngineDesign } from '../engine/contract.ts'
import type { DesignResult } from '../../shared/schemas/results.ts'
import { designToPublic, robustToPublic, uncertaintyToPublic, type RobustResultSI } from '../../shared/summaryUnits.ts'
import type { RobustResult } from '../../shared/schemas/uncertainty.ts'
import { ValidationError, InfeasibleError, zodDetails } from '../errors.ts'
import { rateCaseToSI, rateSI } from '../engine/rating/rate.ts'
import type { WindowOptions } from '../engine/rating/window.ts'
import type { RatingResult } from '../../shared/schemas/rating.ts'
import baseLibraryJson from '../../data/components.json' with { type: 'json' }

/**
 * The one door from the API to the engine: validates with the shared schemas, normalises units,
 * runs the pure engine and turns its typed errors into API errors (400 with field paths for bad
 * input, 422 with structured reasons for infeasible designs).
 */
export const baseLibrary = baseLibraryJson as unknown as ComponentLibrary

export function libraryWith(extra?: ComponentLibrary): ComponentLibrary {
  return mergeLibraries(baseLibrary, extra)
}

function prefixed(prefix: string, path: string): string {
  return [prefix, path].filter(Boolean).join('.')
}

/** Map an engine error to the API's error family; anything else is re-thrown. */
export function toApiError(e: unknown, prefix: string): never {
  // Engine paths are relative to the case, except the search settings, which sit beside it.
  const root = prefix.replace(/\.?(case|inputs)$/, '')
  const where = (path: string) => (path.startsWith('search') ? prefixed(root, path) : prefixed(prefix, path))
  if (e instanceof InvalidInputError) {
    throw new ValidationError('The case is not valid.', e.issues.map((i) => ({ path: where(i.path), message: i.message, code: i.code })))
  }
  if (e instanceof InfeasibleDesignError) {
    throw new InfeasibleError('No design meets these inputs.', e.issues.map((i) => ({ path: where(i.path), message: i.message, code: i.code })))
  }
  if (e instanceof NoFeasibleDesignError) {
    throw new InfeasibleError(e.message, [{ path: prefixed(prefix.replace(/\.?case$/, ''), 'search'), message: e.message, code: 'noFeasibleDesign' }])
  }
  if (e instanceof ConvergenceError) {
    throw new InfeasibleError('The calculation did not converge for these inputs.', [{ path: prefix, message: e.message, code: 'convergence' }])
  }
  throw e
}

/**
 * A raw case from a request or a stored study, in SI: the engine's one case parser
 * (engine/index.ts caseToSI: the shared zod schema, then units and library), with its errors as
 * API errors under `prefix` (e.g. 'body.case', 'inputs').
 */
export function caseFromRequest(raw: unknown, library: ComponentLibrary, prefix = 'body'): CaseSI {
  try {
    return caseToSI(raw, { library })
  } catch (e) {
    return toApiError(e, prefix)
  }
}

export function parseBasis(raw: unknown, prefix: string): CostBasisData {
  const r = costBasisSchema.safeParse(raw)
  if (!r.success) throw new ValidationError('The cost basis is not valid.', zodDetails(r.error, prefix))
  return r.data
}

export function parseSearch(raw: unknown, prefix: string): SearchSpec {
  const r = searchSpecSchema.safeParse(raw ?? {})
  if (!r.success) throw new ValidationError('The search settings are not valid.', zodDetails(r.error, prefix))
  return r.data
}

/** A design in the public units (kmol/h, kg/h, m3/h in its summary), priced when a basis applied. */
export type PricedDesign = DesignResult & { totalAnnualCost?: number; costBreakdown?: unknown }

/** An optimisation answer in the public units: the optimum's design summary converted. */
export type PublicOptimiseResult = Omit<OptimiseResult, 'optimum'> & { optimum: Omit<OptimiseResult['optimum'], 'design'> & { design: DesignResult }; robust?: RobustResult }

/**
 * The engine's answers in the public units. The engine is SI throughout, its design summary
 * included; the answer carries the summary's flows in kmol/h, kg/h and m3/h
 * (shared/summaryUnits.ts). New objects: an answer the optimiser caches is never changed.
 */
export function publicDesign(d: EngineDesign, priced?: { totalAnnualCost: number; costBreakdown: unknown } | null): PricedDesign {
  const out: PricedDesign = designToPublic(d)
  if (priced) Object.assign(out, priced)
  return out
}

export function publicOptimisation(r: OptimiseResult & { robust?: RobustResultSI }): PublicOptimiseResult {
  const out: PublicOptimiseResult = { ...r, optimum: { ...r.optimum, design: designToPublic(r.optimum.design) } }
  if (r.robust) out.robust = robustToPublic(r.robust)
  return out
}

export function runDesign(c: CaseSI, basis: CostBasisData | null, prefix = 'body'): PricedDesign {
  try {
    const d = designSI(c)
    return publicDesign(d, basis ? priceDesign(d, basis) : null)
  } catch (e) {
    return toApiError(e, prefix)
  }
}

export function runOptimise(c: CaseSI, basis: CostBasisData, search: SearchSpec, prefix = 'body.case'): PublicOptimiseResult {
  try {
    return publicOptimisation(optimise(c, basis, search))
  } catch (e) {
    return toApiError(e, prefix)
  }
}

/** The same, on a worker thread (and cached): for request handlers. */
export async function runOptimiseAsync(c: CaseSI, basis: CostBasisData, search: SearchSpec, prefix = 'body.case', robust?: RobustSpec): Promise<PublicOptimiseResult> {
  try {
    return publicOptimisation(await optimiseAsync(c, basis, search, robust))
  } catch (e) {
    return toApiError(e, prefix)
  }
}

/** An uncertainty propagation on a worker thread (and cached): for request handlers. */
export async function runUncertaintyAsync(c: CaseSI, basis: CostBasisData, spec: UncertaintySpec, emissionLimit: number | undefined, prefix = 'body.case') {
  try {
    return uncertaintyToPublic(await uncertaintyAsync(c, basis, spec, emissionLimit))
  } catch (e) {
    return toApiError(e, prefix)
  }
}

/**
 * Guard the JSON we return: the engine promises finite numbers; check it at the edge too. Inputs so
 * large that a result overflows (a gas flow of 1e9 kmol/h) are refused as an infeasible design (422)
 * naming the first number that overflowed, never stored and never sent as null.
 */
export function assertFinite(value: unknown, path = 'result'): void {
  const bad = firstNonFinite(value, path)
  if (bad !== null) {
    throw new InfeasibleError('The inputs are too large or too small to compute: a result overflows.', [
      { path: bad, message: 'does not come out as a finite number; bring the inputs into a plant-sized range', code: 'nonFinite' },
    ])
  }
}

function firstNonFinite(value: unknown, path: string): string | null {
  if (typeof value === 'number') return Number.isFinite(value) ? null : path
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const b = firstNonFinite(value[i], `${path}.${i}`)
      if (b !== null) return b
    }
  } else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      const b = firstNonFinite(v, `${path}.${k}`)
      if (b !== null) return b
    }
  }
  return null
}

/** Rate one standing column (a rating case, see shared/schemas/rating.ts); engine errors become API errors. */
export function runRate(raw: unknown, library: ComponentLibrary, prefix = 'body', window?: WindowOptions): RatingResult {
  try {
    return rateSI(rateCaseToSI(raw, library), { window })
  } catch (e) {
    return toApiError(e, prefix)
  }
}
