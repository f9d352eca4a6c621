import { describe, expect, it } from 'vitest'
import { henryAtT, kFromHenry, LinearEquilibrium, MargulesRaoultEquilibrium, TableEquilibrium, validateTable } from '../../server/engine/equilibrium/models.ts'
import { densityWater } from '../../server/engine/properties/water.ts'
import { expectPublished } from './published.ts'

const SRC = "Sander compilation H values + K = c_w/(H^cp P) (derived values, D)"
const Mw = 0.018015
function K(H0: number, B: number, tC: number, P: number): number {
  const T = 273.15 + tC
  return kFromHenry(henryAtT(H0, B, T), densityWater(T) / Mw, P)
}

describe("Henry's law -> K at column T and P", () => {
  it('ethanol at 25 degC, 101.325 kPa: K = 0.2875 (H^px = 29.13 kPa)', () => {
    expectPublished({ source: SRC, where: 'ethanol 25 C', expected: 0.2875, tolerance: 0.00005 }, kFromHenry(1.9, 55344, 101325))
    expectPublished({ source: SRC, where: 'ethanol 25 C, water density from Kell', expected: 0.2875, tolerance: 0.0001 }, K(1.9, 6400, 25, 101325))
  })
  it('ethanol at 20 degC: H^cp = 2.740, K = 0.1996', () => {
    expectPublished({ source: SRC, where: 'H ethanol 20 C', expected: 2.74, tolerance: 0.0005 }, henryAtT(1.9, 6400, 293.15))
    expectPublished({ source: SRC, where: 'K ethanol 20 C', expected: 0.1996, tolerance: 0.0001 }, K(1.9, 6400, 20, 101325))
  })
  it('acetone, ammonia at 25 degC, 101.325 kPa and at 30 degC, 110 kPa', () => {
    expectPublished({ source: SRC, where: 'acetone 25 C', expected: 2.023, tolerance: 0.001 }, K(0.27, 5500, 25, 101325))
    expectPublished({ source: SRC, where: 'ammonia 25 C', expected: 0.9258, tolerance: 0.0005 }, K(0.59, 4200, 25, 101325))
    expectPublished({ source: SRC, where: 'ethanol 30 C 110 kPa', expected: 0.3768, tolerance: 0.0002 }, K(1.9, 6400, 30, 110000))
    expectPublished({ source: SRC, where: 'acetone 30 C 110 kPa', expected: 2.523, tolerance: 0.002 }, K(0.27, 5500, 30, 110000))
    expectPublished({ source: SRC, where: 'ammonia 30 C 110 kPa', expected: 1.074, tolerance: 0.001 }, K(0.59, 4200, 30, 110000))
    expectPublished({ source: SRC + ' (methanol H from memory)', where: 'methanol 25 C (H = 2.0-2.2)', expected: 0.2731, tolerance: 0.03 }, K(2.0, 5200, 25, 101325))
  })
})

describe('x-y tables: validation and monotone interpolation', () => {
  it('rejects unsorted, duplicate, out-of-range and non-increasing data', () => {
    expect(validateTable([0, 0.1], [0, 0.2])).toBeNull()
    expect(validateTable([0.1, 0.05], [0.1, 0.2])?.reason).toMatch(/sorted/)
    expect(validateTable([0, 0.1, 0.1], [0, 0.1, 0.2])?.reason).toMatch(/duplicate/)
    expect(validateTable([0, 1.0], [0, 0.5])?.reason).toMatch(/\[0, 1\)/)
    expect(validateTable([0, 0.1, 0.2], [0, 0.1, 0.1])?.reason).toMatch(/increase/)
    expect(validateTable([0], [0])?.reason).toMatch(/at least 2/)
    expect(validateTable([0, -0.1], [0, 0.1])?.index).toBe(1)
  })
  it('passes through the points, never overshoots, and inverts exactly', () => {
    const xs = [0, 0.02, 0.05, 0.1, 0.2, 0.3]
    const ys = [0, 0.01, 0.012, 0.05, 0.2, 0.21] // deliberately uneven
    const t = new TableEquilibrium(xs, ys)
    for (let i = 0; i < xs.length; i++) expect(t.y(xs[i]!)).toBeCloseTo(ys[i]!, 14)
    let prev = -1
    for (let x = 0; x <= 0.3; x += 0.0005) {
      const y = t.y(x)
      expect(y).toBeGreaterThanOrEqual(prev - 1e-15) // monotone
      prev = y
      expect(t.x(y)).toBeCloseTo(x, 9)
    }
    // no overshoot inside a segment
    for (let x = 0.02; x <= 0.05; x += 0.001) expect(t.y(x)).toBeLessThanOrEqual(0.012 + 1e-15)
  })
  it('a linear table reproduces y = K x', () => {
    const t = new TableEquilibrium([0, 0.1, 0.2, 0.3], [0, 0.05, 0.1, 0.15])
    expect(t.y(0.137)).toBeCloseTo(0.0685, 14)
    expect(t.x(0.0685)).toBeCloseTo(0.137, 12)
  })
})

describe('modified Raoult', () => {
  it('Margules form tends to K = gammaInf Psat/P at infinite dilution and inverts', () => {
    const m = new MargulesRaoultEquilibrium(4, 0.1)
    expect(m.K0).toBeCloseTo(0.4, 14)
    expect(m.y(1e-9) / 1e-9).toBeCloseTo(0.4, 6)
    for (const x of [0.001, 0.05, 0.2, 0.6, 0.95]) expect(m.x(m.y(x))).toBeCloseTo(x, 10)
    // gamma -> 1 at x -> 1 (pure solute: y = Psat/P)
    expect(m.y(1)).toBeCloseTo(0.1, 14)
  })
  it('constant K inverts', () => {
    const l = new LinearEquilibrium(0.62)
    expect(l.x(l.y(0.0123))).toBeCloseTo(0.0123, 15)
  })
})
