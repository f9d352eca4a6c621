import { describe, expect, it } from 'vitest'
import { fractionAbsorbedKremser, stagesFromUnabsorbedKremser, stagesKremser } from '../../server/engine/balances/kremser.ts'
import { stepStages } from '../../server/engine/balances/stageByStage.ts'
import { minimumSlope } from '../../server/engine/balances/minimumSolvent.ts'
import { LinearEquilibrium, TableEquilibrium } from '../../server/engine/equilibrium/models.ts'
import { expectPublished } from './published.ts'

const D = 'Kremser equation (D: computed from the closed forms for fraction absorbed and stages)'

describe('Kremser: published check values', () => {
  const cases: [number, number, number][] = [
    [1.4, 5, 0.93874],
    [1, 5, 0.833333],
    [2, 3, 0.933333],
    [0.8, 10, 0.781206],
  ]
  for (const [A, N, f] of cases) {
    it(`fraction absorbed at (A, N) = (${A}, ${N}) is ${f}`, () => {
      expectPublished({ source: D, where: `A=${A}, N=${N}`, expected: f, tolerance: 5e-7 }, fractionAbsorbedKremser(A, N))
    })
  }
  it('fraction not absorbed at (1.4, 5) is 0.061260', () => {
    expectPublished({ source: D, where: 'phi', expected: 0.06126, tolerance: 5e-7 }, 1 - fractionAbsorbedKremser(1.4, 5))
  })
  it('N at (A, phi) = (1.4, 0.05) is 5.5302 and (2.0, 0.01) is 5.6582', () => {
    expectPublished({ source: D, where: 'A=1.4, phi=0.05', expected: 5.5302, tolerance: 5e-5 }, stagesFromUnabsorbedKremser(1.4, 0.05))
    expectPublished({ source: D, where: 'A=2, phi=0.01', expected: 5.6582, tolerance: 5e-5 }, stagesFromUnabsorbedKremser(2, 0.01))
  })
  it('A = 1: N = (y_in - y_1)/(y_1 - m x0) (stone-calculator.com form)', () => {
    expect(stagesKremser(0.02, 0.002, 0, 1)).toBeCloseTo(9, 12)
    expect(stagesKremser(0.02, 0.002, 0.001, 1)).toBeCloseTo(18, 12)
  })
})

describe('stage-by-stage profile check (A = 1.4, m = 1, y_in = 0.02, x0 = 0, N = 5)', () => {
  const src = 'Kremser closed form vs stage-by-stage balance, values computed from the formula (D)'
  const eq = new LinearEquilibrium(1)
  const out = { N: 0, steps: 0, lastStageFraction: 0, x: [] as number[], y: [] as number[] }
  const y1 = 0.02 * (1 - fractionAbsorbedKremser(1.4, 5))
  const r = stepStages(eq, false, y1, 0, 0.02, 1.4, 100, out)!
  it('y_1 = 0.00122520 closes on y_6 = 0.02000 in exactly 5 stages', () => {
    expectPublished({ source: src, where: 'y_1 from Kremser', expected: 0.0012252, tolerance: 5e-9 }, 0.02 * (1 - fractionAbsorbedKremser(1.4, 5)))
    expectPublished({ source: src, where: 'N', expected: 5, tolerance: 1e-4 }, r.N)
    expect(r.steps).toBe(5)
  })
  const xs = [0.0012252, 0.0029405, 0.0053419, 0.0087038, 0.0134106]
  xs.forEach((x, i) => {
    it(`x_${i + 1} = ${x}`, () => expectPublished({ source: src, where: `x_${i + 1}`, expected: x, tolerance: 5e-8 }, out.x[i]!))
  })
})

describe('round trips and limiting cases', () => {
  it('Kremser N -> recovery -> N', () => {
    for (const A of [0.5, 0.9, 0.999, 1, 1.0001, 1.3, 2.5]) {
      for (const N of [0.5, 1, 3.7, 10, 25]) {
        const f = fractionAbsorbedKremser(A, N)
        expect(stagesKremser(1, 1 - f, 0, A)).toBeCloseTo(N, 5)
      }
    }
  })
  it('A -> 1 is continuous (N/(N+1) and the A = 1 stage formula)', () => {
    for (const N of [2, 5, 12]) {
      expect(fractionAbsorbedKremser(1 + 1e-6, N)).toBeCloseTo(N / (N + 1), 5)
      expect(fractionAbsorbedKremser(1 - 1e-6, N)).toBeCloseTo(N / (N + 1), 5)
    }
    expect(stagesKremser(0.02, 0.002, 0, 1 + 1e-6)).toBeCloseTo(9, 3)
    expect(stagesKremser(0.02, 0.002, 0, 1 - 1e-6)).toBeCloseTo(9, 3)
  })
  it('N -> infinity gives the minimum solvent: fraction absorbed -> A when A < 1, so A_min = recovery', () => {
    for (const A of [0.3, 0.7, 0.95]) expect(fractionAbsorbedKremser(A, 1e4)).toBeCloseTo(A, 10)
    // and the stage count diverges as A approaches the recovery from above
    const r = 0.9
    const n1 = stagesKremser(1, 1 - r, 0, r * 1.01)
    const n2 = stagesKremser(1, 1 - r, 0, r * 1.0001)
    expect(n2).toBeGreaterThan(n1)
    expect(n2).toBeGreaterThan(60)
    expect(stagesKremser(1, 1 - r, 0, r * 0.99)).toBe(Infinity)
  })
  it('dilute linear pinch: L_min/V = K r (A_min = r)', () => {
    const K = 0.62
    const r = 0.985
    const yIn = 1e-5
    const Y = yIn / (1 - yIn)
    const p = minimumSlope(new LinearEquilibrium(K), (1 - r) * Y, 0, Y)
    expect(p.slope / K).toBeCloseTo(r, 4)
    expect(p.tangent).toBe(false)
  })
  it('curved equilibrium: the general pinch finds a tangent pinch inside the range', () => {
    // an equilibrium curve bending up towards the rich end: y = 0.2 x for x < 0.1, then steep
    const t = new TableEquilibrium([0, 0.05, 0.1, 0.15, 0.2], [0, 0.01, 0.02, 0.06, 0.12])
    const Yin = 0.12 / 0.88
    const XstarN = t.x(0.12) / (1 - t.x(0.12))
    const end = (Yin - 0.001) / XstarN
    const gen = minimumSlope(t, 0.001, 0, Yin)
    expect(gen.slope).toBeGreaterThanOrEqual(end - 1e-12)
    // and the stepping at 1.05 x the minimum does not pinch while at 0.98 x it does
    expect(stepStages(t, true, 0.001, 0, Yin, 1.05 * gen.slope, 2000, null)).not.toBeNull()
  })
})
