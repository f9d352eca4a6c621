/**
 * Liquid water properties at about atmospheric pressure.
 */
import type { EngineWarning } from '../contract.ts'
import { checkRange, type ValidityRange } from '../numerics/validity.ts'

/**
 * Surface tension of water (IAPWS R1-76(2014)).
 *
 * Equation: sigma = 235.8 tau^1.256 (1 - 0.625 tau) [mN/m], tau = 1 - T/Tc, Tc = 647.096 K
 * @param T temperature [K]
 * @returns surface tension [N/m]
 * Validity: triple point (273.16 K) to Tc; IAPWS accepts extrapolation down to 248 K.
 * Source: iapwsR176.
 * Example: surfaceTensionWater(293.15) = 0.072736 N/m
 */
export function surfaceTensionWater(T: number, warnings?: EngineWarning[], path?: string): number {
  checkRange(warnings, 'Water surface tension (IAPWS R1-76)', surfaceTensionWaterValidity, T, path)
  const tau = 1 - T / 647.096
  if (tau <= 0) return 0
  return 1e-3 * 235.8 * Math.pow(tau, 1.256) * (1 - 0.625 * tau)
}
export const surfaceTensionWaterValidity: ValidityRange = { arg: 'T', min: 248.15, max: 647.096, unit: 'K' }

/**
 * Density of liquid water at 1 atm (Kell 1975).
 *
 * Equation: rho = (999.83952 + 16.945176 t - 7.9870401e-3 t^2 - 46.170461e-6 t^3
 *                  + 105.56302e-9 t^4 - 280.54253e-12 t^5) / (1 + 16.879850e-3 t) [kg/m3], t in degC
 * @param T temperature [K]
 * @returns density [kg/m3]
 * Validity: 0-150 degC (at saturation pressure above 100 degC).
 * Source: kell1975 (constants from memory; checked in tests against IAPWS-95:
 *   998.207 (20 C), 997.047 (25 C), 995.65 (30 C) kg/m3).
 * Example: densityWater(298.15) = 997.045 kg/m3
 */
export function densityWater(T: number, warnings?: EngineWarning[], path?: string): number {
  checkRange(warnings, 'Water density (Kell 1975)', densityWaterValidity, T, path)
  const t = T - 273.15
  const num =
    999.83952 + t * (16.945176 + t * (-7.9870401e-3 + t * (-46.170461e-6 + t * (105.56302e-9 + t * -280.54253e-12))))
  return num / (1 + 16.87985e-3 * t)
}
export const densityWaterValidity: ValidityRange = { arg: 'T', min: 273.15, max: 423.15, unit: 'K' }

/** IAPWS 2008 dilute-gas coefficients H_i, i = 0..3 (R12-08 Table 1). */
const IAPWS08_H0 = [1.67752, 2.20462, 0.6366564, -0.241605] as const
/** IAPWS 2008 residual coefficients H_ij, row i = 0..5 (powers of 1/T - 1), column j = 0..6 (powers of rho - 1) (R12-08 Table 2). */
const IAPWS08_H1: readonly (readonly number[])[] = [
  [0.520094, 0.222531, -0.281378, 0.161913, -0.0325372, 0, 0],
  [0.0850895, 0.999115, -0.906851, 0.257399, 0, 0, 0],
  [-1.08374, 1.88797, -0.772479, 0, 0, 0, 0],
  [-0.289555, 1.26613, -0.489837, 0, 0.0698452, 0, -0.00435673],
  [0, 0, -0.25704, 0, 0, 0.00872102, 0],
  [0, 0.120573, 0, 0, 0, 0, -0.000593264],
]

/**
 * Dynamic viscosity of water at a given temperature and density (IAPWS 2008).
 *
 * Equation: mu = mu* mu0(T) mu1(T, rho) mu2, with T in units of 647.096 K, rho in units of
 *   322 kg/m3, mu* = 1e-6 Pa s;
 *   mu0 = 100 sqrt(T) / sum_{i=0..3} H_i / T^i;
 *   mu1 = exp[ rho sum_{i=0..5} (1/T - 1)^i sum_{j=0..6} H_ij (rho - 1)^j ];
 *   mu2 = 1 (the critical enhancement matters only within about 1 % of the critical point; the
 *   release allows mu2 = 1 for industrial use).
 * @param T temperature [K]
 * @param rho density [kg/m3]
 * @returns viscosity [Pa s]
 * Validity: 273.16 K (at the melting line) to 1173.15 K up to 100 MPa (the release's range).
 * Source: iapws2008viscosity (release R12-08, Tables 1 and 2).
 * Example: viscosityWaterIAPWS(298.15, 998) = 8.897351e-4 Pa s
 */
export function viscosityWaterIAPWS(T: number, rho: number): number {
  const Tb = T / 647.096
  const rb = rho / 322
  let den = 0
  for (let i = 0; i < 4; i++) den += IAPWS08_H0[i]! / Math.pow(Tb, i)
  const mu0 = (100 * Math.sqrt(Tb)) / den
  const a = 1 / Tb - 1
  const b = rb - 1
  let sum = 0
  let ai = 1
  for (let i = 0; i < 6; i++) {
    const row = IAPWS08_H1[i]!
    let inner = 0
    let bj = 1
    for (let j = 0; j < 7; j++) {
      inner += row[j]! * bj
      bj *= b
    }
    sum += ai * inner
    ai *= a
  }
  const mu1 = Math.exp(rb * sum)
  return 1e-6 * mu0 * mu1
}
export const viscosityWaterIAPWSValidity: ValidityRange = { arg: 'T', min: 273.16, max: 1173.15, unit: 'K' }

/**
 * Dynamic viscosity of liquid water near atmospheric pressure: the IAPWS 2008 formulation at the
 * Kell density of liquid water at 1 atm.
 *
 * Equation: mu = viscosityWaterIAPWS(T, densityWater(T))
 * @param T temperature [K]
 * @returns viscosity [Pa s]
 * Validity: 0-100 degC (liquid at about 1 atm); the 1-atm density makes it within 0.01 % of the
 *   release at pressures up to a few bar.
 * Source: iapws2008viscosity with kell1975.
 * Example: viscosityWater(298.15) = 8.9002e-4 Pa s
 */
export function viscosityWater(T: number, warnings?: EngineWarning[], path?: string): number {
  checkRange(warnings, 'Water viscosity (IAPWS 2008)', viscosityWaterValidity, T, path)
  return viscosityWaterIAPWS(T, densityWater(T))
}
export const viscosityWaterValidity: ValidityRange = { arg: 'T', min: 273.15, max: 373.15, unit: 'K' }

/** Molar mass of water [kg/mol]. Source: iupac2021 (standard atomic weights: 18.015 g/mol). */
export const MOLAR_MASS_WATER = 0.018015
