/**
 * The search proper: coarse grid, multi-start pattern search (after Hooke and Jeeves 1961, key
 * hookeJeeves1961), ridge searches and the cell-edge polish. See ./core.ts for the method.
 */
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import { NoFeasibleDesignError, linspace, type Box, type Evaluator, type X } from './evaluator.ts'
import { edgeU, polishEdges, ridgeSearch } from './cellEdges.ts'

const DIAGONALS: [number, number][] = [
  [1, 1],
  [-1, -1],
  [1, -1],
  [-1, 1],
]

/**
 * Compass pattern search with step halving on the continuous variables (scaled to [0,1]) and
 * neighbour moves on the discrete spacing. Strict improvement only, so plateaus cannot cycle.
 */
export function patternSearch(ev: Evaluator, basis: CostBasisData, box: Box, start: X, step0: number, minStep: number): { x: X; tac: number } {
  let x = { ...start }
  let best = ev.tac(x, basis)
  const span = { u: box.u[1] - box.u[0], s: box.s[1] - box.s[0], f: box.f[1] - box.f[0] }
  const keys = ['u', 's', 'f'] as const
  let step = step0
  const nT = ev.spacings.length
  const lastDir: Record<'u' | 's' | 'f', number> = { u: 0, s: 0, f: 0 }
  /** x moved by (du, ds, df) steps, clamped to the box; null when the clamp leaves it where it was. */
  const moved = (from: X, du: number, ds: number, df: number): X | null => {
    const y = {
      u: Math.min(box.u[1], Math.max(box.u[0], from.u + du * step * span.u)),
      s: Math.min(box.s[1], Math.max(box.s[0], from.s + ds * step * span.s)),
      f: Math.min(box.f[1], Math.max(box.f[0], from.f + df * step * span.f)),
      t: from.t,
    }
    return y.u === from.u && y.s === from.s && y.f === from.f ? null : y
  }
  const along = (k: 'u' | 's' | 'f', dir: number): [number, number, number] =>
    k === 'u' ? [dir, 0, 0] : k === 's' ? [0, dir, 0] : [0, 0, dir]
  const tryMove = (y: X | null): boolean => {
    if (!y) return false
    const t = ev.tac(y, basis)
    if (!(t < best)) return false
    best = t
    x = y
    return true
  }
  while (step >= minStep) {
    let improved = false
    for (const k of keys) {
      if (span[k] <= 0) continue
      for (const dir of lastDir[k] < 0 ? [-1, 1] : [1, -1]) {
        if (!tryMove(moved(x, ...along(k, dir)))) continue
        improved = true
        lastDir[k] = dir
        // expand along the successful direction while it keeps improving
        while (tryMove(moved(x, ...along(k, dir))));
        break
      }
    }
    if (!improved && span.u > 0 && span.s > 0) {
      // diagonal moves in (recovery, solvent factor): the tray-count cells are bounded by curves
      // along which more recovery needs more solvent, so the best point often lies on a diagonal
      for (const [du, ds] of DIAGONALS) {
        if (tryMove(moved(x, du, ds, 0))) {
          improved = true
          break
        }
      }
    }
    for (const dt of [-1, 1]) {
      const ti = x.t + dt
      if (ti >= 0 && ti < nT && tryMove({ ...x, t: ti })) improved = true
    }
    if (!improved) step /= 2
  }
  return { x, tac: best }
}

export interface SearchOutcome {
  x: X
  tac: number
  box: Box
}

/** The search proper: coarse grid, multi-start pattern search, cell-edge polish. */
export function searchOptimum(ev: Evaluator, basis: CostBasisData, opts: { grid?: [number, number, number]; starts?: number } = {}): SearchOutcome {
  const sp = ev.search
  const box: Box = { u: [ev.uLo, ev.uHi], s: [sp.solventFactor.min, sp.solventFactor.max], f: [sp.floodFraction.min, sp.floodFraction.max] }
  const [nu, ns, nf] = opts.grid ?? [5, 4, 3]
  const us = linspace(box.u[0], box.u[1], box.u[1] > box.u[0] ? nu : 1)
  const ss = linspace(box.s[0], box.s[1], box.s[1] > box.s[0] ? ns : 1)
  const fs = linspace(box.f[0], box.f[1], box.f[1] > box.f[0] ? nf : 1)
  const cand: { x: X; tac: number; trays: number }[] = []
  const reasons = new Set<string>()
  /** Evaluate every grid point on every spacing; feasible ones become candidates, the first reasons are kept. */
  const grid = (us: number[], ss: number[], fs: number[], keepReasons: boolean) => {
    for (let t = 0; t < ev.spacings.length; t++)
      for (const u of us)
        for (const s of ss)
          for (const f of fs) {
            const x = { u, s, f, t }
            const e = ev.evaluate(x, basis)
            if (e.feasible) cand.push({ x, tac: e.tac, trays: e.design?.summary.actualTrays ?? 0 })
            else if (keepReasons && e.reason && reasons.size < 20) reasons.add(e.reason)
          }
  }
  grid(us, ss, fs, true)
  if (cand.length === 0) {
    // a second, finer look before giving up (the feasible region can be thin)
    grid(linspace(box.u[0], box.u[1], 2 * nu + 1), linspace(box.s[0], box.s[1], 2 * ns + 1), linspace(box.f[0], box.f[1], 2 * nf + 1), false)
  }
  if (cand.length === 0) {
    throw new NoFeasibleDesignError(
      'No design within the search bounds passes the tray checks and the diameter and height limits.',
      [...reasons],
    )
  }
  cand.sort((a, b) => a.tac - b.tac)
  // starts: the TAC surface is multimodal across tray-count cells and spacings, so start from
  // the best grid point of each of the two best tray counts and of the two best spacings
  const starts: X[] = []
  const nByTrays = opts.starts ?? 2
  const seenTrays = new Set<number>()
  for (const c of cand) {
    if (seenTrays.has(c.trays)) continue
    seenTrays.add(c.trays)
    starts.push(c.x)
    if (starts.length >= nByTrays) break
  }
  const seenT = new Set<number>()
  for (const c of cand) {
    if (seenT.size >= 2) break
    if (seenT.has(c.x.t)) continue
    seenT.add(c.x.t)
    if (!starts.includes(c.x)) starts.push(c.x)
  }
  const step0 = 0.5 / Math.max(1, Math.min(nu, ns, nf) - 1)
  let best: { x: X; tac: number } | null = null
  for (const x0 of starts) {
    const r = patternSearch(ev, basis, box, x0, step0, 1 / 512)
    if (!best || r.tac < best.tac) best = r
  }
  if (!best) throw new NoFeasibleDesignError('No feasible start.', [])
  const out = refine(ev, basis, box, best)
  return { x: out.x, tac: out.tac, box }
}

/**
 * From a good point: ridge searches on its tray count and the neighbouring counts (recovery raised
 * to what the trays give), then a fine pattern search and the cell-edge polish.
 */
export function refine(ev: Evaluator, basis: CostBasisData, box: Box, start: { x: X; tac: number }, light = false): { x: X; tac: number } {
  let best = ridgesAround(ev, basis, box, start)
  if (light) {
    const fin = patternSearch(ev, basis, box, best.x, 1 / 64, 1 / 256)
    return polishEdges(ev, basis, box, fin.x, 1)
  }
  // the other spacings: the same tray count (and its neighbours) with the recovery at the cell
  // edge and the highest feasible fraction of flood there; a better one gets its own ridges
  const moved = spacingTransfer(ev, basis, box, best)
  if (moved.tac < best.tac) best = ridgesAround(ev, basis, box, moved)
  const fin = patternSearch(ev, basis, box, best.x, 1 / 64, 1 / 1024)
  return polishEdges(ev, basis, box, fin.x, 4)
}

function ridgesAround(ev: Evaluator, basis: CostBasisData, box: Box, start: { x: X; tac: number }): { x: X; tac: number } {
  let best = start
  const d0 = ev.designAt(best.x)
  if (typeof d0 === 'string') return best
  const n0 = d0.summary.actualTrays
  for (const n of [n0, n0 + 1, n0 - 1]) {
    if (n < 1) continue
    const r = ridgeSearch(ev, basis, box, best.x, n)
    if (r && r.tac < best.tac) best = r
  }
  return best
}

function spacingTransfer(ev: Evaluator, basis: CostBasisData, box: Box, start: { x: X; tac: number }): { x: X; tac: number } {
  let best = start
  const d0 = ev.designAt(start.x)
  if (typeof d0 === 'string') return best
  const n0 = d0.summary.actualTrays
  for (let t = 0; t < ev.spacings.length; t++) {
    if (t === start.x.t) continue
    const y = highestFeasibleFloodAnywhere(ev, box, { ...start.x, t })
    if (!y) continue
    for (const n of [n0, n0 + 1, n0 - 1]) {
      if (n < 1) continue
      const u = edgeU(ev, y, n, box)
      if (u === null) continue
      const z = highestFeasibleFloodAnywhere(ev, box, { ...y, u }) ?? { ...y, u }
      const tz = ev.tac(z, basis)
      if (tz < best.tac) best = { x: z, tac: tz }
    }
  }
  return best
}

/**
 * The highest feasible fraction of flood at these other variables (bisection to 0.2 % of the
 * range), searching up from x.f when x is feasible, else between the lower bound and x.f.
 */
function highestFeasibleFloodAnywhere(ev: Evaluator, box: Box, x: X): X | null {
  const ok = (f: number) => typeof ev.designAt({ ...x, f }) !== 'string'
  let a: number
  let b: number
  if (ok(x.f)) {
    if (ok(box.f[1])) return { ...x, f: box.f[1] }
    a = x.f
    b = box.f[1]
  } else {
    if (!ok(box.f[0])) return null
    a = box.f[0]
    b = x.f
  }
  while (b - a > 2e-3 * (box.f[1] - box.f[0])) {
    const m = (a + b) / 2
    if (ok(m)) a = m
    else b = m
  }
  return { ...x, f: a }
}
