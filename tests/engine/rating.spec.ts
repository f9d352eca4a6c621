import { describe, expect, it } from 'vitest'
import { summaryToPublic } from '../../shared/summaryUnits.ts'
import { readFileSync } from 'node:fs'
import { evaluateCase } from '../../server/engine/index.ts'
import { rateBatch, rateCase } from '../../server/engine/rating/index.ts'
import { trayStateAt, type TrayGeometry } from '../../server/engine/rating/trayState.ts'
import { surfaceTensionFactor } from '../../server/engine/hydraulics/flooding.ts'
import { orificeCoefficient, weirCrestFrancis } from '../../server/engine/hydraulics/tray.ts'
import { InvalidInputError } from '../../server/engine/errors.ts'
import { expectPublished } from './published.ts'

const readJson = (f: string) => JSON.parse(readFileSync(f, 'utf8')) as Record<string, unknown>

/** The rating input of a designed column: its case, its as-built geometry and its solvent flow. */
function ratingOfDesign(file: string, exactStages: boolean) {
  const raw = readJson(`data/examples/${file}`)
  const d = evaluateCase(raw)
  const s = summaryToPublic(d.summary) // the rating case takes the solvent flow in kmol/h, as a case file
  const hyd = (d.detail as { hydraulics: { weirLength: number } }).hydraulics
  const { recovery: _r, solventFactor: _f, costBasis: _c, ...rest } = raw
  const column = {
    ...((raw.column as object | undefined) ?? {}),
    diameter: s.selectedDiameter,
    actualTrays: s.actualTrays,
    traySpacing: s.traySpacing,
    downcomerAreaFraction: s.downcomerAreaFraction,
    weirLength: hyd.weirLength,
  }
  const input: Record<string, unknown> = { ...rest, column, solventFlow: s.solventFlow, ...(exactStages ? { efficiency: { model: 'fixed', value: s.theoreticalStages / s.actualTrays } } : {}) }
  return { design: d, input }
}

// Treybal, Mass-Transfer Operations, 3rd ed. (McGraw-Hill, 1980), Illustration 6.3 (p. 174 in the
// companion files): sieve tray for 0.1 kmol/s gas (M 20.52, 95 degC, 1 atm) and 0.25 kmol/s
// liquid (rho_L 961 kg/m3, sigma 0.040 N/m), tray spacing 0.5 m, weir 0.7 D, downspout 8.8 % of
// the tower area, 4.5 mm holes on 12 mm triangular pitch; the book's diameter is D = 1.25 m [C].
// Stream values Q = 3.0208 m3/s, rho_V = 0.67928 kg/m3, q = 5.0115e-3 m3/s, C = 0.090897 m/s and
// V_F = 3.4177 m/s are derived from the book's data with its formulas [D] (engineering references §2).
const TREYBAL = 'Treybal, Mass-Transfer Operations 3rd ed., Illus. 6.3 (D = 1.25 m [C]; stream values [D])'

describe('Rating hydraulics at a stated geometry: Treybal Illustration 6.3', () => {
  const D = 1.25
  const At = (Math.PI / 4) * D * D
  const AdAt = 0.088
  const AhAa = 0.907 * (4.5 / 12) ** 2
  const Aa = At * (1 - 2 * AdAt)
  const g: TrayGeometry = {
    D,
    t: 0.5,
    At,
    Ad: AdAt * At,
    An: At * (1 - AdAt),
    Aa,
    Ah: AhAa * Aa,
    AhAa,
    AdAt,
    Lw: 0.7 * D,
    hw: 0.05,
    clearance: 0.04,
    dO: 0.0045,
    Co: orificeCoefficient(0.0045, 0.002),
    rhoL: 961,
    sigma: 0.04,
    capacityFactors: surfaceTensionFactor(0.04), // foaming 1, A_h/A_a 0.1275 >= 0.1 -> F_HA = 1
  }
  const Q = 3.0208
  const rhoV = 0.67928
  const q = 5.0115e-3
  const s = trayStateAt({ gasMol: 100, gasMass: Q * rhoV, rhoV, Q, liqMass: q * 961, qL: q }, g)

  it('flow parameter, capacity and flooding velocity of the worked example', () => {
    expectPublished({ source: TREYBAL, where: 'F_LV (book about 0.0622; 0.0624 from its data)', expected: 0.0624, tolerance: 5e-4 }, s.FLV)
    expectPublished({ source: TREYBAL, where: 'C = C_F (sigma/0.020)^0.2, F_LV floored at 0.1', expected: 0.090897, tolerance: 5e-6 }, s.C)
    expectPublished({ source: TREYBAL, where: 'flooding velocity V_F', expected: 3.4177, tolerance: 5e-4 }, s.vF)
  })

  it('percent flood of the 1.25 m column the book selects (sized at 80 % of flood, D_calc 1.242 m)', () => {
    // expected from the book's numbers alone: (Q / A_n) / V_F with A_n = 0.912 A_t
    const expected = (Q / (0.912 * At) / 3.4177) * 100
    expectPublished({ source: TREYBAL, where: 'percent flood at D = 1.25 m', expected, tolerance: 0.02 }, 100 * s.fractionFlood)
    // and the same as 80 % x (1.242/1.25)^2 to the digits of D_calc
    expect(Math.abs(100 * s.fractionFlood - 80 * (1.242 / 1.25) ** 2)).toBeLessThan(0.1)
  })

  it('weir crest (Francis) at the worked example weir (Sinnott, Coulson & Richardson vol. 6, sec. 11.13; [D] from the formula)', () => {
    // h_ow = 750 [L_w/(rho_L l_w)]^(2/3) mm with L_w = q rho_L kg/s and l_w = 0.875 m
    const expected = 750 * ((q * 961) / (961 * 0.875)) ** (2 / 3) / 1000
    expectPublished({ source: 'Sinnott, Chemical Engineering Design (C&R vol. 6), 4th ed., eq. 11.85', where: 'h_ow at Illus. 6.3 liquid rate', expected, tolerance: 1e-7 }, s.how)
    expect(weirCrestFrancis(q, 0.875)).toBeCloseTo(expected, 10)
  })
})

describe('Round trip: rating the designed column at its design flows', () => {
  // Rating with the installed theoretical stages equal to the design's N (efficiency N/trays)
  // must return the design recovery; with the rounded-up tray count and the design efficiency
  // it returns a slightly higher recovery, within 0.5 % of the design's.
  for (const file of ['design.json', 'design-acetone.json', 'design-table.json']) {
    it(`${file}: recovery, percent flood and pressure drop`, () => {
      const exact = ratingOfDesign(file, true)
      const r = rateCase(exact.input)
      const s = exact.design.summary
      expect(Math.abs(r.summary.recovery - s.recovery) / s.recovery).toBeLessThan(1e-6)
      expect(r.operation.method).toBe(exact.design.profile.method)
      expect(r.summary.percentFlood).toBeCloseTo(s.percentFlood, 6)
      expect(r.summary.pressureDropPerTray).toBeCloseTo(s.pressureDropPerTray, 4)
      expect(r.summary.outletGasSoluteMoleFraction).toBeCloseTo(s.outletGasSoluteMoleFraction, 9)

      const asBuilt = rateCase(ratingOfDesign(file, false).input)
      expect(asBuilt.summary.overallEfficiency).toBeCloseTo(s.overallEfficiency!, 9)
      expect(asBuilt.summary.recovery).toBeGreaterThanOrEqual(s.recovery)
      expect((asBuilt.summary.recovery - s.recovery) / s.recovery).toBeLessThan(0.005)
      // the design checks and the rating checks agree on every verdict
      for (const ch of exact.design.checks) {
        const rc = r.checks.find((c) => c.key === ch.key)
        expect(rc, ch.key).toBeDefined()
        if (ch.key !== 'turndown') expect(rc!.status, ch.key).toBe(ch.status)
      }
    })
  }
})

describe('Rating: physics of a standing column', () => {
  const base = ratingOfDesign('design.json', false).input

  it('more solvent raises recovery; more gas lowers it and raises percent flood', () => {
    const r0 = rateCase(base)
    const r1 = rateCase({ ...base, solventFlow: (base.solventFlow as number) * 1.2 })
    const gas = base.gas as Record<string, unknown>
    const r2 = rateCase({ ...base, gas: { ...gas, flow: (gas.flow as number) * 1.2 } })
    expect(r1.summary.recovery).toBeGreaterThan(r0.summary.recovery)
    expect(r2.summary.recovery).toBeLessThan(r0.summary.recovery)
    expect(r2.summary.percentFlood).toBeGreaterThan(r0.summary.percentFlood)
  })

  it('flooding gas flow at this L/V gives 100 % flood (fraction of flood is proportional to the gas rate at fixed L/V)', () => {
    const r0 = rateCase(base)
    const f = r0.summary.floodingGasFlow / r0.operation.gasFlow
    const gas = base.gas as Record<string, unknown>
    const r1 = rateCase({ ...base, gas: { ...gas, flow: (gas.flow as number) * f * 0.999 }, solventFlow: (base.solventFlow as number) * f * 0.999 })
    expect(r1.summary.percentFlood).toBeCloseTo(99.9, 3)
  })

  it('weeping gas flow is where the hole Froude number reaches 0.5 at this solvent flow', () => {
    const r0 = rateCase(base)
    const gas = base.gas as Record<string, unknown>
    const at = rateCase({ ...base, gas: { ...gas, flow: r0.summary.weepingGasFlow * 1.001 } })
    const weep = at.checks.find((c) => c.key === 'weeping')!
    expect(weep.value).toBeGreaterThanOrEqual(0.5)
    expect(weep.value).toBeLessThan(0.501)
    expect(r0.summary.weepingGasFlow).toBeLessThan(r0.operation.gasFlow)
  })

  it('the window holds the design point, lies between weeping and the upper limits, and flags a point beyond flooding', () => {
    const r0 = rateCase(base)
    const w = r0.window
    expect(w.inside).toBe(true)
    expect(w.region.length).toBeGreaterThan(5)
    for (const p of w.region) expect(p.gasFlowMax).toBeGreaterThan(p.gasFlowMin)
    const gas = base.gas as Record<string, unknown>
    const over = rateCase({ ...base, gas: { ...gas, flow: r0.summary.floodingGasFlow * 1.05 } })
    expect(over.window.inside).toBe(false)
    expect(over.window.violated).toContain('flooding')
    expect(over.checks.find((c) => c.key === 'flooding')!.status).not.toBe('pass')
  })

  it('absent column items are filled by the design rules and listed', () => {
    const { weirLength: _w, downcomerAreaFraction: _a, ...col } = base.column as Record<string, unknown>
    const r = rateCase({ ...base, column: col })
    const paths = r.filled.map((f) => f.path)
    expect(paths).toEqual(expect.arrayContaining(['column.downcomerAreaFraction', 'column.weirLength', 'column.activeAreaFraction']))
    // given a weir length, the downcomer is the segment behind it (theta - sin theta)/(2 pi)
    const r2 = rateCase({ ...base, column: { ...col, weirLength: 0.7266 * 1.45 } })
    expect(r2.column.downcomerAreaFraction).toBeCloseTo(0.1, 3)
  })

  it('a batch rates every case in order', () => {
    const out = rateBatch({ cases: [base, { ...base, solventFlow: (base.solventFlow as number) * 1.1 }] })
    expect(out).toHaveLength(2)
    expect(out[1]!.summary.recovery).toBeGreaterThan(out[0]!.summary.recovery)
  })
})

describe('Rating: bad input is refused with the field path', () => {
  const base = ratingOfDesign('design.json', false).input
  const cases: [string, Record<string, unknown>, string][] = [
    ['missing column', { ...base, column: undefined }, 'column'],
    ['negative diameter', { ...base, column: { ...(base.column as object), diameter: -1 } }, 'column.diameter'],
    ['fractional trays', { ...base, column: { ...(base.column as object), actualTrays: 20.5 } }, 'column.actualTrays'],
    ['weir longer than the diameter', { ...base, column: { ...(base.column as object), weirLength: 2 } }, 'column.weirLength'],
    ['unit of the wrong kind', { ...base, solventFlow: { value: 3, unit: 'm' } }, 'solventFlow.unit'],
    ['zero solvent', { ...base, solventFlow: 0 }, 'solventFlow'],
    ['active area too large', { ...base, column: { ...(base.column as object), activeAreaFraction: 0.95 } }, 'column.activeAreaFraction'],
    ['targets of a design are not rating inputs', { ...base, column: { ...(base.column as object), floodFraction: 0.8 } }, 'column'],
  ]
  for (const [what, input, path] of cases) {
    it(what, () => {
      let err: unknown
      try {
        rateCase(input)
      } catch (e) {
        err = e
      }
      expect(err).toBeInstanceOf(InvalidInputError)
      expect((err as InvalidInputError).path.startsWith(path)).toBe(true)
    })
  }
  it('a liquid load beyond the flooding correlation is refused with a reason, not a NaN', () => {
    let err: unknown
    try {
      rateCase({ ...base, solventFlow: (base.solventFlow as number) * 2000 })
    } catch (e) {
      err = e
    }
    expect((err as { issues: { code: string; path: string }[] }).issues[0]).toMatchObject({ code: 'flooding', path: 'solventFlow' })
  })
  it('batch errors carry the case index', () => {
    expect(() => rateBatch({ cases: [base, { ...base, solventFlow: -2 }] })).toThrow(/cases\.1\.solventFlow/)
  })
})
