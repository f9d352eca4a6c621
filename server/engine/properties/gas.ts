/**
 * Gas properties.
 */
import { R_GAS } from './constants.ts'

/**
 * Ideal-gas density.
 *
 * Equation: rho = P M / (R T)
 * @param P pressure [Pa]
 * @param M molar mass [kg/mol]
 * @param T temperature [K]
 * @returns density [kg/m3]
 * Validity: ideal gas; low pressure (say below 1 MPa for CO2, N2, air near ambient).
 * Source: codata2018 (R, exact).
 * Example: densityIdealGas(101325, 0.04401, 298.15) = 1.79887 kg/m3
 */
export function densityIdealGas(P: number, M: number, T: number): number {
  return (P * M) / (R_GAS * T)
}
export const densityIdealGasValidity = [{ arg: 'P', min: 0, max: 1e6, unit: 'Pa' }] as const

/** Mean molar mass of a binary gas [kg/mol] from solute mole fraction y. */
export function molarMassMix(y: number, Msolute: number, Mcarrier: number): number {
  return y * Msolute + (1 - y) * Mcarrier
}
