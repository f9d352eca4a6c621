/**
 * Overall tray efficiency.
 */
import type { EngineWarning } from '../contract.ts'
import { checkRange, type ValidityRange } from '../numerics/validity.ts'

/** 1 lb/ft3 in kg/m3 (0.45359237 / 0.3048^3). */
export const LB_PER_FT3 = 16.018463373960138

/**
 * O'Connell overall efficiency for absorbers (Edmister-type fit of the chart).
 *
 * Equation: E_o[%] = 10^{1.597 - 0.199 log10(K M_L mu_L/rho_L) - 0.0896 [log10(K M_L mu_L/rho_L)]^2},
 *   M_L in g/mol, mu_L in cP, rho_L in lb/ft3
 * @param K equilibrium ratio y/x [-]
 * @param ML liquid molar mass [kg/mol]
 * @param muL liquid viscosity [Pa s]
 * @param rhoL liquid density [kg/m3]
 * @returns E_o as a fraction [-]
 * Validity: group K M_L mu_L / rho_L from 0.01 to 10 (chart range as remembered);
 *   bubble-cap data, slightly conservative for sieve trays; Ludwig (ludwig1997) warns the absorber
 *   chart can predict too high. Properties at the mean column temperature.
 * Source: oconnell1946, fit as given by seaderHenley2011 (from memory).
 * Example: efficiencyOConnell(0.57, 0.01802, 0.000797, 996.03) = 0.504 (group 0.13166: M 18.02 g/mol, 0.797 cP, 62.18 lb/ft3)
 */
export function efficiencyOConnell(K: number, ML: number, muL: number, rhoL: number, warnings?: EngineWarning[], path?: string): number {
  const g = oconnellGroup(K, ML, muL, rhoL)
  checkRange(warnings, "O'Connell absorber efficiency", efficiencyOConnellValidity, g, path)
  return oconnellOfGroup(g)
}

/** The note when the O'Connell group is outside its validity (what efficiencyOConnell adds to the warnings). */
export function efficiencyOConnellWarnings(K: number, ML: number, muL: number, rhoL: number, warnings: EngineWarning[], path?: string): void {
  checkRange(warnings, "O'Connell absorber efficiency", efficiencyOConnellValidity, oconnellGroup(K, ML, muL, rhoL), path)
}

function oconnellOfGroup(g: number): number {
  const l = Math.log10(g)
  return Math.pow(10, 1.597 - 0.199 * l - 0.0896 * l * l) / 100
}
export const efficiencyOConnellValidity: ValidityRange = { arg: 'K M_L mu_L / rho_L', min: 0.01, max: 10, unit: 'g cP ft3/(mol lb)' }

/** O'Connell absorber group K M_L mu_L / rho_L in the chart's units (g/mol, cP, lb/ft3). */
export function oconnellGroup(K: number, ML: number, muL: number, rhoL: number): number {
  return (K * (ML * 1000) * (muL * 1000)) / (rhoL / LB_PER_FT3)
}

/** Actual trays from ideal stages and overall efficiency: ceil(N / E), at least 1. */
export function actualTrays(N: number, E: number): number {
  const t = Math.ceil(N / E - 1e-9)
  return t < 1 ? 1 : t
}

/**
 * Tray efficiency corrected for entrainment (Colburn): the liquid carried up by the gas undoes part
 * of the tray's separation.
 * Equation: E_a = E / (1 + E psi / (1 - psi))
 * @param E tray (or overall) efficiency without entrainment [-]
 * @param psi fractional entrainment, entrained liquid / gross liquid downflow [mol/mol]
 * @returns E_a [-]
 * Validity: 0 <= psi < 1 (psi as data below).
 * Source: colburn1936, as given by ludwig1997 p. 200; applied to the overall efficiency it is an approximation.
 * Example: efficiencyWithEntrainment(0.5, 0.05) = 0.48718
 */
export function efficiencyWithEntrainment(E: number, psi: number): number {
  return E / (1 + (E * psi) / (1 - psi))
}
export const efficiencyWithEntrainmentValidity: ValidityRange = { arg: 'psi', min: 0, max: 0.999, unit: '-' }
