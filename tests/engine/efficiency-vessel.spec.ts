import { describe, expect, it } from 'vitest'
import { actualTrays, efficiencyOConnell, oconnellGroup, LB_PER_FT3 } from '../../server/engine/efficiency/oconnell.ts'
import { shellMass, shellThicknessThinWall, minimumThickness, DEFAULT_MIN_THICKNESS } from '../../server/engine/vessel/shell.ts'
import type { EngineWarning } from '../../server/engine/contract.ts'
import { expectPublished } from './published.ts'

describe("O'Connell absorber efficiency", () => {
  const src = "O'Connell absorber fit (Seader & Henley form; formula M), check value derived from the formula (D)"
  it('EtOH-water at 30 degC: K 0.57, M 18.02, mu 0.797 cP, rho 62.18 lb/ft3 -> group 0.13166, E_o = 50.4 %', () => {
    const rho = 62.18 * LB_PER_FT3
    expectPublished({ source: src, where: 'group', expected: 0.13166, tolerance: 1e-5 }, oconnellGroup(0.57, 0.01802, 0.797e-3, rho))
    expectPublished({ source: src, where: 'E_o', expected: 0.504, tolerance: 0.0005 }, efficiencyOConnell(0.57, 0.01802, 0.797e-3, rho))
  })
  it('efficiency falls as the group rises (less soluble solute)', () => {
    const e1 = efficiencyOConnell(0.3, 0.018, 0.0008, 995)
    const e2 = efficiencyOConnell(3, 0.018, 0.0008, 995)
    expect(e1).toBeGreaterThan(e2)
  })
  it('outside the chart range gives a warning, not a clamp', () => {
    const w: EngineWarning[] = []
    const e = efficiencyOConnell(500, 0.018, 0.0008, 995, w)
    expect(w[0]?.code).toBe('outsideValidity')
    expect(e).toBeGreaterThan(0)
  })
  it('actual trays = ceil(N/E)', () => {
    expect(actualTrays(10.15, 0.5)).toBe(21)
    expect(actualTrays(10, 0.5)).toBe(20)
    expect(actualTrays(0.1, 0.9)).toBe(1)
  })
})

describe('preliminary vessel', () => {
  it('thin-wall thickness: P 1.5 MPa, D 600 mm, S 138 MPa, E 1, CA 3 mm -> 6.28 mm (ASME VIII-1 UG-27; calculatorcollection.org, C)', () => {
    expectPublished(
      { source: 'ASME VIII-1 UG-27 check, calculatorcollection.org pressure-vessel calculator (C)', where: 't', expected: 6.28, tolerance: 0.005 },
      1000 * shellThicknessThinWall(1.5e6, 0.3, 138e6, 1, 0.003),
    )
  })
  it('minimum thickness by diameter (Sinnott, from memory) and shell mass scale', () => {
    expect(minimumThickness(DEFAULT_MIN_THICKNESS, 0.8)).toBe(0.005)
    expect(minimumThickness(DEFAULT_MIN_THICKNESS, 1.45)).toBe(0.007)
    // cylinder only, by hand: pi (D + t) L t rho
    const m = shellMass(1, 10, 0.01, 7850)
    const cyl = Math.PI * 1.01 * 10 * 0.01 * 7850
    expect(m).toBeGreaterThan(cyl)
    expect(m - cyl).toBeCloseTo(7850 * 0.01 * 2 * 1.084 * 1.01 ** 2, 6)
  })
})
