/**
 * Lowest-cost optimiser, independent of how a design is produced: it receives a function that
 * turns DesignVariables into a DesignResult (the design engine, or a test stand-in), prices each
 * design with the cost model and searches for the lowest total annualised cost (TAC).
 *
 * Variables: recovery r (continuous; bounds from the search spec and the emission limit,
 * r >= 1 - limit / solute in), solvent factor L/Lmin (continuous), fraction of flood (continuous),
 * tray spacing (discrete list). Recovery is searched as u = -ln(1 - r), in which the stage count
 * is nearly linear.
 *
 * Integer trays: the design rounds N_theoretical / E_o up, so the TAC surface is cut into cells of
 * equal tray count (and equal rounded diameter). Inside a cell the TAC moves smoothly (lost product
 * falls as r rises; solvent cost rises with L/Lmin), so the optimum lies on a cell edge. Our
 * treatment: at a fixed tray count the recovery is raised to what those trays give, i.e. to the
 * edge of the cell, found as the root of N_theoretical(u)/E_o(u) = trays (regula falsi, a few
 * design calls, then stepped 1e-9 inside). The tray count itself is not a separate variable; the
 * search visits neighbouring counts explicitly (ridge search below).
 *
 * Constraints: a design the engine rejects (InfeasibleDesignError, InvalidInputError,
 * ConvergenceError) is an infeasible point; a tray check with status 'fail' is infeasible, 'warn' is
 * accepted by default (search.allowWarnings = false rejects it too); diameter and height must not
 * exceed search.maxDiameter and search.maxHeight. Infeasible points have TAC = +infinity.
 *
 * Method:
 *   1. coarse grid, 5 (u) x 4 (L/Lmin) x 3 (flood) for every tray spacing;
 *   2. pattern search (compass moves with expansion, diagonal moves in (u, L/Lmin), neighbour
 *      moves on the spacing, step halving; after Hooke and Jeeves 1961, key hookeJeeves1961) from
 *      the best grid point of each of the two best tray counts and of the two best spacings;
 *   3. ridge search on the best point's tray count and its two neighbours: along L/Lmin, recovery
 *      at the cell edge, minimised by a 5-point scan and golden-section refinement; then a
 *      transfer to every other spacing (same tray counts, recovery at the cell edge, highest
 *      feasible fraction of flood), with its own ridge search when that is cheaper;
 *   4. a fine pattern search and a bisection polish that pushes each variable to its cell edge
 *      and hops into the next cell when that is cheaper (e.g. a higher fraction of flood giving
 *      the next smaller diameter).
 * Verified against a dense brute-force grid (tests/engine/optimisation.spec.ts). Designs are cached
 * by their variables, so re-pricing under a changed cost basis (sensitivity) mostly reuses them.
 *
 * Files: evaluator.ts (design cache, feasibility, pricing, shared types), search.ts (grid, pattern
 * and ridge searches), cellEdges.ts (cell-edge solves and polish), curves.ts, sensitivity.ts,
 * bounds.ts (optimum on a search bound); driver.ts puts them together.
 */
export {
  Evaluator,
  NoFeasibleDesignError,
  toR as toRecovery,
  toU as toLogRecovery,
  type CurvePoint,
  type DesignFn,
  type OptimiseResult,
  type OptimumPoint,
  type SensitivityEntry,
  type BoundHit,
} from './evaluator.ts'
export { searchOptimum, type SearchOutcome } from './search.ts'
export { curve } from './curves.ts'
export { sensitivity, sensitivityItems } from './sensitivity.ts'
export { costItemLabels } from '../costing/costDesign.ts'
