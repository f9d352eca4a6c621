/**
 * Optimiser checks. The outside reference for the optimum is an exhaustive search: a dense
 * brute-force grid over the same variables (61 recoveries × 31 solvent factors × 11 fractions of
 * flood × every spacing), run on the same design engine and cost model. The optimiser must reach
 * the grid's TAC to within 0.1 % (it may do better: it is not tied to grid points) with at least
 * 50 times fewer design evaluations.
 * The cases are the product's own invented demo cases (Halvard Process Holdings sites).
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { fromSI } from '../../shared/units.ts'
import { caseToSI, InfeasibleDesignError } from '../../server/engine/index.ts'
import type { CaseSI } from '../../server/engine/case.ts'
import { designSI } from '../../server/engine/design.ts'
import { loadPreset } from '../../server/engine/costing/presets.ts'
import { costDesign } from '../../server/engine/costing/costDesign.ts'
import { bruteForce, optimise } from '../../server/engine/optimisation/optimise.ts'
import { soluteInKgPerHour } from '../../server/engine/optimisation/driver.ts'
import type { OptimiseResult } from '../../server/engine/optimisation/core.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import { searchSpecSchema, type SearchSpecInput } from '../../shared/schemas/search.ts'

const root = new URL('../../', import.meta.url)
const readJson = (p: string) => JSON.parse(readFileSync(new URL(p, root), 'utf8')) as Record<string, unknown>

const example = readJson('data/examples/optimize.json') as { case: Record<string, unknown>; search: SearchSpecInput }
const acetone = readJson('data/examples/design-acetone.json')
/** Cobalt Ridge with Henry's-law equilibrium from the library and the default tray layout: at
 * high fractions of flood the entrainment check fails, which cuts the feasible region. */
const cobaltHenry = {
  gas: { flow: 420, temperature: 32, pressure: 108, soluteMoleFraction: 0.012, carrier: 'carbon dioxide' },
  solute: 'ethanol',
  solvent: { name: 'water', temperature: 15 },
  equilibrium: { model: 'henry' },
  recovery: 0.98,
  solventFactor: 1.5,
}

const GRID = { recovery: 61, solventFactor: 31, floodFraction: 11 }

function compare(c: CaseSI, basis: CostBasisData, searchIn: SearchSpecInput) {
  const search = searchSpecSchema.parse({ ...searchIn, sensitivity: false })
  const opt = optimise(c, basis, search)
  const grid = bruteForce(c, basis, search, GRID)
  return { opt, grid, search }
}

function expectAgreement(opt: OptimiseResult, grid: ReturnType<typeof bruteForce>) {
  expect(grid.best).not.toBeNull()
  const best = grid.best!
  // within 0.1 % of the exhaustive grid, or better
  expect(opt.optimum.totalAnnualCost).toBeLessThanOrEqual(best.totalAnnualCost * 1.001)
  // at least 50 times fewer design evaluations (search and curves; sensitivity is separate)
  expect(grid.evaluations / (opt.stats.searchEvaluations + opt.stats.curveEvaluations)).toBeGreaterThanOrEqual(50)
  // the optimum is a feasible design: no failed check, inside the limits
  expect(opt.optimum.design.checks.every((k) => k.status !== 'fail')).toBe(true)
}

describe('optimiser against a dense brute-force grid (exhaustive search)', { timeout: 120_000 }, () => {
  it('Cobalt Ridge example: optimum on the upper bound of the fraction of flood', () => {
    const c = caseToSI({ recovery: 0.95, solventFactor: 1.5, ...example.case })
    const { opt, grid, search } = compare(c, loadPreset('halvard-cobalt-ridge'), example.search)
    expectAgreement(opt, grid)
    expect(grid.best?.floodFraction).toBeCloseTo(search.floodFraction.max, 12)
    expect(opt.optimum.floodFraction).toBeCloseTo(search.floodFraction.max, 6)
    expect(opt.optimum.selectedDiameter).toBeLessThanOrEqual(search.maxDiameter)
    expect(opt.optimum.design.summary.columnHeight).toBeLessThanOrEqual(search.maxHeight)
  })

  it('Cobalt Ridge with Henry equilibrium: the entrainment check cuts the feasible region', () => {
    const c = caseToSI(cobaltHenry)
    const { opt, grid } = compare(c, loadPreset('halvard-cobalt-ridge'), { recovery: { min: 0.9, max: 0.999 } })
    expectAgreement(opt, grid)
    // most of the grid is infeasible, and the optimum's fraction of flood sits below the upper bound
    expect(grid.feasible).toBeLessThan(0.5 * grid.evaluations)
    expect(opt.optimum.floodFraction).toBeLessThan(0.85)
    // pushing the fraction of flood to the bound at the optimum fails a tray check
    const o = opt.optimum
    const atBound = designSI(c, { recovery: o.recovery, solventFactor: o.solventFactor, traySpacing: o.traySpacing, floodFraction: 0.85 })
    expect(atBound.checks.some((k) => k.status === 'fail')).toBe(true)
  })

  it('no value on the product and no emission charge: the optimum sits on the lowest recovery', () => {
    const c = caseToSI({ recovery: 0.95, solventFactor: 1.5, ...example.case })
    const basis = loadPreset('halvard-cobalt-ridge')
    basis.utilities.productValue = 0
    const { opt, grid } = compare(c, basis, { ...example.search, traySpacings: [0.5, 0.6] })
    expectAgreement(opt, grid)
    expect(opt.optimum.recovery).toBeCloseTo(0.9, 9)
    expect(grid.best?.recovery).toBeCloseTo(0.9, 9)
  })

  it('Marrow Bay acetone with an emission limit of 1 kg/h: the recovery floor 1 − limit / solute in binds', () => {
    const c = caseToSI(acetone)
    const { opt, grid } = compare(c, loadPreset('halvard-marrow-bay'), { emissionLimit: 1, maxDiameter: 5 })
    expectAgreement(opt, grid)
    const floor = 1 - 1 / soluteInKgPerHour(c)
    expect(opt.bounds.recovery[0]).toBeCloseTo(floor, 12)
    expect(opt.optimum.recovery).toBeGreaterThanOrEqual(floor)
    expect(fromSI('massFlow', opt.optimum.design.summary.soluteLost, 'kg/h')).toBeLessThanOrEqual(1 + 1e-6) // the summary is SI (kg/s)
    // without the limit the lowest-cost design releases more than 1 kg/h
    const free = optimise(c, loadPreset('halvard-marrow-bay'), searchSpecSchema.parse({ maxDiameter: 5, sensitivity: false }))
    expect(fromSI('massFlow', free.optimum.design.summary.soluteLost, 'kg/h')).toBeGreaterThan(1)
  })
})

describe('optimiser constraints and output', { timeout: 60_000 }, () => {
  const c = caseToSI({ recovery: 0.95, solventFactor: 1.5, ...example.case })
  const basis = loadPreset('halvard-cobalt-ridge')

  it('an emission limit that no recovery in the bounds meets is an infeasible design', () => {
    const search = searchSpecSchema.parse({ emissionLimit: 0.01, recovery: { min: 0.9, max: 0.99 }, sensitivity: false })
    expect(() => optimise(c, basis, search)).toThrow(InfeasibleDesignError)
  })

  it("with warnings not accepted, no check of the optimum is 'warn' or 'fail'", () => {
    const search = searchSpecSchema.parse({ ...example.search, allowWarnings: false, sensitivity: false })
    const r = optimise(c, basis, search)
    expect(r.optimum.design.checks.every((k) => k.status === 'pass')).toBe(true)
  })

  it('diameter and height limits hold at the optimum', () => {
    const search = searchSpecSchema.parse({ ...example.search, maxHeight: 6.5, sensitivity: false })
    const r = optimise(c, basis, search)
    expect(r.optimum.design.summary.columnHeight).toBeLessThanOrEqual(6.5)
  })

  it('the optimum is no worse than any feasible point of its own cost curves, and TAC = sum of items', () => {
    const search = searchSpecSchema.parse({ ...example.search, sensitivity: false, curvePoints: 21 })
    const r = optimise(c, basis, search)
    expect(r.curves.recovery).toHaveLength(21)
    expect(r.curves.solventFactor).toHaveLength(21)
    for (const p of [...r.curves.recovery, ...r.curves.solventFactor]) {
      if (p.feasible && p.tac !== null) expect(p.tac).toBeGreaterThanOrEqual(r.optimum.totalAnnualCost * (1 - 1e-12))
      else expect(p.tac).toBeNull()
    }
    const b = r.optimum.breakdown
    expect(Object.values(b.annual).reduce((a, v) => a + v, 0)).toBeCloseTo(b.totalAnnualCost, 6)
    // the returned design reproduces the returned cost
    expect(costDesign(r.optimum.design.summary, basis).totalAnnualCost).toBeCloseTo(r.optimum.totalAnnualCost, 6)
    expect(r.cautions.some((s) => /licensed engineer/.test(s))).toBe(true)
  })
})

describe('sensitivity of the optimum to the cost basis (economic reasoning)', { timeout: 60_000 }, () => {
  const c = caseToSI({ recovery: 0.95, solventFactor: 1.5, ...example.case })
  const basis = loadPreset('halvard-cobalt-ridge')
  const r = optimise(c, basis, searchSpecSchema.parse({ ...example.search, sensitivity: true }))
  const item = (k: string) => {
    const e = r.sensitivity.find((s) => s.item === k)
    expect(e).toBeDefined()
    return e!
  }
  const base = r.optimum.totalAnnualCost

  it('dearer electricity raises the TAC, cheaper lowers it (every design costs more at a higher price)', () => {
    const e = item('electricityPrice')
    expect(e.high.tac).toBeGreaterThan(base)
    expect(e.low.tac).toBeLessThan(base)
    expect(e.low.value).toBeCloseTo(0.8 * basis.utilities.electricityPrice, 12)
  })
  it('a higher product value never lowers the optimal recovery', () => {
    const e = item('productValue')
    expect(e.high.recovery).toBeGreaterThanOrEqual(r.optimum.recovery - 1e-12)
    expect(e.low.recovery).toBeLessThanOrEqual(r.optimum.recovery + 1e-12)
    expect(e.high.tac).toBeGreaterThan(e.low.tac)
  })
  it('higher interest, costlier equipment or installation raise the TAC; a longer life lowers it', () => {
    expect(item('interestRate').high.tac).toBeGreaterThan(item('interestRate').low.tac)
    expect(item('equipmentCost').high.tac).toBeGreaterThan(item('equipmentCost').low.tac)
    expect(item('installationFactors').high.tac).toBeGreaterThan(item('installationFactors').low.tac)
    expect(item('economicLife').high.tac).toBeLessThan(item('economicLife').low.tac)
    expect(Number.isInteger(item('economicLife').high.value)).toBe(true)
  })
  it('a product worth 16 times more is recovered more completely (full re-optimisation)', () => {
    const lo = loadPreset('halvard-cobalt-ridge')
    lo.utilities.productValue *= 0.25
    const hi = loadPreset('halvard-cobalt-ridge')
    hi.utilities.productValue *= 4
    const s = searchSpecSchema.parse({ ...example.search, sensitivity: false })
    expect(optimise(c, hi, s).optimum.recovery).toBeGreaterThan(optimise(c, lo, s).optimum.recovery)
  })
})
