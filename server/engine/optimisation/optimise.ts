/**
 * Lowest-TAC optimisation of a case with a site cost basis, and the brute-force grid it is
 * verified against, both on the design engine. See ./core.ts for the method.
 */
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import type { SearchSpec } from '../../../shared/schemas/search.ts'
import type { CaseSI } from '../case.ts'
import { designSI } from '../design.ts'
import type { OptimiseResult } from './core.ts'
import {
  bruteForceWith,
  optimiseWith,
  soluteInKgPerHour,
  type BruteForceResolution,
  type BruteForceResult,
  type OptimiseOptions,
} from './driver.ts'

/** Designs inside the search need no stage profile or detail section. */
const LEAN = { profile: false, detail: false } as const

/**
 * The lowest-TAC design of a case under a site cost basis.
 * @throws InfeasibleDesignError when the emission limit cannot be met within the recovery bounds;
 *         NoFeasibleDesignError when no design in the bounds passes the checks and limits.
 */
export function optimise(c: CaseSI, basis: CostBasisData, search: SearchSpec, options: OptimiseOptions = {}): OptimiseResult {
  const res = optimiseWith((v) => designSI(c, v, LEAN), soluteInKgPerHour(c), basis, search, options)
  // the optimum again with the stage profile and the detail section, for display
  const o = res.optimum
  const full = designSI(c, { recovery: o.recovery, solventFactor: o.solventFactor, traySpacing: o.traySpacing, floodFraction: o.floodFraction })
  return { ...res, optimum: { ...o, design: full } }
}

/** Dense-grid optimum of a case (recovery uniform in r), for verifying the optimiser. */
export function bruteForce(c: CaseSI, basis: CostBasisData, search: SearchSpec, res: BruteForceResolution): BruteForceResult {
  return bruteForceWith((v) => designSI(c, v, LEAN), soluteInKgPerHour(c), basis, search, res)
}
