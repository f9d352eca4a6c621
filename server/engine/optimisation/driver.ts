/**
 * Optimisation driver (any design function): bounds, search, curves, sensitivity; and the
 * brute-force grid it is verified against. See ./core.ts for the method and the treatment of
 * integer trays.
 */
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import type { SearchSpec } from '../../../shared/schemas/search.ts'
import type { CaseSI } from '../case.ts'
import { InfeasibleDesignError } from '../errors.ts'
import { boundHits } from './bounds.ts'
import {
  Evaluator,
  curve,
  searchOptimum,
  sensitivity,
  toLogRecovery,
  toRecovery,
  type DesignFn,
  type OptimiseResult,
} from './core.ts'

const COST_CAUTION =
  'Costs are study estimates from published correlations (typically ±30 % or wider) escalated by a cost index; confirm with vendor quotations before committing funds.'

/** Solute entering with the gas, kg/h. */
export function soluteInKgPerHour(c: CaseSI): number {
  return c.gas.flow * c.gas.soluteMoleFraction * c.solute.molarMass * 3600
}

/** Recovery bounds after the emission limit: r >= 1 - limit / solute in. */
export function recoveryBounds(search: SearchSpec, soluteIn: number): [number, number] {
  let lo = search.recovery.min
  const hi = search.recovery.max
  if (search.emissionLimit !== undefined && soluteIn > 0) {
    lo = Math.max(lo, 1 - search.emissionLimit / soluteIn)
  }
  if (lo > hi) {
    throw new InfeasibleDesignError([
      {
        path: 'search.emissionLimit',
        code: 'emissionLimitUnreachable',
        message: `The emission limit needs a recovery of at least ${lo.toFixed(5)}, above the largest recovery searched (${hi}).`,
      },
    ])
  }
  return [lo, hi]
}

export interface OptimiseOptions {
  /** Coarse grid points in (recovery, solvent factor, fraction of flood); default [5, 4, 3]. */
  grid?: [number, number, number]
  /** Pattern-search starts from the best tray counts of the grid (plus one per spacing); default 2. */
  starts?: number
}

/** Optimise with any design function (the engine, or a stand-in in tests). */
export function optimiseWith(
  design: DesignFn,
  soluteIn: number,
  basis: CostBasisData,
  search: SearchSpec,
  options: OptimiseOptions = {},
): OptimiseResult {
  const [rLo, rHi] = recoveryBounds(search, soluteIn)
  const ev = new Evaluator(design, search, rLo, rHi)
  const t0 = performance.now()
  const found = searchOptimum(ev, basis, options)
  const searchEvaluations = ev.designEvaluations
  const t1 = performance.now()

  const best = ev.evaluate(found.x, basis)
  if (!best.feasible || !best.design || !best.cost) throw new Error('optimum lost its design')
  const d = ev.resultAt(found.x)
  const n = search.curvePoints
  const rValues: number[] = []
  for (let i = 0; i < n; i++) rValues.push(rLo + ((rHi - rLo) * i) / (n - 1))
  const sValues: number[] = []
  for (let i = 0; i < n; i++) sValues.push(search.solventFactor.min + ((search.solventFactor.max - search.solventFactor.min) * i) / (n - 1))
  const curves = {
    recovery: curve(ev, basis, found.x, 'u', rValues),
    solventFactor: curve(ev, basis, found.x, 's', sValues),
  }
  const curveEvaluations = ev.designEvaluations - searchEvaluations
  const t2 = performance.now()
  const sens = search.sensitivity ? sensitivity(ev, basis, found.box, found.x, search.sensitivityFraction) : []
  const sensitivityEvaluations = ev.designEvaluations - searchEvaluations - curveEvaluations
  const t3 = performance.now()

  let feasibleCount = 0
  for (const v of ev.raw.values()) if (typeof v !== 'string' && v.reject === null) feasibleCount++

  const traySpacing = search.traySpacings[found.x.t] ?? d.summary.traySpacing
  return {
    optimum: {
      recovery: toRecovery(found.x.u),
      solventFactor: found.x.s,
      traySpacing,
      floodFraction: found.x.f,
      actualTrays: d.summary.actualTrays,
      selectedDiameter: d.summary.selectedDiameter,
      totalAnnualCost: best.tac,
      breakdown: best.cost,
      design: d,
    },
    evaluations: ev.designEvaluations,
    bounds: {
      recovery: [rLo, rHi],
      solventFactor: [search.solventFactor.min, search.solventFactor.max],
      floodFraction: [search.floodFraction.min, search.floodFraction.max],
      traySpacings: [...search.traySpacings],
    },
    curves,
    sensitivity: sens,
    boundHits: boundHits({ recovery: toRecovery(found.x.u), solventFactor: found.x.s, floodFraction: found.x.f, traySpacing }, search, [rLo, rHi]),
    stats: {
      searchEvaluations,
      curveEvaluations,
      sensitivityEvaluations,
      feasibleFraction: ev.raw.size > 0 ? feasibleCount / ev.raw.size : 0,
      ms: { search: t1 - t0, curves: t2 - t1, sensitivity: t3 - t2 },
    },
    // The design already carries the preliminary-vessel and hazard cautions.
    cautions: [...new Set([COST_CAUTION, ...d.cautions])],
  }
}

export interface BruteForceResolution {
  recovery: number
  solventFactor: number
  floodFraction: number
}

export interface BruteForceResult {
  best: { recovery: number; solventFactor: number; floodFraction: number; traySpacing: number; totalAnnualCost: number; actualTrays: number; selectedDiameter: number } | null
  evaluations: number
  feasible: number
}

/** Dense grid over the same variables (recovery uniform in r), for verification. */
export function bruteForceWith(
  design: DesignFn,
  soluteIn: number,
  basis: CostBasisData,
  search: SearchSpec,
  res: BruteForceResolution,
): BruteForceResult {
  const [rLo, rHi] = recoveryBounds(search, soluteIn)
  const ev = new Evaluator(design, search, rLo, rHi)
  const grid = (a: number, b: number, n: number) => (n <= 1 || a === b ? [a] : Array.from({ length: n }, (_, i) => a + ((b - a) * i) / (n - 1)))
  const rs = grid(rLo, rHi, res.recovery)
  const ss = grid(search.solventFactor.min, search.solventFactor.max, res.solventFactor)
  const fs = grid(search.floodFraction.min, search.floodFraction.max, res.floodFraction)
  let best: BruteForceResult['best'] = null
  let feasible = 0
  for (let t = 0; t < search.traySpacings.length; t++)
    for (const r of rs)
      for (const s of ss)
        for (const f of fs) {
          const e = ev.evaluate({ u: toLogRecovery(r), s, f, t }, basis)
          if (!e.feasible || !e.design) continue
          feasible++
          if (!best || e.tac < best.totalAnnualCost) {
            best = {
              recovery: r,
              solventFactor: s,
              floodFraction: f,
              traySpacing: search.traySpacings[t] ?? 0,
              totalAnnualCost: e.tac,
              actualTrays: e.design.summary.actualTrays,
              selectedDiameter: e.design.summary.selectedDiameter,
            }
          }
        }
  return { best, evaluations: ev.designEvaluations, feasible }
}

