import { describe, it, expect } from 'vitest'
import { fractionAbsorbed, allocateSolvent, allocateBruteForce, unitCost, unitRecovered, type AllocationUnit } from '../../server/engine/allocation/solvent.ts'

// Kremser fraction absorbed: check values computed from the closed form (A^{N+1} − A)/(A^{N+1} − 1),
// derived from the formula (tag D).
describe('Kremser fraction absorbed (closed form)', () => {
  it.each([
    [1.4, 5, 0.93874],
    [1.0, 5, 0.833333],
    [2.0, 3, 0.933333],
    [0.8, 10, 0.781206],
  ])('A = %f, N = %i -> %f', (A, N, expected) => {
    expect(fractionAbsorbed(A, N)).toBeCloseTo(expected, 5)
  })
  it('tends to A for many stages when A < 1 and to 1 when A > 1 (limiting cases)', () => {
    expect(fractionAbsorbed(0.7, 200)).toBeCloseTo(0.7, 6)
    expect(fractionAbsorbed(1.3, 200)).toBeCloseTo(1, 6)
  })
})

// Invented units of the demo scenario, numbers plausible for such plants.
const unit = (id: number, o: Partial<AllocationUnit>): AllocationUnit => ({
  id, name: `Unit ${id}`, stages: 8, KV: 250, m3PerKmol: 0.0181, soluteIn: 250, hours: 8000, solventCost: 0.4,
  pumpElectricPerM3h: 0.08, electricityPrice: 0.12, productValue: 0.7, emissionCharge: 0, minFlow: 3, maxFlow: 12, designFlow: 6, ...o,
})

const cases: { name: string; units: AllocationUnit[]; limit: number }[] = [
  { name: 'two units, tight supply', units: [unit(1, {}), unit(2, { KV: 120, soluteIn: 90, stages: 6, minFlow: 1.5, maxFlow: 6 })], limit: 9 },
  { name: 'three units, one with an emission charge', units: [unit(1, {}), unit(2, { KV: 120, soluteIn: 90, stages: 6, minFlow: 1.5, maxFlow: 6 }), unit(3, { KV: 300, soluteIn: 400, emissionCharge: 0.5, stages: 10, minFlow: 4, maxFlow: 14 })], limit: 20 },
  { name: 'ample supply (limit does not bind)', units: [unit(1, {}), unit(2, { KV: 120, soluteIn: 90, stages: 6, minFlow: 1.5, maxFlow: 6 })], limit: 40 },
]

describe('solvent allocation LP against brute force', () => {
  for (const c of cases) {
    it(c.name, () => {
      const lp = allocateSolvent(c.units, c.limit, 'minCost')
      expect(lp.feasible).toBe(true)
      expect(lp.used).toBeLessThanOrEqual(c.limit + 1e-6)
      lp.units.forEach((u, i) => {
        expect(u.flow).toBeGreaterThanOrEqual(c.units[i]!.minFlow - 1e-9)
        expect(u.flow).toBeLessThanOrEqual(c.units[i]!.maxFlow + 1e-9)
      })
      const bf = allocateBruteForce(c.units, c.limit, 'minCost', c.units.length === 2 ? 400 : 60)
      const lpCost = lp.units.reduce((s, u, i) => s + unitCost(c.units[i]!, u.flow), 0)
      // The LP works on 80 linear pieces per curve; its split, priced exactly, is no worse than the
      // grid optimum by more than 0.1 % (it may be better: the grid is coarser than the LP's pieces).
      expect(lpCost).toBeLessThanOrEqual(bf.value * 1.001)
      // With two units the grid is fine (400 steps per unit), so the two must agree closely.
      if (c.units.length === 2) expect(lpCost).toBeGreaterThanOrEqual(bf.value * 0.999)
    })
  }

  it('maximising recovered solute also matches brute force', () => {
    const c = cases[1]!
    const lp = allocateSolvent(c.units, c.limit, 'maxRecovered')
    const bf = allocateBruteForce(c.units, c.limit, 'maxRecovered', 60)
    const got = lp.units.reduce((s, u, i) => s + unitRecovered(c.units[i]!, u.flow), 0)
    expect(got).toBeGreaterThanOrEqual(bf.value * 0.999)
    expect(lp.used).toBeCloseTo(c.limit, 6) // more solvent always recovers more
  })

  it('the shadow price is positive when the supply binds and zero when it does not', () => {
    const tight = allocateSolvent(cases[0]!.units, cases[0]!.limit, 'minCost')
    expect(tight.shadowPrice).toBeGreaterThan(0)
    const ample = allocateSolvent(cases[2]!.units, cases[2]!.limit, 'minCost')
    expect(ample.shadowPrice).toBe(0)
  })

  it('says so when the units need more than the supply', () => {
    const r = allocateSolvent(cases[0]!.units, 2, 'minCost')
    expect(r.feasible).toBe(false)
    expect(r.warnings[0]).toMatch(/at least/)
  })
})
