/**
 * The work a pool worker does, shared by the worker thread and the pool's inline fallback:
 * an optimisation (with the robust optimum beside it when asked), or an uncertainty propagation.
 */
import { optimise } from '../engine/optimisation/index.ts'
import type { OptimiseResult } from '../engine/optimisation/core.ts'
import { propagate, robustOptimum } from '../engine/uncertainty/index.ts'
import type { CaseSI } from '../engine/case.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import type { SearchSpec } from '../../shared/schemas/search.ts'
import type { RobustSpec, UncertaintySpec } from '../../shared/schemas/uncertainty.ts'
import type { RobustResultSI, UncertaintyResultSI } from '../../shared/summaryUnits.ts'

export type EngineJob =
  | { kind?: 'optimise'; c: CaseSI; basis: CostBasisData; search: SearchSpec; robust?: RobustSpec }
  | { kind: 'uncertainty'; c: CaseSI; basis: CostBasisData; spec: UncertaintySpec; emissionLimit?: number }

/** Answers in SI (flows in mol/s); the engine gateway converts them for the public. */
export type OptimiseAnswer = OptimiseResult & { robust?: RobustResultSI }
export type JobResult = OptimiseAnswer | UncertaintyResultSI

export function runJob(job: EngineJob): JobResult {
  if (job.kind === 'uncertainty') return propagate({ c: job.c, basis: job.basis, spec: job.spec, emissionLimit: job.emissionLimit })
  const res = optimise(job.c, job.basis, job.search)
  if (!job.robust) return res
  return { ...res, robust: robustOptimum(job.c, job.basis, job.search, res, job.robust) }
}
