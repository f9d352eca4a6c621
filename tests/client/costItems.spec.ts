import { describe, expect, it } from 'vitest'
import * as lib from '@shared/units.ts'
import { libraryUnit, sizeInSystem } from '@/utils/costItems.ts'

// Factors: NIST SP 811 (2008) appendix B — lb 0.45359237 kg, ft 0.3048 m, gal 3.785412 L,
// hp (550 ft·lbf/s) 745.6999 W.
describe('cost-item sizes in the person’s unit system', () => {
  it('a correlation in lb, ft, hp shows kg, m, kW in SI', () => {
    const m = sizeInSystem(10000, 'lb', 'SI', lib)
    expect(m.unit).toBe('kg')
    expect(m.value).toBeCloseTo(4535.9237, 6)
    expect(m.converted).toBe(true)
    expect(sizeInSystem(10, 'ft', 'SI', lib).value).toBeCloseTo(3.048, 10)
    const p = sizeInSystem(20, 'hp', 'SI', lib)
    expect(p.unit).toBe('kW')
    expect(p.value).toBeCloseTo(14.913998, 5)
  })
  it('a correlation in kW shows hp in US units and lb stays lb', () => {
    expect(sizeInSystem(7.456999, 'kW', 'US', lib).value).toBeCloseTo(10, 5)
    const m = sizeInSystem(500, 'lb', 'US', lib)
    expect(m.value).toBe(500)
    expect(m.converted).toBe(false)
  })
  it('the pump size Q·H^0.5 in gpm·ft^0.5 becomes m³/h·m^0.5 in SI', () => {
    // 1 gpm = 0.2271247 m³/h; 1 ft^0.5 = 0.3048^0.5 m^0.5 = 0.5520869 m^0.5
    const s = sizeInSystem(1000, 'gpm·ft^0.5', 'SI', lib)
    expect(s.unit).toBe('m^3/h m^0.5')
    expect(s.value).toBeCloseTo(1000 * 0.2271247 * 0.5520869, 2)
    expect(sizeInSystem(1000, 'gpm·ft^0.5', 'US', lib).converted).toBe(false)
  })
  it('per-year quantities and cost-basis spellings (m3, m2)', () => {
    expect(libraryUnit('m3/s')).toBe('m^3/s')
    const v = sizeInSystem(1000, 'm3/yr', 'US', lib)
    expect(v.unit).toBe('gal/yr')
    expect(v.value).toBeCloseTo(1000 / 3.785411784e-3, 3)
    expect(sizeInSystem(5, 'm2', 'US', lib).value).toBeCloseTo(5 / 0.3048 ** 2, 9)
    expect(sizeInSystem(12000, 'kWh/yr', 'US', lib)).toEqual({ value: 12000, unit: 'kWh/yr', converted: false })
  })
  it('an unknown unit is shown as it is', () => {
    expect(sizeInSystem(3, 'widgets', 'US', lib)).toEqual({ value: 3, unit: 'widgets', converted: false })
  })
})
