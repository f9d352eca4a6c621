import { describe, expect, it } from 'vitest'
import { convert, fromSI, toCaseUnit, toSI, UnitError, QUANTITY_KINDS, displayUnit } from '../../shared/units.ts'
import { expectPublished } from './published.ts'

const NIST = 'NIST SP 811 (2008), appendix B (exact factors)'

describe('units: conversions against published exact factors', () => {
  it('length: 1 ft = 0.3048 m, 1 in = 0.0254 m', () => {
    expectPublished({ source: NIST, where: 'foot', expected: 0.3048, tolerance: 1e-12 }, convert(1, 'ft', 'm'))
    expectPublished({ source: NIST, where: 'inch', expected: 0.0254, tolerance: 1e-12 }, toSI('smallLength', { value: 1, unit: 'in' }))
  })
  it('mass: 1 lb = 0.45359237 kg; lbmol = 0.45359237 kmol', () => {
    expectPublished({ source: NIST, where: 'pound (avoirdupois)', expected: 0.45359237, tolerance: 1e-12 }, convert(1, 'lbm', 'kg'))
    expectPublished({ source: NIST, where: 'pound-mole', expected: 0.45359237, tolerance: 1e-12 }, convert(1, 'lbmol/h', 'kmol/h'))
  })
  it('pressure: 1 psi = 6894.757 Pa; 1 atm = 101325 Pa', () => {
    expectPublished({ source: NIST, where: 'psi (6.894757 E+03)', expected: 6894.757, tolerance: 0.0005 }, convert(1, 'psi', 'Pa'))
    expectPublished({ source: NIST, where: 'standard atmosphere', expected: 101325, tolerance: 1e-9 }, convert(1, 'atm', 'Pa'))
  })
  it('temperature: degF -> degC = (F - 32) 5/9; K = degC + 273.15', () => {
    expectPublished({ source: NIST, where: 'degF formula at 212 F', expected: 100, tolerance: 1e-9 }, convert(212, 'degF', 'degC'))
    expectPublished({ source: NIST, where: 'degF formula at -40 F', expected: -40, tolerance: 1e-9 }, convert(-40, 'degF', 'degC'))
    expectPublished({ source: NIST, where: 'kelvin', expected: 305.15, tolerance: 1e-9 }, toSI('temperature', 32))
  })
  it('viscosity and surface tension: 1 cP = 1 mPa s; 1 dyn/cm = 1 mN/m', () => {
    expect(toSI('viscosity', { value: 0.8, unit: 'cP' })).toBeCloseTo(0.0008, 15)
    expect(toSI('surfaceTension', { value: 72, unit: 'dyn/cm' })).toBeCloseTo(0.072, 15)
  })
  it('density: 1 lb/ft3 = 16.018463 kg/m3 (0.45359237/0.3048^3)', () => {
    expectPublished({ source: NIST, where: 'lb/ft3', expected: 0.45359237 / 0.3048 ** 3, tolerance: 1e-9 }, toSI('density', { value: 1, unit: 'lbm/ft^3' }))
  })
  it('case units: bare numbers are kmol/h, degC, kPa abs, mm, mPa s, mN/m', () => {
    expect(toSI('molarFlow', 3.6)).toBeCloseTo(1, 12) // 3.6 kmol/h = 1 mol/s
    expect(toSI('pressure', 101.325)).toBeCloseTo(101325, 9)
    expect(toSI('smallLength', 4.5)).toBeCloseTo(0.0045, 12)
    expect(fromSI('temperature', 273.15)).toBeCloseTo(0, 12)
    expect(toCaseUnit('molarFlow', { value: 1, unit: 'mol/s' })).toBeCloseTo(3.6, 12)
  })
  it('gauge and absolute pressure are kept apart', () => {
    // 0 psig on an absolute quantity is one standard atmosphere
    expect(toSI('pressure', { value: 0, unit: 'psig' })).toBeCloseTo(101325, 6)
    expect(toSI('pressure', { value: 14.696, unit: 'psia' })).toBeCloseTo(14.696 * 6894.757293168, 3)
    // 50 psig as a gauge design pressure stays gauge
    expect(toSI('pressureGauge', { value: 50, unit: 'psig' })).toBeCloseTo(50 * 6894.757293168, 3)
    // an absolute value on a gauge quantity subtracts one atmosphere
    expect(toSI('pressureGauge', { value: 2, unit: 'bara' })).toBeCloseTo(200000 - 101325, 6)
    expect(convert(0, 'barg', 'bara')).toBeCloseTo(1.01325, 12)
  })
  it('unknown or incompatible units throw a typed error naming the unit', () => {
    expect(() => toSI('length', { value: 1, unit: 'furlongz' })).toThrow(UnitError)
    try {
      toSI('pressure', { value: 1, unit: 'kg' })
    } catch (e) {
      expect(e).toBeInstanceOf(UnitError)
      expect((e as UnitError).unit).toBe('kg')
      expect((e as UnitError).reason).toBe('incompatibleUnit')
      expect((e as Error).message).toContain('kg')
    }
    expect(() => convert(1, 'm', 's')).toThrow(/cannot be converted/)
  })
  it('every quantity kind converts its case and display units to SI', () => {
    for (const kind of Object.keys(QUANTITY_KINDS) as (keyof typeof QUANTITY_KINDS)[]) {
      const info = QUANTITY_KINDS[kind]
      expect(Number.isFinite(toSI(kind, { value: 1, unit: info.caseUnit }))).toBe(true)
      expect(Number.isFinite(fromSI(kind, 1, displayUnit(kind, 'US')))).toBe(true)
      expect(Number.isFinite(fromSI(kind, 1, displayUnit(kind, 'SI')))).toBe(true)
    }
  })
})

describe('units: the built-in table against published factors and a general-purpose library', () => {
  it('gallon, mmHg, torr, inch of water (NIST SP 811 appendix B)', () => {
    expectPublished({ source: NIST, where: 'gallon (U.S.) 3.785412 E-03 m3', expected: 3.785412e-3, tolerance: 5e-10 }, convert(1, 'gpm', 'm^3/min'))
    expectPublished({ source: NIST, where: 'millimeter of mercury 1.333224 E+02 Pa', expected: 133.3224, tolerance: 5e-5 }, convert(1, 'mmHg', 'Pa'))
    expectPublished({ source: NIST, where: 'torr 1.333224 E+02 Pa', expected: 133.3224, tolerance: 5e-5 }, convert(1, 'torr', 'Pa'))
    expectPublished({ source: NIST, where: 'inch of water (39.2 F) 2.49082 E+02 Pa; conventional 2.4908891 E+02', expected: 249.08891, tolerance: 1e-6 }, convert(1, 'inH2O', 'Pa'))
  })
  it('every unit of the table converts as mathjs converts it (mathjs 15, unit functions)', async () => {
    const { mathjsFallback, UNIT_TABLE_FOR_TESTS } = await import('../../shared/units.ts')
    const mathjs = await import('mathjs')
    const ref = mathjsFallback(mathjs as unknown as Parameters<typeof mathjsFallback>[0])
    for (const [si, units] of Object.entries(UNIT_TABLE_FOR_TESTS)) {
      for (const [unit, entry] of Object.entries(units)) {
        const [scale, offset] = typeof entry === 'number' ? [entry, 0] : entry
        const r = ref.affine(unit, si)
        if (typeof r === 'string') throw new Error(`mathjs does not know ${unit} as ${si}`)
        // mathjs rounds psi (6894.75729 Pa), mmHg and torr (133.322 Pa) and hp (745.6998715386 W);
        // the table keeps the NIST SP 811 values, checked against it above and in tests/shared
        const tol = unit === 'psi' || unit === 'hp' ? 1e-9 : unit === 'mmHg' || unit === 'torr' ? 5e-6 : 1e-12
        expect(Math.abs(scale - r.scale) / r.scale, `${unit} -> ${si}`).toBeLessThan(tol)
        expect(Math.abs(offset - r.offset), `${unit} -> ${si} offset`).toBeLessThan(1e-9)
      }
    }
  }, 60_000)
  it('a unit outside the table is still understood (loaded on first need): 1 mile = 1609.344 m', () => {
    expectPublished({ source: NIST, where: 'mile (based on U.S. survey foot is not used; international mile)', expected: 1609.344, tolerance: 1e-9 }, toSI('length', { value: 1, unit: 'mile' }))
  })
})
