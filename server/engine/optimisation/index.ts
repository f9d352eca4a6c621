/** Optimiser: public surface. */
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
export {
  NoFeasibleDesignError,
  sensitivityItems,
  type CurvePoint,
  type DesignFn,
  type OptimiseResult,
  type OptimumPoint,
  type SensitivityEntry,
  type BoundHit,
} from './core.ts'
export { boundHits, BOUND_TOLERANCE } from './bounds.ts'
