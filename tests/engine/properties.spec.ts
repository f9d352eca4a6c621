import { describe, expect, it } from 'vitest'
import { densityWater, surfaceTensionWater, viscosityWater, viscosityWaterIAPWS } from '../../server/engine/properties/water.ts'
import { densityIdealGas } from '../../server/engine/properties/gas.ts'
import { R_GAS } from '../../server/engine/properties/constants.ts'
import { vapourPressureAntoine } from '../../server/engine/properties/vapourPressure.ts'
import type { EngineWarning } from '../../server/engine/contract.ts'
import { expectPublished } from './published.ts'

describe('ideal gas with the CODATA 2018 gas constant', () => {
  it('R = N_A k = 8.314 462 618 15 J/(mol K), exact', () => {
    expectPublished({ source: 'CODATA 2018 / CRC Handbook 01_16_0001 (C)', where: 'R', expected: 8.31446261815, tolerance: 0 }, R_GAS)
    expect(R_GAS).toBeCloseTo(6.02214076e23 * 1.380649e-23, 10)
  })
  it('density of the Treybal Illus. 6.3 vapour (M 20.52, 95 degC, 1 atm) = 0.67928 kg/m3', () => {
    expectPublished(
      { source: 'Treybal Illus. 6.3 data, recomputed (D)', where: 'rho_G (M printed as 20.52, so +/- 0.025 %)', expected: 0.67928, tolerance: 0.0002 },
      densityIdealGas(101325, 0.02052, 368.15),
    )
  })
  it('air at 0 degC, 1 atm (M 28.9645) = 1.2923 kg/m3', () => {
    expectPublished({ source: 'ideal-gas law with CODATA R (D)', where: 'air STP', expected: 1.29226, tolerance: 0.00001 }, densityIdealGas(101325, 0.0289645, 273.15))
  })
})

describe('water: IAPWS R1-76(2014) surface tension', () => {
  const src = 'IAPWS R1-76(2014) equation'
  const table: [number, number, number][] = [
    [0, 75.648, 0.0005],
    [20, 72.736, 0.0005],
    [25, 71.972, 0.0005],
    [30, 71.194, 0.0005],
    [50, 67.944, 0.0005],
    [100, 58.912, 0.0005],
  ]
  for (const [t, s, tol] of table) {
    it(`sigma(${t} degC) = ${s} mN/m`, () => {
      expectPublished({ source: src, where: `${t} degC`, expected: s, tolerance: tol }, 1000 * surfaceTensionWater(273.15 + t))
    })
  }
  it('warns (no clamp) below 248 K', () => {
    const w: EngineWarning[] = []
    const v = surfaceTensionWater(240, w)
    expect(w[0]?.code).toBe('outsideValidity')
    expect(v).toBeGreaterThan(0.076)
  })
})

describe('water density (Kell 1975) and viscosity against IAPWS values', () => {
  it('density within 0.02 kg/m3 of IAPWS-95 at 20, 25, 30 degC', () => {
    const src = 'IAPWS-95 at 0.101325 MPa (M: from memory)'
    expectPublished({ source: src, where: '20 degC', expected: 998.207, tolerance: 0.02 }, densityWater(293.15))
    expectPublished({ source: src, where: '25 degC', expected: 997.047, tolerance: 0.02 }, densityWater(298.15))
    expectPublished({ source: src, where: '30 degC', expected: 995.65, tolerance: 0.02 }, densityWater(303.15))
  })
  it('viscosity within 0.5 % of IAPWS 2008 values', () => {
    expectPublished({ source: 'IAPWS 2008 via a property library (C)', where: '25 degC, 0.1 MPa', expected: 0.89002, tolerance: 0.0045 }, 1000 * viscosityWater(298.15))
    expectPublished({ source: 'IAPWS 2008 (M)', where: '20 degC', expected: 1.0016, tolerance: 0.005 }, 1000 * viscosityWater(293.15))
    expectPublished({ source: 'IAPWS 2008 (M)', where: '30 degC', expected: 0.797, tolerance: 0.004 }, 1000 * viscosityWater(303.15))
  })
})

describe('water viscosity: IAPWS 2008 formulation (release R12-08)', () => {
  // Values at the release's own density, computed with CoolProp 8.0.0 (IAPWS-95 density, IAPWS 2008
  // viscosity) at 200 kPa: engineering-references section 8 (D). The formulation at a given density
  // must reproduce them to the printed digits.
  const src = 'IAPWS 2008 (R12-08) via CoolProp 8.0.0 at 200 kPa (D)'
  const table: [number, number, number][] = [
    [0.01, 1.79091, 999.894],
    [25, 0.890009, 997.092],
    [50, 0.546536, 988.078],
    [100, 0.281609, 958.395],
  ]
  for (const [t, mu, rho] of table) {
    it(`mu(${t} degC, ${rho} kg/m3) = ${mu} mPa s`, () => {
      expectPublished({ source: src, where: `${t} degC`, expected: mu, tolerance: 2e-5 * mu }, 1000 * viscosityWaterIAPWS(273.15 + t, rho))
    })
    it(`liquid water at ${t} degC with the engine's own density within 0.5 % of the release`, () => {
      expectPublished({ source: src, where: `${t} degC, Kell density`, expected: mu, tolerance: 0.005 * mu }, 1000 * viscosityWater(273.15 + t))
    })
  }
  it('release check point 298.15 K, 998 kg/m3 = 889.735100 uPa s (M: from memory of the release table)', () => {
    expectPublished({ source: 'IAPWS R12-08 Table 4 (M: from memory)', where: '298.15 K, 998 kg/m3', expected: 889.7351, tolerance: 0.0005 }, 1e6 * viscosityWaterIAPWS(298.15, 998))
  })
})

describe('Antoine vapour pressure (library constants, from memory)', () => {
  it('water at 100 degC is about one atmosphere (within 0.5 %)', () => {
    const p = vapourPressureAntoine({ A: 8.07131, B: 1730.63, C: 233.426, Tmin: 274.15, Tmax: 373.15 }, 373.15)
    expect(Math.abs(p / 101325 - 1)).toBeLessThan(0.005)
  })
  it('ethanol normal boiling point 78.3 degC gives about one atmosphere (within 1 %)', () => {
    const p = vapourPressureAntoine({ A: 8.20417, B: 1642.89, C: 230.3, Tmin: 216, Tmax: 353 }, 351.45)
    expect(Math.abs(p / 101325 - 1)).toBeLessThan(0.01)
  })
})
