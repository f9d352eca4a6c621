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

/**
 * Dynamic viscosity of liquid water (Vogel-type fit).
 *
 * Equation: mu = A 10^(B/(T - C)), A = 2.414e-5 Pa s, B = 247.8 K, C = 140 K
 * @param T temperature [K]
 * @returns viscosity [Pa s]
 * Validity: 0-100 degC for better than about 0.5 % (wider with larger error).
 * Source: waterViscosityVogel (from memory); checked in tests against IAPWS 2008:
 *   0.89002 mPa s (25 C), 1.0016 (20 C), 0.797 (30 C).
 * Example: viscosityWater(298.15) = 8.904e-4 Pa s
 */
export function viscosityWater(T: number, warnings?: EngineWarning[], path?: string): number {
  checkRange(warnings, 'Water viscosity (Vogel fit)', viscosityWaterValidity, T, path)
  return 2.414e-5 * Math.pow(10, 247.8 / (T - 140))
}
export const viscosityWaterValidity: ValidityRange = { arg: 'T', min: 273.15, max: 373.15, unit: 'K' }

/** Molar mass of water [kg/mol]. Source: IUPAC standard atomic weights (18.015 g/mol). */
export const MOLAR_MASS_WATER = 0.018015
