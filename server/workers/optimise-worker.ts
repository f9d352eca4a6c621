import { parentPort } from 'node:worker_threads'
import { readlinkSync } from 'node:fs'
import { setPriority } from 'node:os'
import { NoFeasibleDesignError } from '../engine/optimisation/index.ts'
import { InvalidInputError, InfeasibleDesignError, ConvergenceError } from '../engine/errors.ts'
import { runJob, type EngineJob } from './jobs.ts'

/**
 * Runs optimisations off the HTTP thread. Engine errors travel back as plain data and are
 * rebuilt into their classes by the pool (server/services/optimise-pool.ts).
 */
/** A job as posted: its id and the work (./jobs.ts). */
export type OptimiseJob = { id: number } & EngineJob

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

/**
 * The worker runs below the HTTP thread's priority (nice OPTIMISE_WORKER_NICE, default 10): with
 * as many workers as cores, cheap requests (sign-in, lists, /auth/me) still get the CPU at once
 * while optimisations queue. Linux keeps the nice value per thread; /proc/thread-self names this
 * thread. Elsewhere the worker keeps the process priority.
 */
function runBelowHttpThread(): void {
  const nice = Number(process.env.OPTIMISE_WORKER_NICE ?? 10)
  if (!(nice > 0)) return
  try {
    const tid = Number(readlinkSync('/proc/thread-self').split('/').pop())
    if (Number.isInteger(tid) && tid > 0) setPriority(tid, Math.min(19, nice))
  } catch {
    // no /proc (not Linux) or not permitted: same priority as the HTTP thread
  }
}
runBelowHttpThread()

parentPort?.on('message', (job: OptimiseJob) => {
  try {
    parentPort!.postMessage({ id: job.id, ok: true, result: runJob(job) })
  } catch (e) {
    parentPort!.postMessage({ id: job.id, ok: false, error: describe(e) })
  }
})
