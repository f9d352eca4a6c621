import { describe, expect, it } from 'vitest'
import * as lib from '@shared/units.ts'
import { costBasisFieldDisplay, perGallon } from '@/components/costBasis/costBasisUnits.ts'

// Factors: NIST SP 811 (2008) appendix B — gallon (U.S.) 3.785412 E-03 m³, pound 0.45359237 kg,
// foot 0.3048 m, inch 0.0254 m, psi 6.894757 E+03 Pa, lb/ft³ 1.601846 E+01 kg/m³,
// inch of water (conventional) 2.4908891 E+02 Pa.
describe('cost-basis fields in real units', () => {
  it('electricity stays per kWh in both systems', () => {
    expect(costBasisFieldDisplay('utilities.electricityPrice', 'US', 'USD', lib)).toEqual({ scale: 1, unit: 'USD/kWh' })
    expect(costBasisFieldDisplay('utilities.electricityPrice', 'SI', 'EUR', lib)).toEqual({ scale: 1, unit: 'EUR/kWh' })
  })
  it('solvent per m³ in SI, per 1000 gal in US (0.50 USD/m³ = 1.893 USD/1000 gal = 0.001893 USD/gal)', () => {
    expect(costBasisFieldDisplay('utilities.solventCost', 'SI', 'USD', lib)).toEqual({ scale: 1, unit: 'USD/m³' })
    const us = costBasisFieldDisplay('utilities.solventCost', 'US', 'USD', lib)
    expect(us?.unit).toBe('USD/1,000 gal')
    expect((us?.scale ?? 0) * 0.5).toBeCloseTo(1.892706, 6)
    expect(perGallon(0.5, lib)).toBeCloseTo(0.001892706, 9)
  })
  it('product value per kg in SI, per lb in US', () => {
    const us = costBasisFieldDisplay('utilities.productValue', 'US', 'USD', lib)
    expect(us?.unit).toBe('USD/lb')
    expect(us?.scale).toBeCloseTo(0.45359237, 12)
  })
  it('physical fields: m → ft, Pa → inH2O, kg/m³ → lb/ft³, Pa → MPa / psi, m → mm / in, gauge pressure', () => {
    expect(costBasisFieldDisplay('drives.pumpHeadAllowance', 'US', '', lib)?.scale).toBeCloseTo(1 / 0.3048, 12)
    expect(costBasisFieldDisplay('drives.blowerPressureAllowance', 'US', '', lib)?.scale).toBeCloseTo(1 / 249.08891, 12)
    const dens = costBasisFieldDisplay('materials.shellDensity', 'US', '', lib)
    expect(dens?.unit).toBe('lb/ft³')
    expect(7850 * (dens?.scale ?? 0)).toBeCloseTo(7850 / 16.01846, 3)
    expect(costBasisFieldDisplay('materials.allowableStress', 'SI', '', lib)).toEqual({ scale: 1e-6, unit: 'MPa' })
    expect(137.9e6 * (costBasisFieldDisplay('materials.allowableStress', 'US', '', lib)?.scale ?? 0)).toBeCloseTo(137.9e6 / 6894.757, 0)
    expect(costBasisFieldDisplay('materials.corrosionAllowance', 'SI', '', lib)).toEqual({ scale: 1000, unit: 'mm' })
    expect(costBasisFieldDisplay('materials.corrosionAllowance', 'US', '', lib)?.scale).toBeCloseTo(1 / 0.0254, 10)
    expect(costBasisFieldDisplay('materials.minimumDesignPressure', 'US', '', lib)?.unit).toBe('psig')
    expect(costBasisFieldDisplay('materials.minimumDesignPressure', 'SI', '', lib)).toEqual({ scale: 1e-3, unit: 'kPa (gauge)' })
  })
  it('dimensionless fields and correlation coefficients have no display unit', () => {
    expect(costBasisFieldDisplay('capital.interestRate', 'US', 'USD', lib)).toBeNull()
    expect(costBasisFieldDisplay('correlations.shell.curve.sizeMin', 'US', 'USD', lib)).toBeNull()
  })
})
