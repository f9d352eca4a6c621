/**
 * Site solvent allocation: several absorbers share one limited solvent supply. Each unit's
 * yearly variable cost as a function of its solvent flow is built from its design, linearised in
 * pieces, and a linear programme (javascript-lp-solver) splits the supply to minimise the site's
 * cost (or maximise the solute recovered).
 *
 * Per unit, at a fixed installed column (the design's trays × overall efficiency = N stages) and a
 * dilute, linear equilibrium, the Kremser equation gives the recovery at solvent flow L:
 *     A = L / (K V),  r(A) = (A^{N+1} − A) / (A^{N+1} − 1)   (r = N/(N+1) at A = 1)
 * with K V taken from the design's minimum solvent: L_min = K V r_design (pure solvent, pinch at
 * the rich end). Source of the Kremser form: reference key 'kremser1930' in
 * server/engine/references.ts.
 * Variable cost per year at flow q (m³/h): q·h·c_solvent + q·e_pump·h·c_el + (1 − r)·S·h·(v + c_em)
 * where S is the solute entering (kg/h), h the operating hours, e_pump the design pump electricity
 * per m³/h, v the product value and c_em the emission charge. Capital is spent and not part of the
 * split. The curves are convex in practice (r is concave in L); the LP uses each curve's lower convex
 * envelope and reports when a curve was not convex.
 */
import * as lp from 'javascript-lp-solver'
import type { AllocationObjective, AllocationSplit } from '../../../shared/schemas/allocation.ts'
import type { SolverAPI } from 'javascript-lp-solver'

// The package's types describe a CommonJS default; at run time the ES module's default is the solver.
const solver = ((lp as unknown as { default?: SolverAPI }).default ?? lp) as unknown as SolverAPI

export interface AllocationUnit {
  id: number
  name: string
  stages: number // N installed (trays × overall efficiency)
  KV: number // kmol/h, K·V of the unit
  m3PerKmol: number // solvent m³ per kmol
  soluteIn: number // kg/h entering with the gas
  hours: number // operating hours per year
  solventCost: number // per m³
  pumpElectricPerM3h: number // kW per (m³/h)
  electricityPrice: number // per kWh
  productValue: number // per kg
  emissionCharge: number // per kg
  minFlow: number // m³/h
  maxFlow: number // m³/h
  designFlow: number // m³/h (for reference)
}

export type { AllocationObjective }

/** Kremser fraction absorbed for absorption factor A and N stages (pure lean solvent). */
export function fractionAbsorbed(A: number, N: number): number {
  if (A <= 0) return 0
  if (Math.abs(A - 1) < 1e-9) return N / (N + 1)
  const AN1 = Math.pow(A, N + 1)
  if (!Number.isFinite(AN1)) return 1
  return (AN1 - A) / (AN1 - 1)
}

export function unitRecovery(u: AllocationUnit, q: number): number {
  const L = q / u.m3PerKmol
  return fractionAbsorbed(L / u.KV, u.stages)
}

/** Yearly variable cost of a unit at solvent flow q [m³/h]. */
export function unitCost(u: AllocationUnit, q: number): number {
  const r = unitRecovery(u, q)
  return q * u.hours * (u.solventCost + u.pumpElectricPerM3h * u.electricityPrice) + (1 - r) * u.soluteIn * u.hours * (u.productValue + u.emissionCharge)
}

/** Solute recovered per year at solvent flow q [kg/yr]. */
export function unitRecovered(u: AllocationUnit, q: number): number {
  return unitRecovery(u, q) * u.soluteIn * u.hours
}

interface Piece {
  width: number
  slope: number
}

/** Lower convex envelope of sampled points, as pieces of increasing slope. */
function convexPieces(xs: number[], ys: number[]): { pieces: Piece[]; convex: boolean } {
  const hull: number[] = []
  for (let i = 0; i < xs.length; i++) {
    while (hull.length >= 2) {
      const a = hull[hull.length - 2]!
      const b = hull[hull.length - 1]!
      const cross = (xs[b]! - xs[a]!) * (ys[i]! - ys[a]!) - (ys[b]! - ys[a]!) * (xs[i]! - xs[a]!)
      if (cross <= 0) hull.pop()
      else break
    }
    hull.push(i)
  }
  const pieces: Piece[] = []
  for (let k = 1; k < hull.length; k++) {
    const a = hull[k - 1]!
    const b = hull[k]!
    pieces.push({ width: xs[b]! - xs[a]!, slope: (ys[b]! - ys[a]!) / (xs[b]! - xs[a]!) })
  }
  return { pieces, convex: hull.length === xs.length }
}

/** The split of a limited supply (shared/schemas/allocation.ts). */
export type AllocationResult = AllocationSplit

const SEGMENTS = 80

function solveLp(units: AllocationUnit[], limit: number, objective: AllocationObjective) {
  const base = units.reduce((s, u) => s + u.minFlow, 0)
  const constraints: Record<string, { max?: number }> = { supply: { max: limit - base } }
  const variables: Record<string, Record<string, number>> = {}
  const pieceOf: { unit: number; key: string }[] = []
  const warnings: string[] = []
  units.forEach((u, i) => {
    const xs: number[] = []
    const ys: number[] = []
    for (let k = 0; k <= SEGMENTS; k++) {
      const q = u.minFlow + ((u.maxFlow - u.minFlow) * k) / SEGMENTS
      xs.push(q)
      ys.push(objective === 'minCost' ? unitCost(u, q) : -unitRecovered(u, q))
    }
    const { pieces, convex } = convexPieces(xs, ys)
    if (!convex) warnings.push(`${u.name}: the cost curve is not convex; its lower convex envelope was used.`)
    pieces.forEach((p, k) => {
      const key = `u${i}s${k}`
      constraints[key] = { max: p.width }
      variables[key] = { obj: p.slope, supply: 1, [key]: 1 }
      pieceOf.push({ unit: i, key })
    })
  })
  const model = { optimize: 'obj', opType: 'min' as const, constraints, variables }
  const out = solver.Solve(model) as unknown as Record<string, number | boolean>
  const flows = units.map((u) => u.minFlow)
  for (const p of pieceOf) {
    const v = out[p.key]
    if (typeof v === 'number') flows[p.unit]! += v
  }
  return { feasible: out.feasible === true, flows, warnings }
}

/** Split a solvent supply [m³/h] between units within their bounds. */
export function allocateSolvent(units: AllocationUnit[], supplyLimit: number, objective: AllocationObjective = 'minCost'): AllocationResult {
  const minTotal = units.reduce((s, u) => s + u.minFlow, 0)
  const warnings: string[] = []
  const curves = units.map((u) => ({
    id: u.id,
    points: Array.from({ length: 21 }, (_, k) => {
      const q = u.minFlow + ((u.maxFlow - u.minFlow) * k) / 20
      return { flow: q, cost: unitCost(u, q), recovery: unitRecovery(u, q) }
    }),
  }))
  if (minTotal > supplyLimit + 1e-9) {
    return {
      feasible: false, objective, supplyLimit, used: 0, units: [], totalCost: 0, totalRecovered: 0, shadowPrice: 0, curves,
      warnings: [`The units need at least ${minTotal.toFixed(2)} m³/h together, more than the ${supplyLimit} m³/h available.`],
    }
  }
  const main = solveLp(units, supplyLimit, objective)
  warnings.push(...main.warnings)
  const value = (flows: number[]) =>
    objective === 'minCost' ? flows.reduce((s, q, i) => s + unitCost(units[i]!, q), 0) : flows.reduce((s, q, i) => s + unitRecovered(units[i]!, q), 0)
  const used = main.flows.reduce((a, b) => a + b, 0)
  // Shadow price by a small increase of the supply (LP duals are not exposed by the solver).
  let shadowPrice = 0
  const maxTotal = units.reduce((s, u) => s + u.maxFlow, 0)
  if (used > supplyLimit - 1e-6 && supplyLimit < maxTotal) {
    const delta = Math.max(1e-3, supplyLimit * 1e-3)
    const more = solveLp(units, supplyLimit + delta, objective)
    const dv = value(more.flows) - value(main.flows)
    shadowPrice = objective === 'minCost' ? -dv / delta : dv / delta
  }
  const rows = units.map((u, i) => {
    const q = main.flows[i]!
    return { id: u.id, name: u.name, flow: q, recovery: unitRecovery(u, q), cost: unitCost(u, q), recovered: unitRecovered(u, q), minFlow: u.minFlow, maxFlow: u.maxFlow, designFlow: u.designFlow }
  })
  return {
    feasible: main.feasible,
    objective,
    supplyLimit,
    used,
    units: rows,
    totalCost: rows.reduce((s, r) => s + r.cost, 0),
    totalRecovered: rows.reduce((s, r) => s + r.recovered, 0),
    shadowPrice,
    curves,
    warnings,
  }
}

/** Brute force over a grid of flows (for verification on small cases). */
export function allocateBruteForce(units: AllocationUnit[], supplyLimit: number, objective: AllocationObjective, steps: number) {
  let best = { value: Infinity, flows: [] as number[] }
  const flows = new Array<number>(units.length).fill(0)
  const rec = (i: number, used: number) => {
    if (i === units.length) {
      const v = objective === 'minCost' ? flows.reduce((s, q, k) => s + unitCost(units[k]!, q), 0) : -flows.reduce((s, q, k) => s + unitRecovered(units[k]!, q), 0)
      if (v < best.value) best = { value: v, flows: flows.slice() }
      return
    }
    const u = units[i]!
    for (let k = 0; k <= steps; k++) {
      const q = u.minFlow + ((u.maxFlow - u.minFlow) * k) / steps
      if (used + q > supplyLimit + 1e-9) break
      flows[i] = q
      rec(i + 1, used + q)
    }
  }
  rec(0, 0)
  return { value: objective === 'minCost' ? best.value : -best.value, flows: best.flows }
}
