/** Optimiser: the public surface; the rest of the server imports the optimiser from here. */
export { optimise, bruteForce } from './optimise.ts'
export {
  optimiseWith,
  bruteForceWith,
  recoveryBounds,
  soluteInKgPerHour,
  type OptimiseOptions,
  type BruteForceResolution,
  type BruteForceResult,
} from './driver.ts'
// the evaluator, the search tactics, curves and sensitivity (./core.ts says how they fit together)
export * from './core.ts'
export { boundHits, BOUND_TOLERANCE } from './bounds.ts'
