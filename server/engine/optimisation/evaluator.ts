/**
 * The optimiser's evaluation context and shared types: points of the search space, the design
 * cache, feasibility (checks and limits) and pricing. See ./core.ts for the method.
 */
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import type { SearchSpec } from '../../../shared/schemas/search.ts'
import type { DesignResult, DesignSummary, DesignVariables } from '../contract.ts'
import { costDesign, totalAnnualCost, type CostBreakdown, type CostItemKey } from '../costing/costDesign.ts'
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
  /** the values actually used for the two bars (after rounding or a cap) */
  lowValue: number
  highValue: number
  /** the relative changes actually applied, e.g. -0.2 and +0.043 */
  lowChange: number
  highChange: number
  /** true when the value used differs from base x (1 -/+ fraction): rounded or capped */
  lowLimited: boolean
  highLimited: boolean
  /** the value used in words, and why it was limited when it was */
  lowNote: string
  highNote: string
  /** tac: re-optimised; repricedTac: the base optimum's design priced at the changed value */
  low: { value: number; tac: number; repricedTac: number; recovery: number; solventFactor: number }
  high: { value: number; tac: number; repricedTac: number; recovery: number; solventFactor: number }
}

/** The optimum on a bound of the search: which variable, which bound, and what to do. */
export interface BoundHit {
  variable: 'recovery' | 'solventFactor' | 'floodFraction' | 'traySpacing'
  bound: 'lower' | 'upper'
  value: number
  advice: string
}

export interface OptimiseResult {
  optimum: OptimumPoint
  evaluations: number
  bounds: { recovery: [number, number]; solventFactor: [number, number]; floodFraction: [number, number]; traySpacings: number[] }
  curves: { recovery: CurvePoint[]; solventFactor: CurvePoint[] }
  sensitivity: SensitivityEntry[]
  /** variables of the optimum that sit on a search bound (empty when none) */
  boundHits: BoundHit[]
  stats: { searchEvaluations: number; curveEvaluations: number; sensitivityEvaluations: number; feasibleFraction: number; ms: { search: number; curves: number; sensitivity: number } }
  cautions: string[]
}

/** A point of the search space: u = -ln(1 - recovery). */
export interface X {
  u: number
  s: number
  f: number
  t: number // index into traySpacings
}

/**
 * What the search keeps of one design: its summary and, when its checks or the search limits
 * refuse it, why. The evaluator keeps thousands of them: the whole result (checks, warnings,
 * profile) held that long makes the garbage collector copy it again and again.
 */
export interface PointDesign {
  summary: DesignSummary
  /** null when the design passes the checks and the search limits */
  reject: string | null
}

export interface Eval {
  feasible: boolean
  tac: number
  design?: PointDesign
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

export const toU = (r: number) => -Math.log(1 - r)
export const toR = (u: number) => -Math.expm1(-u)

/**
 * A map keyed by four numbers, as maps inside maps: a key made of the numbers as a string costs
 * more than the lean design it looks up (four number-to-text conversions per lookup).
 */
export class NumberKeyMap4<V> {
  private readonly root = new Map<number, Map<number, Map<number, Map<number, V>>>>()
  size = 0
  get(a: number, b: number, c: number, d: number): V | undefined {
    return this.root.get(a)?.get(b)?.get(c)?.get(d)
  }
  set(a: number, b: number, c: number, d: number, v: V): void {
    let mb = this.root.get(a)
    if (!mb) this.root.set(a, (mb = new Map()))
    let mc = mb.get(b)
    if (!mc) mb.set(b, (mc = new Map()))
    let md = mc.get(c)
    if (!md) mc.set(c, (md = new Map()))
    if (!md.has(d)) this.size++
    md.set(d, v)
  }
  *values(): IterableIterator<V> {
    for (const mb of this.root.values()) for (const mc of mb.values()) for (const md of mc.values()) yield* md.values()
  }
}

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
  /** Designs by (spacing index, fraction of flood, solvent factor, u). */
  readonly raw = new NumberKeyMap4<PointDesign | string>()
  /** Cell edges already solved: (spacing, flood, solvent factor, trays) -> u or null. */
  readonly edges = new NumberKeyMap4<number | null>()
  /** The design for these variables (cached) whatever its checks say, or why the engine refused it. */
  rawAt(x: X): PointDesign | string {
    const hit = this.raw.get(x.t, x.f, x.s, x.u)
    if (hit !== undefined) return hit
    let out: PointDesign | string
    this.designEvaluations++
    try {
      const d = this.design(this.vars(x))
      out = { summary: d.summary, reject: this.rejects(d) }
    } catch (e) {
      if (isEngineError(e)) out = e.message || e.code
      else throw e
    }
    this.raw.set(x.t, x.f, x.s, x.u, out)
    return out
  }
  /** A feasible design for these variables, or the reason it is infeasible. */
  designAt(x: X): PointDesign | string {
    const d = this.rawAt(x)
    if (typeof d === 'string') return d
    return d.reject ?? d
  }
  /** The whole design result at a point (computed again: the cache keeps the summaries only). */
  resultAt(x: X): DesignResult {
    return this.design(this.vars(x))
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

export function linspace(a: number, b: number, n: number): number[] {
  if (n <= 1) return [(a + b) / 2]
  const out: number[] = []
  for (let i = 0; i < n; i++) out.push(a + ((b - a) * i) / (n - 1))
  return out
}

export const sameCell = (a: PointDesign, b: PointDesign) =>
  a.summary.actualTrays === b.summary.actualTrays && a.summary.selectedDiameter === b.summary.selectedDiameter

export interface Box {
  u: [number, number]
  s: [number, number]
  f: [number, number]
}
