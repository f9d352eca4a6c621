/**
 * The unit kinds the economics screens use: volume, power, energy and prices per amount, against
 * NIST SP 811 (2008) appendix B factors.
 */
import { describe, expect, it } from 'vitest'
import { convert, displayUnit, fromSI, priceBasis, priceScale, toSI } from '../../shared/units.ts'

const NIST = 'NIST SP 811 (2008), appendix B'
// |got - expected| <= tolerance, with the source named in the failure message
function published(source: string, where: string, expected: number, tolerance: number, got: number): void {
  expect(Math.abs(got - expected), `${source}, ${where}: expected ${expected}, got ${got}`).toBeLessThanOrEqual(tolerance)
}

describe('units: volume, power and energy', () => {
  it('gallon (U.S.) 3.785412 E-03 m3; cubic foot 2.831685 E-02 m3; litre 1.0 E-03 m3', () => {
    published(NIST, 'gallon (U.S.)', 3.785412e-3, 5e-10, convert(1, 'gal', 'm^3'))
    published(NIST, 'cubic foot', 2.831685e-2, 5e-9, convert(1, 'ft^3', 'm^3'))
    published(NIST, 'liter', 1e-3, 1e-15, convert(1, 'L', 'm^3'))
    published(NIST, 'gallon (U.S.) per minute 6.309020 E-05 m3/s', 6.30902e-5, 5e-12, convert(1, 'gpm', 'm^3/s'))
  })
  it('horsepower (550 ft lbf/s) 7.456999 E+02 W; kilowatt hour 3.6 E+06 J', () => {
    published(NIST, 'horsepower (550 ft·lbf/s)', 745.6999, 5e-5, convert(1, 'hp', 'W'))
    published(NIST, 'kilowatt hour', 3.6e6, 1e-6, convert(1, 'kWh', 'J'))
    published(NIST, 'horsepower in kW', 0.7456999, 5e-8, toSI('power', { value: 1, unit: 'hp' }) / 1000)
  })
  it('display units of the new kinds', () => {
    expect(displayUnit('volume', 'US')).toBe('gal')
    expect(displayUnit('power', 'US')).toBe('hp')
    expect(displayUnit('power', 'SI')).toBe('kW')
    published(NIST, '1 kW in hp (1/0.7456999)', 1 / 0.7456999, 1e-6, fromSI('power', 1000, 'hp'))
  })
})

describe('units: prices per amount follow the unit system', () => {
  it('a price per m3 is shown per 1000 gal in US units (x 3.785412)', () => {
    expect(priceBasis('pricePerVolume', 'US')).toEqual({ count: 1000, unit: 'gal' })
    published(NIST, '1000 gal = 3.785412 m3', 3.785412, 5e-7, priceScale('pricePerVolume', 'US'))
    expect(priceScale('pricePerVolume', 'SI')).toBe(1)
  })
  it('a price per kg is shown per lb (x 0.45359237); per t as per 1000 lb', () => {
    published(NIST, 'pound (avoirdupois) 4.535924 E-01 kg', 0.45359237, 1e-15, priceScale('pricePerMass', 'US'))
    published(NIST, '1000 lb = 0.45359237 t', 0.45359237, 1e-15, priceScale('pricePerBulkMass', 'US'))
  })
  it('electricity stays per kWh in both systems', () => {
    expect(priceScale('pricePerEnergy', 'US')).toBe(1)
    expect(priceScale('pricePerEnergy', 'SI')).toBe(1)
  })
})
