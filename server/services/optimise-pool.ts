import { Worker } from 'node:worker_threads'
import { availableParallelism } from 'node:os'
import { createHash } from 'node:crypto'
import { NoFeasibleDesignError } from '../engine/optimisation/index.ts'
import { InvalidInputError, InfeasibleDesignError, ConvergenceError } from '../engine/errors.ts'
import { logger } from '../logger.ts'
import { ServiceBusyError } from '../errors.ts'
import type { CaseSI } from '../engine/case.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import type { SearchSpec } from '../../shared/schemas/search.ts'
import type { WorkerError } from '../workers/optimise-worker.ts'
import { runJob, type EngineJob, type JobResult, type OptimiseAnswer } from '../workers/jobs.ts'
import type { RobustSpec, UncertaintySpec } from '../../shared/schemas/uncertainty.ts'
import type { UncertaintyResultSI } from '../../shared/summaryUnits.ts'

/**
 * Optimisations run on worker threads (one per core) so that one long optimisation never stalls
 * other requests, and the same optimisation (same case, cost basis and search, the answer is
 * deterministic) is answered from a small in-memory cache. Jobs wait in a bounded queue: beyond
 * OPTIMISE_QUEUE waiting jobs (default 8 per worker) a new one is refused at once with 503 and
 * Retry-After, rather than making everybody wait. OPTIMISE_WORKERS=0 runs them inline.
 */
const WORKERS = Math.max(0, Number(process.env.OPTIMISE_WORKERS ?? availableParallelism()))
let MAX_QUEUE = Math.max(1, Number(process.env.OPTIMISE_QUEUE ?? 8 * Math.max(1, WORKERS)))
const CACHE_SIZE = 200

/** Jobs waiting for a free worker (first come, first served). */
const waiting: { id: number; job: Pending['job']; resolve: Pending['resolve']; reject: Pending['reject'] }[] = []
/** Recent optimisation times [ms], for the Retry-After estimate. */
let meanMs = 200

/** Change the queue bound (tests); returns the previous one. */
export function setOptimiseQueueLimit(n: number): number {
  const old = MAX_QUEUE
  MAX_QUEUE = Math.max(1, n)
  return old
}

/** Queue state, for the readiness answer and the bench. */
export function optimiseQueueState() {
  return { workers: WORKERS, busy: slots.filter((s) => s.busy > 0).length, waiting: waiting.length, maxQueue: MAX_QUEUE }
}

type Pending = { resolve: (r: JobResult) => void; reject: (e: unknown) => void; job: EngineJob; started: number }
interface Slot {
  worker: Worker
  busy: number
}

const slots: Slot[] = []
const pending = new Map<number, Pending & { slot: Slot }>()
let nextId = 1
let broken = false

function rebuild(e: WorkerError): Error {
  switch (e.kind) {
    case 'InvalidInputError':
      return new InvalidInputError(e.path, e.reason, e.issues)
    case 'InfeasibleDesignError':
      return new InfeasibleDesignError(e.issues)
    case 'NoFeasibleDesignError':
      return new NoFeasibleDesignError(e.message, e.reasons)
    case 'ConvergenceError':
      return new ConvergenceError(e.message.replace(/ \(after .*\)$/, ''), e.iterations, e.residual)
    default:
      return new Error(e.message)
  }
}

function spawn(): Slot {
  // Compiled (dist-server/): the worker is a sibling module. From source (tsx): through the loader.
  const compiled = !import.meta.url.endsWith('.ts')
  const worker = compiled
    ? new Worker(new URL('./optimise-worker.mjs', import.meta.url))
    : new Worker(new URL('../workers/bootstrap.mjs', import.meta.url), {
        workerData: { entry: new URL('../workers/optimise-worker.ts', import.meta.url).href },
      })
  const slot: Slot = { worker, busy: 0 }
  worker.unref()
  worker.on('message', (m: { id: number; ok: boolean; result?: JobResult; error?: WorkerError }) => {
    const p = pending.get(m.id)
    if (!p) return
    pending.delete(m.id)
    slot.busy--
    meanMs = 0.8 * meanMs + 0.2 * (Date.now() - p.started)
    if (m.ok && m.result) p.resolve(m.result)
    else p.reject(rebuild(m.error ?? { kind: 'Error', message: 'worker failed' }))
    dispatch()
  })
  worker.on('error', (err) => {
    // A worker that cannot run stops the pool; its jobs (and all later ones) run inline.
    logger.error({ err }, 'optimisation worker failed; optimising inline from now on')
    broken = true
    for (const [id, p] of pending) {
      if (p.slot === slot) {
        pending.delete(id)
        try {
          p.resolve(runJob(p.job))
        } catch (e) {
          p.reject(e)
        }
      }
    }
    const i = slots.indexOf(slot)
    if (i >= 0) slots.splice(i, 1)
    for (const w of waiting.splice(0)) {
      try {
        w.resolve(runJob(w.job))
      } catch (e) {
        w.reject(e)
      }
    }
  })
  return slot
}

function leastBusy(): Slot | null {
  if (WORKERS === 0 || broken) return null
  try {
    while (slots.length < WORKERS) slots.push(spawn())
  } catch (err) {
    broken = true
    logger.warn({ err }, 'worker threads unavailable; optimising inline')
    return null
  }
  return slots.reduce((a, b) => (b.busy < a.busy ? b : a))
}

const cache = new Map<string, JobResult>()
/** Jobs under way, by key: a second identical request waits for the first. */
const inFlight = new Map<string, Promise<JobResult>>()
function keyOf(job: EngineJob): string {
  return createHash('sha256').update(JSON.stringify(job)).digest('base64url')
}

async function runPooled(job: EngineJob): Promise<JobResult> {
  const key = keyOf(job)
  const hit = cache.get(key)
  if (hit) {
    cache.delete(key)
    cache.set(key, hit)
    return structuredClone(hit)
  }
  let running = inFlight.get(key)
  if (!running) {
    running = compute(key, job).finally(() => inFlight.delete(key))
    inFlight.set(key, running)
  }
  return structuredClone(await running)
}

/** An optimisation (and the robust optimum beside it when `robust` is given) on a worker. */
export async function optimiseAsync(c: CaseSI, basis: CostBasisData, search: SearchSpec, robust?: RobustSpec): Promise<OptimiseAnswer> {
  return (await runPooled(robust ? { c, basis, search, robust } : { c, basis, search })) as OptimiseAnswer
}

/** An uncertainty propagation on a worker (same queue and bound as the optimisations). */
export async function uncertaintyAsync(c: CaseSI, basis: CostBasisData, spec: UncertaintySpec, emissionLimit?: number): Promise<UncertaintyResultSI> {
  return (await runPooled({ kind: 'uncertainty', c, basis, spec, ...(emissionLimit !== undefined ? { emissionLimit } : {}) })) as UncertaintyResultSI
}

/** Hands waiting jobs to idle workers. */
function dispatch(): void {
  for (const slot of slots) {
    if (slot.busy > 0) continue
    const next = waiting.shift()
    if (!next) return
    slot.busy++
    pending.set(next.id, { resolve: next.resolve, reject: next.reject, slot, job: next.job, started: Date.now() })
    slot.worker.postMessage({ id: next.id, ...next.job })
  }
}

function busyError(): ServiceBusyError {
  const seconds = Math.max(1, Math.ceil(((waiting.length / Math.max(1, slots.length)) * meanMs) / 1000))
  return new ServiceBusyError('The optimiser is busy with other requests; try again in a few seconds.', seconds)
}

/**
 * Refuses a new optimisation at once (503 + Retry-After) when the queue is full, before the
 * request costs the HTTP thread a database round trip, the case's parse and its hash: under a
 * burst the refusals go out quickly and cheap requests are not held up behind them.
 */
export function assertOptimiseCapacity(): void {
  if (WORKERS > 0 && !broken && slots.length > 0 && waiting.length >= MAX_QUEUE) throw busyError()
}

async function compute(key: string, job: EngineJob): Promise<JobResult> {
  const slot = leastBusy()
  let result: JobResult
  if (!slot) {
    result = runJob(job)
  } else {
    if (waiting.length >= MAX_QUEUE) throw busyError()
    const id = nextId++
    result = await new Promise<JobResult>((resolve, reject) => {
      waiting.push({ id, job, resolve, reject })
      dispatch()
    })
  }
  cache.set(key, result)
  if (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value as string)
  return result
}

/** Start the workers now, so the first optimisation does not wait for them to load. */
export function warmOptimisePool(): void {
  leastBusy()
}

export async function stopOptimisePool(): Promise<void> {
  await Promise.all(slots.splice(0).map((s) => s.worker.terminate()))
}
