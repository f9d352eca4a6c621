import { Worker } from 'node:worker_threads'
import { availableParallelism } from 'node:os'
import { createHash } from 'node:crypto'
import { optimise, NoFeasibleDesignError, type OptimiseResult } from '../engine/optimisation/index.ts'
import { InvalidInputError, InfeasibleDesignError, ConvergenceError } from '../engine/errors.ts'
import { logger } from '../logger.ts'
import { ServiceBusyError } from '../errors.ts'
import type { CaseSI } from '../engine/case.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import type { SearchSpec } from '../../shared/schemas/search.ts'
import type { WorkerError } from '../workers/optimise-worker.ts'

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

type Pending = { resolve: (r: OptimiseResult) => void; reject: (e: unknown) => void; job: { c: CaseSI; basis: CostBasisData; search: SearchSpec }; started: number }
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
  worker.on('message', (m: { id: number; ok: boolean; result?: OptimiseResult; error?: WorkerError }) => {
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
          p.resolve(optimise(p.job.c, p.job.basis, p.job.search))
        } catch (e) {
          p.reject(e)
        }
      }
    }
    const i = slots.indexOf(slot)
    if (i >= 0) slots.splice(i, 1)
    for (const w of waiting.splice(0)) {
      try {
        w.resolve(optimise(w.job.c, w.job.basis, w.job.search))
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

const cache = new Map<string, OptimiseResult>()
/** Optimisations under way, by key: a second identical request waits for the first. */
const inFlight = new Map<string, Promise<OptimiseResult>>()
function keyOf(c: CaseSI, basis: CostBasisData, search: SearchSpec): string {
  return createHash('sha256').update(JSON.stringify([c, basis, search])).digest('base64url')
}

export async function optimiseAsync(c: CaseSI, basis: CostBasisData, search: SearchSpec): Promise<OptimiseResult> {
  const key = keyOf(c, basis, search)
  const hit = cache.get(key)
  if (hit) {
    cache.delete(key)
    cache.set(key, hit)
    return structuredClone(hit)
  }
  let running = inFlight.get(key)
  if (!running) {
    running = compute(key, c, basis, search).finally(() => inFlight.delete(key))
    inFlight.set(key, running)
  }
  return structuredClone(await running)
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

async function compute(key: string, c: CaseSI, basis: CostBasisData, search: SearchSpec): Promise<OptimiseResult> {
  const slot = leastBusy()
  let result: OptimiseResult
  if (!slot) {
    result = optimise(c, basis, search)
  } else {
    if (waiting.length >= MAX_QUEUE) {
      const seconds = Math.max(1, Math.ceil(((waiting.length / Math.max(1, slots.length)) * meanMs) / 1000))
      throw new ServiceBusyError('The optimiser is busy with other requests; try again in a few seconds.', seconds)
    }
    const id = nextId++
    result = await new Promise<OptimiseResult>((resolve, reject) => {
      waiting.push({ id, job: { c, basis, search }, resolve, reject })
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
