/**
 * Integer trays cut the TAC surface into cells; these push a point to its cell edge: the
 * bisection polish, the recovery at which a tray count is just enough, and the ridge search
 * along the solvent factor at a fixed tray count. See ./core.ts for the method.
 */
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import { totalAnnualCost } from '../costing/costDesign.ts'
import { sameCell, type Box, type Evaluator, type X } from './evaluator.ts'

/**
 * Push each continuous variable to the edge of the current (trays, diameter) cell along the
 * direction that lowers the TAC, by bisection; keep the move when it lowers the TAC.
 */
export function polishEdges(ev: Evaluator, basis: CostBasisData, box: Box, start: X, rounds: number): { x: X; tac: number } {
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
export function edgeU(ev: Evaluator, x: X, trays: number, box: Box): number | null {
  const hit = ev.edges.get(x.t, x.f, x.s, trays)
  if (hit !== undefined) return hit
  const u = edgeUSolve(ev, x, trays, box)
  ev.edges.set(x.t, x.f, x.s, trays, u)
  return u
}

export function edgeUSolve(ev: Evaluator, x: X, trays: number, box: Box): number | null {
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
export function ridgeSearch(ev: Evaluator, basis: CostBasisData, box: Box, at: X, trays: number): { x: X; tac: number } | null {
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
