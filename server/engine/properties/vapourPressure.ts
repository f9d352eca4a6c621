/**
 * Vapour pressure.
 */
import type { EngineWarning } from '../contract.ts'
import { MMHG } from './constants.ts'
import { checkRange, type ValidityRange } from '../numerics/validity.ts'

export interface AntoineSI {
  /** log10(P/mmHg) = A - B/(C + t/degC) */
  A: number
  B: number
  C: number
  /** validity range [K] */
  Tmin: number
  Tmax: number
}

/**
 * Vapour pressure from the Antoine equation (mmHg / degC form).
 *
 * Equation: log10(Psat/mmHg) = A - B/(C + t), t in degC
 * @param T temperature [K]
 * @returns vapour pressure [Pa]
 * Validity: the constants' own range (Tmin-Tmax, data in the component library).
 * Source: antoineYaws (constants from memory, each with its source string in data/components.json).
 * Example: vapourPressureAntoine({ A: 8.20417, B: 1642.89, C: 230.3, Tmin: 270, Tmax: 370 }, 298.15) = 7833 Pa (ethanol, 7.83 kPa)
 */
export function vapourPressureAntoine(a: AntoineSI, T: number, warnings?: EngineWarning[], path?: string): number {
  if (warnings) {
    const r: ValidityRange = { arg: 'T', min: a.Tmin, max: a.Tmax, unit: 'K' }
    checkRange(warnings, 'Antoine vapour pressure', r, T, path)
  }
  const t = T - 273.15
  return MMHG * Math.pow(10, a.A - a.B / (a.C + t))
}
