import { parentPort } from 'node:worker_threads'
import { optimise, NoFeasibleDesignError } from '../engine/optimisation/index.ts'
import { InvalidInputError, InfeasibleDesignError, ConvergenceError } from '../engine/errors.ts'
import type { CaseSI } from '../engine/case.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import type { SearchSpec } from '../../shared/schemas/search.ts'

/**
 * Runs optimisations off the HTTP thread. Engine errors travel back as plain data and are
 * rebuilt into their classes by the pool (server/services/optimise-pool.ts).
 */
export interface OptimiseJob {
  id: number
  c: CaseSI
  basis: CostBasisData
  search: SearchSpec
}

export type WorkerError =
  | { kind: 'InvalidInputError'; path: string; reason: string; issues: InvalidInputError['issues'] }
  | { kind: 'InfeasibleDesignError'; issues: InfeasibleDesignError['issues'] }
  | { kind: 'NoFeasibleDesignError'; message: string; reasons: string[] }
  | { kind: 'ConvergenceError'; message: string; iterations: number; residual: number }
  | { kind: 'Error'; message: string }

function describe(e: unknown): WorkerError {
  if (e instanceof InvalidInputError) return { kind: 'InvalidInputError', path: e.path, reason: e.reason, issues: e.issues }
  if (e instanceof InfeasibleDesignError) return { kind: 'InfeasibleDesignError', issues: e.issues }
  if (e instanceof NoFeasibleDesignError) return { kind: 'NoFeasibleDesignError', message: e.message, reasons: e.reasons }
  if (e instanceof ConvergenceError) return { kind: 'ConvergenceError', message: e.message, iterations: e.iterations, residual: e.residual }
  return { kind: 'Error', message: e instanceof Error ? e.message : String(e) }
}

parentPort?.on('message', (job: OptimiseJob) => {
  try {
    parentPort!.postMessage({ id: job.id, ok: true, result: optimise(job.c, job.basis, job.search) })
  } catch (e) {
    parentPort!.postMessage({ id: job.id, ok: false, error: describe(e) })
  }
})
