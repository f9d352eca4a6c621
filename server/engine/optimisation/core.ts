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
 */
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import type { SearchSpec } from '../../../shared/schemas/search.ts'
import type { DesignResult, DesignVariables } from '../contract.ts'
import { costDesign, costItemLabels, totalAnnualCost, type CostBreakdown, type CostItemKey } from '../costing/costDesign.ts'
import { isEngineError } from '../errors.ts'

export type DesignFn = (vars: DesignVariables) => DesignResult

export interface OptimumPoint {
  recovery: number
  solventFactor: number
  traySpacing: number
  floodFraction: number
  actualTrays: number
  selectedDiameter: number
  totalAnnualCost: number
  breakdown: CostBreakdown
  design: DesignResult
}

export interface CurvePoint {
  x: number
  feasible: boolean
  tac: number | null
  breakdown: Record<CostItemKey, number> | null
  actualTrays: number | null
  selectedDiameter: number | null
  reason?: string
}

export interface SensitivityEntry {
  item: string
  label: string
  unit: string
  baseValue: number
  low: { value: number; tac: number; recovery: number; solventFactor: number }
  high: { value: number; tac: number; recovery: number; solventFactor: number }
}

export interface OptimiseResult {
  optimum: OptimumPoint
  evaluations: number
  bounds: { recovery: [number, number]; solventFactor: [number, number]; floodFraction: [number, number]; traySpacings: number[] }
  curves: { recovery: CurvePoint[]; solventFactor: CurvePoint[] }
  sensitivity: SensitivityEntry[]
  stats: { searchEvaluations: number; curveEvaluations: number; sensitivityEvaluations: number; feasibleFraction: number; ms: { search: number; curves: number; sensitivity: number } }
  cautions: string[]
}

/** A point of the search space: u = -ln(1 - recovery). */
interface X {
  u: number
  s: number
  f: number
  t: number // index into traySpacings
}

interface Eval {
  feasible: boolean
  tac: number
  design?: DesignResult
  cost?: CostBreakdown
  reason?: string
}

export class NoFeasibleDesignError extends Error {
  readonly code = 'noFeasibleDesign'
  readonly reasons: string[]
  constructor(message: string, reasons: string[]) {
    super(message)
    this.name = 'NoFeasibleDesignError'
    this.reasons = reasons
  }
}

const toU = (r: number) => -Math.log(1 - r)
const toR = (u: number) => -Math.expm1(-u)

/** The evaluation context: the design cache, bounds and the running count of design evaluations. */
export class Evaluator {
  designEvaluations = 0
  uLo: number
  uHi: number
  constructor(
    readonly design: DesignFn,
    readonly search: SearchSpec,
    rLo: number,
    rHi: number,
  ) {
    this.uLo = toU(rLo)
    this.uHi = toU(rHi)
  }
  get spacings(): number[] {
    return this.search.traySpacings
  }
  vars(x: X): DesignVariables {
    return { recovery: toR(x.u), solventFactor: x.s, floodFraction: x.f, traySpacing: this.spacings[x.t] ?? 0.6 }
  }
  readonly raw = new Map<string, DesignResult | string>()
  /** Cell edges already solved: (solvent factor, flood, spacing, trays) -> u or null. */
  readonly edges = new Map<string, number | null>()
  /** The design for these variables (cached) whatever its checks say, or why the engine refused it. */
  rawAt(x: X): DesignResult | string {
    const key = `${x.u}|${x.s}|${x.f}|${x.t}`
    const hit = this.raw.get(key)
    if (hit !== undefined) return hit
    let out: DesignResult | string
    this.designEvaluations++
    try {
      out = this.design(this.vars(x))
    } catch (e) {
      if (isEngineError(e)) out = e.message || e.code
      else throw e
    }
    this.raw.set(key, out)
    return out
  }
  /** A feasible design for these variables, or the reason it is infeasible. */
  designAt(x: X): DesignResult | string {
    const d = this.rawAt(x)
    if (typeof d === 'string') return d
    return this.rejects(d) ?? d
  }
  rejects(d: DesignResult): string | null {
    for (const c of d.checks) {
      if (c.status === 'fail') return `${c.label}: ${c.value.toPrecision(3)} ${c.unit} against ${c.limit.toPrecision(3)}`
      if (c.status === 'warn' && !this.search.allowWarnings) return `${c.label} (warning not accepted)`
    }
    const s = d.summary
    if (s.selectedDiameter > this.search.maxDiameter) return `Diameter ${s.selectedDiameter} m above ${this.search.maxDiameter} m`
    if (s.columnHeight > this.search.maxHeight) return `Height ${s.columnHeight.toFixed(1)} m above ${this.search.maxHeight} m`
    return null
  }
  evaluate(x: X, basis: CostBasisData): Eval {
    const d = this.designAt(x)
    if (typeof d === 'string') return { feasible: false, tac: Infinity, reason: d }
    const cost = costDesign(d.summary, basis)
    return { feasible: true, tac: cost.totalAnnualCost, design: d, cost }
  }
  tac(x: X, basis: CostBasisData): number {
    const d = this.designAt(x)
    if (typeof d === 'string') return Infinity
    return totalAnnualCost(d.summary, basis)
  }
}

function linspace(a: number, b: number, n: number): number[] {
  if (n <= 1) return [(a + b) / 2]
  const out: number[] = []
  for (let i = 0; i < n; i++) out.push(a + ((b - a) * i) / (n - 1))
  return out
}

const sameCell = (a: DesignResult, b: DesignResult) =>
  a.summary.actualTrays === b.summary.actualTrays && a.summary.selectedDiameter === b.summary.selectedDiameter

interface Box {
  u: [number, number]
  s: [number, number]
  f: [number, number]
}

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
function patternSearch(ev: Evaluator, basis: CostBasisData, box: Box, start: X, step0: number, minStep: number): { x: X; tac: number } {
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

/**
 * Push each continuous variable to the edge of the current (trays, diameter) cell along the
 * direction that lowers the TAC, by bisection; keep the move when it lowers the TAC.
 */
function polishEdges(ev: Evaluator, basis: CostBasisData, box: Box, start: X, rounds: number): { x: X; tac: number } {
  let x = { ...start }
  let best = ev.tac(x, basis)
  const keys = ['u', 's', 'f'] as const
  for (let round = 0; round < rounds; round++) {
    let moved = false
    for (const k of keys) {
      const d0 = ev.designAt(x)
      if (typeof d0 === 'string') return { x, tac: best }
      for (const bound of [box[k][1], box[k][0]]) {
        if (bound === x[k]) continue
        // is the bound itself in the same cell and better?
        const yb = { ...x, [k]: bound }
        const db = ev.designAt(yb)
        if (typeof db !== 'string' && sameCell(d0, db)) {
          const tb = totalAnnualCost(db.summary, basis)
          if (tb < best) {
            best = tb
            x = yb
            moved = true
          }
          continue
        }
        // bisection between x (inside the cell) and the bound (outside or infeasible)
        let a = x[k]
        let b = bound
        const tol = 1e-4 * Math.abs(box[k][1] - box[k][0])
        for (let i = 0; i < 40 && Math.abs(b - a) > tol; i++) {
          const m = (a + b) / 2
          const dm = ev.designAt({ ...x, [k]: m })
          if (typeof dm !== 'string' && sameCell(d0, dm)) a = m
          else b = m
        }
        // the last point inside the cell, and the first point of the next cell (cell hopping:
        // e.g. a higher fraction of flood that gives the next smaller diameter)
        let moveTo: X | null = null
        for (const v of [a, b]) {
          if (v === x[k]) continue
          const y = { ...x, [k]: v }
          const t = ev.tac(y, basis)
          if (t < best) {
            best = t
            moveTo = y
          }
        }
        if (moveTo) {
          x = moveTo
          moved = true
          break
        }
      }
    }
    if (!moved) break
  }
  return { x, tac: best }
}

/**
 * The largest u = -ln(1-r) (not above uHi) at which the design needs at most `trays` trays: the
 * root of g(u) = N_theoretical(u) / E_o(u) - trays (smooth and increasing in u; the design rounds
 * N/E_o up), found by the Illinois variant of regula falsi from a bracket, then stepped just
 * inside the cell and checked. Null when the tray count cannot be met or the point is infeasible.
 */
function edgeU(ev: Evaluator, x: X, trays: number, box: Box): number | null {
  const key = `${x.s}|${x.f}|${x.t}|${trays}`
  const hit = ev.edges.get(key)
  if (hit !== undefined) return hit
  const u = edgeUSolve(ev, x, trays, box)
  ev.edges.set(key, u)
  return u
}

function edgeUSolve(ev: Evaluator, x: X, trays: number, box: Box): number | null {
  const g = (u: number): number => {
    const d = ev.rawAt({ ...x, u })
    if (typeof d === 'string') return Number.NaN
    const E = d.summary.overallEfficiency
    if (E === undefined || !(E > 0)) return d.summary.actualTrays - trays - 0.5
    return d.summary.theoreticalStages / E - trays
  }
  const span = box.u[1] - box.u[0]
  let a = x.u
  let ga = g(a)
  if (Number.isNaN(ga)) return null
  let b: number
  let gb: number
  let step = 0.05 * span
  if (ga > 0) {
    b = a
    gb = ga
    for (;;) {
      if (a <= box.u[0]) return null
      a = Math.max(box.u[0], a - step)
      ga = g(a)
      if (Number.isNaN(ga)) return null
      if (ga <= 0) break
      b = a
      gb = ga
      step *= 2
    }
  } else {
    for (;;) {
      if (a >= box.u[1]) return box.u[1]
      b = Math.min(box.u[1], a + step)
      gb = g(b)
      if (Number.isNaN(gb)) gb = 1 // beyond the engine's range counts as past the edge
      if (gb > 0) break
      a = b
      ga = gb
      step *= 2
    }
  }
  // Illinois regula falsi on [a, b], g(a) <= 0 < g(b)
  let side = 0
  for (let i = 0; i < 40 && b - a > 1e-10 * Math.max(1, b); i++) {
    const c = (a * gb - b * ga) / (gb - ga)
    const m = c > a && c < b ? c : 0.5 * (a + b)
    let gm = g(m)
    if (Number.isNaN(gm)) gm = 1
    if (gm <= 0) {
      a = m
      ga = gm
      if (side === -1) gb /= 2
      side = -1
    } else {
      b = m
      gb = gm
      if (side === 1) ga /= 2
      side = 1
    }
    if (Math.abs(gm) < 1e-10) break
  }
  const inside = Math.max(box.u[0], a - 1e-9 * Math.max(1, a))
  const d = ev.designAt({ ...x, u: inside })
  if (typeof d === 'string' || d.summary.actualTrays > trays) return null
  return inside
}

/**
 * Ridge search for one tray count: along the solvent factor, recovery is raised to what the trays
 * give (edgeU); the TAC along this ridge is minimised by golden-section search on the solvent
 * factor after a short scan (the ridge can have steps where the diameter changes).
 */
function ridgeSearch(ev: Evaluator, basis: CostBasisData, box: Box, at: X, trays: number): { x: X; tac: number } | null {
  let hint = at.u
  const h = (s: number): { x: X; tac: number } => {
    const x0 = { ...at, s, u: hint }
    const u = edgeU(ev, x0, trays, box)
    if (u === null) return { x: x0, tac: Infinity }
    hint = u
    const x = { ...x0, u }
    return { x, tac: ev.tac(x, basis) }
  }
  const [a0, b0] = box.s
  if (!(b0 > a0)) return h(a0)
  const scan = 5
  let best: { x: X; tac: number } | null = null
  let bi = 0
  const pts: number[] = []
  for (let i = 0; i < scan; i++) pts.push(a0 + ((b0 - a0) * i) / (scan - 1))
  pts.forEach((s, i) => {
    const r = h(s)
    if (!best || r.tac < best.tac) {
      best = r
      bi = i
    }
  })
  const first = best as { x: X; tac: number } | null
  if (!first || !Number.isFinite(first.tac)) return null
  let lo = pts[Math.max(0, bi - 1)] ?? a0
  let hi = pts[Math.min(scan - 1, bi + 1)] ?? b0
  const g = (Math.sqrt(5) - 1) / 2
  let c = hi - g * (hi - lo)
  let d = lo + g * (hi - lo)
  let fc = h(c)
  let fd = h(d)
  let out = first
  for (let i = 0; i < 12 && hi - lo > 2e-3 * (b0 - a0); i++) {
    if (fc.tac <= fd.tac) {
      hi = d
      d = c
      fd = fc
      c = hi - g * (hi - lo)
      fc = h(c)
    } else {
      lo = c
      c = d
      fc = fd
      d = lo + g * (hi - lo)
      fd = h(d)
    }
  }
  for (const r of [fc, fd]) if (r.tac < out.tac) out = r
  return out
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
  for (let t = 0; t < ev.spacings.length; t++)
    for (const u of us)
      for (const s of ss)
        for (const f of fs) {
          const x = { u, s, f, t }
          const e = ev.evaluate(x, basis)
          if (e.feasible) cand.push({ x, tac: e.tac, trays: e.design?.summary.actualTrays ?? 0 })
          else if (e.reason && reasons.size < 20) reasons.add(e.reason)
        }
  if (cand.length === 0) {
    // a second, finer look before giving up (the feasible region can be thin)
    const us2 = linspace(box.u[0], box.u[1], 2 * nu + 1)
    const ss2 = linspace(box.s[0], box.s[1], 2 * ns + 1)
    const fs2 = linspace(box.f[0], box.f[1], 2 * nf + 1)
    for (let t = 0; t < ev.spacings.length; t++)
      for (const u of us2)
        for (const s of ss2)
          for (const f of fs2) {
            const x = { u, s, f, t }
            const e = ev.evaluate(x, basis)
            if (e.feasible) cand.push({ x, tac: e.tac, trays: e.design?.summary.actualTrays ?? 0 })
          }
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
function refine(ev: Evaluator, basis: CostBasisData, box: Box, start: { x: X; tac: number }, light = false): { x: X; tac: number } {
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

/** TAC vs one variable, the others held at the optimum. */
export function curve(ev: Evaluator, basis: CostBasisData, at: X, key: 'u' | 's', values: number[]): CurvePoint[] {
  return values.map((v) => {
    const x = { ...at, [key]: key === 'u' ? toU(v) : v }
    const e = ev.evaluate(x, basis)
    if (!e.feasible || !e.cost || !e.design) {
      return { x: v, feasible: false, tac: null, breakdown: null, actualTrays: null, selectedDiameter: null, reason: e.reason ?? 'infeasible' }
    }
    return {
      x: v,
      feasible: true,
      tac: e.tac,
      breakdown: { ...e.cost.annual },
      actualTrays: e.design.summary.actualTrays,
      selectedDiameter: e.design.summary.selectedDiameter,
    }
  })
}

interface SensItem {
  item: string
  label: string
  unit: string
  get: (b: CostBasisData) => number
  set: (b: CostBasisData, v: number) => void
  integer?: boolean
  max?: number
}

export const sensitivityItems: SensItem[] = [
  { item: 'electricityPrice', label: 'Electricity price', unit: 'currency/kWh', get: (b) => b.utilities.electricityPrice, set: (b, v) => { b.utilities.electricityPrice = v } },
  { item: 'solventCost', label: 'Solvent make-up / treatment cost', unit: 'currency/m3', get: (b) => b.utilities.solventCost, set: (b, v) => { b.utilities.solventCost = v } },
  { item: 'productValue', label: 'Product value', unit: 'currency/kg', get: (b) => b.utilities.productValue, set: (b, v) => { b.utilities.productValue = v } },
  { item: 'emissionCharge', label: 'Emission charge', unit: 'currency/kg', get: (b) => b.utilities.emissionCharge, set: (b, v) => { b.utilities.emissionCharge = v } },
  { item: 'interestRate', label: 'Interest rate', unit: '1/yr', get: (b) => b.capital.interestRate, set: (b, v) => { b.capital.interestRate = v } },
  { item: 'economicLife', label: 'Economic life', unit: 'yr', integer: true, get: (b) => b.capital.economicLife, set: (b, v) => { b.capital.economicLife = v } },
  { item: 'operatingHours', label: 'Operating hours', unit: 'h/yr', max: 8760, get: (b) => b.general.operatingHours, set: (b, v) => { b.general.operatingHours = v } },
  {
    item: 'installationFactors',
    label: 'Installation factors (all)',
    unit: '×',
    get: () => 1,
    set: (b, v) => {
      const f = b.capital.installationFactors
      f.shell *= v
      f.platforms *= v
      f.trays *= v
      f.pump *= v
      f.motor *= v
      f.blower *= v
    },
  },
  { item: 'equipmentCost', label: 'Equipment cost level (cost index)', unit: '-', get: (b) => b.general.targetIndex, set: (b, v) => { b.general.targetIndex = v } },
  { item: 'shellMaterialFactor', label: 'Shell and tray material cost', unit: '×', get: () => 1, set: (b, v) => {
    b.correlations.shell.materialFactor *= v
    b.correlations.trays.materialFactorConstant *= v
    b.correlations.trays.materialFactorSlope *= v
  } },
]

/**
 * Sensitivity (tornado): each cost-basis item changed by ±fraction (integer items rounded,
 * operating hours capped at 8760 h/yr, items whose base value is 0 left out), re-optimised
 * locally from the base optimum (ridge searches on its tray count and the neighbouring counts,
 * a short pattern search and one polish round; the spacing stays unless the pattern search
 * moves it).
 */
export function sensitivity(ev: Evaluator, basis: CostBasisData, box: Box, at: X, fraction: number): SensitivityEntry[] {
  const out: SensitivityEntry[] = []
  for (const it of sensitivityItems) {
    const base = it.get(basis)
    if (base === 0) continue
    const side = (sign: -1 | 1) => {
      let v = base * (1 + sign * fraction)
      if (it.integer) v = Math.max(1, Math.round(v))
      if (it.max !== undefined) v = Math.min(v, it.max)
      const b = structuredClone(basis)
      it.set(b, v)
      const p = refine(ev, b, box, { x: at, tac: ev.tac(at, b) }, true)
      return { value: v, tac: p.tac, recovery: toR(p.x.u), solventFactor: p.x.s }
    }
    out.push({ item: it.item, label: it.label, unit: it.unit, baseValue: base, low: side(-1), high: side(1) })
  }
  return out
}

export const toRecovery = toR
export const toLogRecovery = toU
export { costItemLabels }
