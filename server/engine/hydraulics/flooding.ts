/**
 * Sieve-tray flooding capacity (Fair 1961) and column diameter.
 */
import type { EngineWarning } from '../contract.ts'
import { checkRange, type ValidityRange } from '../numerics/validity.ts'

/**
 * Flow parameter.
 * Equation: F_LV = (L/G) (rho_G/rho_L)^0.5, L and G mass flows
 * @param L liquid mass flow [kg/s]; @param G gas mass flow [kg/s]
 * @param rhoV gas density [kg/m3]; @param rhoL liquid density [kg/m3]
 * Source: fair1961 via treybal1980 ch. 6. Example: flowParameter(2, 1, 1.8, 995) = 0.08507
 */
export function flowParameter(L: number, G: number, rhoV: number, rhoL: number): number {
  return (L / G) * Math.sqrt(rhoV / rhoL)
}

/**
 * Flooding capacity parameter C_F of sieve trays (Fair), curve fit.
 *
 * Equation: C_F = alpha log10(1/F_LV) + beta [m/s], alpha = 0.0744 t + 0.01173,
 *   beta = 0.0304 t + 0.015; F_LV = 0.1 is used when F_LV < 0.1 (as the source says).
 * @param t tray spacing [m]
 * @param FLV flow parameter [-]
 * @returns C_F [m/s] (for sigma = 0.020 N/m, non-foaming, A_h/A_a >= 0.1)
 * Validity: F_LV 0.01-1 (chart), t 0.15-0.9 m; low- or non-foaming; weir < 15 % of
 *   spacing; holes <= 13 mm.
 * Source: fair1961 via treybal1980 Table 6.2 / benitez2009 eqs 4.29-4.32.
 * Example: capacityFactorFair(0.5, 0.05) = 0.07913 m/s (F_LV floored at 0.1)
 */
export function capacityFactorFair(t: number, FLV: number, warnings?: EngineWarning[], path?: string): number {
  if (warnings) capacityFactorFairWarnings(t, FLV, warnings, path)
  const f = FLV < 0.1 ? 0.1 : FLV
  return (0.0744 * t + 0.01173) * Math.log10(1 / f) + (0.0304 * t + 0.015)
}
export const capacityFactorFairValidity: readonly [ValidityRange, ValidityRange] = [
  { arg: 'F_LV', min: 0.01, max: 1, unit: '-' },
  { arg: 't', min: 0.15, max: 0.9, unit: 'm' },
]

/** The notes of the Fair correlation at (t, F_LV): the floor below F_LV = 0.1, and the validity ranges. */
export function capacityFactorFairWarnings(t: number, FLV: number, warnings: EngineWarning[], path?: string): void {
  // one note per fact: below 0.1 the source's floor applies (0.1 is inside the range), so the
  // range is checked only for the value actually used
  if (FLV < 0.1) {
    warnings.push({
      code: 'flowParameterFloored',
      message: `Fair flooding correlation: flow parameter F_LV = ${FLV.toFixed(4)} is below 0.1; 0.1 is used, as the source prescribes`,
      path,
    })
  } else checkRange(warnings, 'Fair flooding correlation (flow parameter)', capacityFactorFairValidity[0], FLV, path)
  checkRange(warnings, 'Fair flooding correlation (tray spacing)', capacityFactorFairValidity[1], t, 'tray.spacing')
}

/**
 * Surface-tension factor. Equation: F_ST = (sigma/20)^0.2, sigma in dyn/cm (mN/m).
 * @param sigma surface tension [N/m]
 * Source: fair1961 via treybal1980 ((sigma/0.020)^0.2 with sigma in N/m).
 * Example: surfaceTensionFactor(0.07) = 1.2847
 */
export function surfaceTensionFactor(sigma: number): number {
  return Math.pow(sigma / 0.02, 0.2)
}

/**
 * Hole-area factor F_HA: 1 for A_h/A_a >= 0.10; 5 (A_h/A_a) + 0.5 for 0.06-0.10.
 * @param AhAa hole area / active area [-]
 * Validity: A_h/A_a >= 0.06 (below: extrapolated with a warning).
 * Source: treybal1980 Table 6.2 notes; agrees with Ludwig's table (ludwig1997; 0.10 -> 1.00, 0.08 -> 0.90, 0.06 -> 0.80).
 * Example: holeAreaFactor(0.08) = 0.90
 */
export function holeAreaFactor(AhAa: number, warnings?: EngineWarning[], path?: string): number {
  checkRange(warnings, 'Hole-area factor', holeAreaFactorValidity, AhAa, path)
  return AhAa >= 0.1 ? 1 : 5 * AhAa + 0.5
}
export const holeAreaFactorValidity: ValidityRange = { arg: 'A_h/A_a', min: 0.06, max: 0.2, unit: '-' }

/**
 * Hole area / active area for triangular pitch.
 * Equation: A_h/A_a = 0.907 (d_o/p)^2
 * @param dO hole diameter [m]; @param p pitch [m]
 * Source: treybal1980 eq. 6.31; benitez2009 eq. 4.35. Example: holeAreaFractionTriangular(0.0045, 0.012) = 0.12755
 */
export function holeAreaFractionTriangular(dO: number, p: number): number {
  const r = dO / p
  return 0.907 * r * r
}

/**
 * Downcomer area / tower area from the flow parameter.
 * Equation: A_d/A_t = 0.10 (F_LV <= 0.1); 0.1 + (F_LV - 0.1)/9 (0.1-1.0); 0.2 (F_LV >= 1)
 * Source: benitez2009 eq. 4.34 (F_LV <= 0.1); the rest from memory.
 * Example: downcomerAreaFraction(0.55) = 0.15
 */
export function downcomerAreaFraction(FLV: number): number {
  if (FLV <= 0.1) return 0.1
  if (FLV >= 1) return 0.2
  return 0.1 + (FLV - 0.1) / 9
}

/**
 * Flooding velocity on the net area.
 * Equation: v_F = C [(rho_L - rho_V)/rho_V]^0.5
 * Source: fair1961 via treybal1980. Example: floodingVelocity(0.090897, 961, 0.67928) = 3.4177 m/s
 */
export function floodingVelocity(C: number, rhoL: number, rhoV: number): number {
  return C * Math.sqrt((rhoL - rhoV) / rhoV)
}

/**
 * Tower diameter at a fraction of flood.
 * Equation: D = [4 Q / (f v_F pi (1 - A_d/A_t))]^0.5
 * @param Q gas volumetric flow [m3/s]; @param f fraction of flood [-]
 * @param vF flooding velocity [m/s]; @param AdAt downcomer area fraction [-]
 * Source: benitez2009 eq. 4.33. Example: diameterFromFlooding(3.0208, 0.8, 3.4177, 0.088) = 1.242 m (Treybal Illus. 6.3)
 */
export function diameterFromFlooding(Q: number, f: number, vF: number, AdAt: number): number {
  return Math.sqrt((4 * Q) / (f * vF * Math.PI * (1 - AdAt)))
}

/** Tray spacing from diameter by an editable rule (sorted by maxDiameter). */
export interface SpacingRuleRow {
  maxDiameter: number // m
  spacing: number // m
}
/** Default rule: treybal1980 Table 6.1 / benitez2009 Table 4.3 (rows above 1.5 m from memory). */
export const DEFAULT_SPACING_RULE: readonly SpacingRuleRow[] = [
  { maxDiameter: 1, spacing: 0.5 },
  { maxDiameter: 3, spacing: 0.6 },
  { maxDiameter: 4, spacing: 0.75 },
  { maxDiameter: 8, spacing: 0.9 },
]

/** Spacing for a diameter; beyond the last row, the last row's spacing (the caller warns). */
export function spacingFromRule(rule: readonly SpacingRuleRow[], D: number): number {
  for (let i = 0; i < rule.length; i++) if (D <= rule[i]!.maxDiameter + 1e-12) return rule[i]!.spacing
  return rule[rule.length - 1]!.spacing
}
