/**
 * Preliminary pressure-vessel shell: thickness and weight. Always reported with the
 * caution that this is a preliminary estimate only.
 */

export const VESSEL_CAUTION =
  'Preliminary estimate only: the shell thickness and weight come from the thin-wall formula and a minimum-thickness rule; the final design must be made to the local pressure-vessel code (e.g. ASME VIII-1, EN 13445) by a licensed engineer, including wind, seismic, vacuum and nozzle loads.'

/**
 * Shell thickness for internal pressure (circumferential stress, thin wall).
 * Equation: t = P R/(S E - 0.6 P) + CA
 * @param P design pressure, gauge [Pa]; @param R inside radius [m]
 * @param S allowable stress [Pa]; @param E joint efficiency [-]; @param CA corrosion allowance [m]
 * @returns thickness [m]
 * Validity: t <= R/2 and P <= 0.385 S E.
 * Source: asmeVIII1 UG-27(c)(1). Example: shellThicknessThinWall(1.5e6, 0.3, 138e6, 1, 0.003) = 0.00628 m
 */
export function shellThicknessThinWall(P: number, R: number, S: number, E: number, CA: number): number {
  return (P * R) / (S * E - 0.6 * P) + CA
}

export interface MinThicknessRow {
  maxDiameter: number // m
  thickness: number // m, including corrosion allowance
}
/** Minimum wall for rigidity by diameter (sinnott2005 sec. 13.5, incl. 2 mm CA; from memory). */
export const DEFAULT_MIN_THICKNESS: readonly MinThicknessRow[] = [
  { maxDiameter: 1, thickness: 0.005 },
  { maxDiameter: 2, thickness: 0.007 },
  { maxDiameter: 2.5, thickness: 0.009 },
  { maxDiameter: 3, thickness: 0.01 },
  { maxDiameter: 3.5, thickness: 0.012 },
]

export function minimumThickness(rule: readonly MinThicknessRow[], D: number): number {
  for (let i = 0; i < rule.length; i++) if (D <= rule[i]!.maxDiameter + 1e-12) return rule[i]!.thickness
  return rule[rule.length - 1]!.thickness
}

/**
 * Steel mass of a cylindrical shell with two 2:1 semi-ellipsoidal heads.
 * Equation: m = rho t [pi D_m L + 2 (1.084 D_m^2)], D_m = D + t (mean diameter);
 *   1.084 D^2 is the surface area of a 2:1 elliptical head (from memory; common practice).
 * @param D inside diameter [m]; @param L tangent-to-tangent length [m]; @param t wall [m]; @param rho steel density [kg/m3]
 * Source: commonPractice. Example: shellMass(1.2, 12, 0.006, 7850) = 2290 kg
 */
export function shellMass(D: number, L: number, t: number, rho: number): number {
  const Dm = D + t
  return rho * t * (Math.PI * Dm * L + 2 * 1.084 * Dm * Dm)
}

export interface VesselData {
  /** design pressure, gauge [Pa] */
  designPressure: number
  /** allowable stress [Pa] */
  allowableStress: number
  /** joint efficiency [-] */
  jointEfficiency: number
  /** corrosion allowance [m] */
  corrosionAllowance: number
  /** shell material density [kg/m3] */
  materialDensity: number
  /** minimum wall for rigidity by diameter, including the corrosion allowance */
  minimumThickness: readonly MinThicknessRow[]
}

export interface VesselShell {
  /** thin-wall thickness incl. corrosion allowance [m] */
  thicknessCalculated: number
  /** minimum wall at this diameter [m] */
  thicknessMinimum: number
  /** the larger of the two [m] */
  thickness: number
  /** shell + two 2:1 heads [kg] */
  mass: number
  /** false when P > 0.385 S E or the pressure part of t exceeds R/2 (thick wall) */
  thinWallValid: boolean
}

/**
 * The one vessel model of the product: thickness t = max(P R/(S E - 0.6 P) + CA, t_min(D)) and
 * the mass of the shell with two 2:1 heads. Used by the design and, with the cost basis's
 * material data when it asks for them, by the costing.
 * Source: asmeVIII1 UG-27(c)(1); minimum wall sinnott2005; mass commonPractice.
 * Example: P 0.3 MPa, D 1.2 m, L 12 m, S 138 MPa, E 0.85, CA 3 mm, t_min 5 mm (D <= 1 m) / 7 mm
 *   -> thickness 7 mm (minimum governs), mass 2,674 kg at 7850 kg/m3:
 * Example: vesselShell({ designPressure: 3e5, allowableStress: 138e6, jointEfficiency: 0.85, corrosionAllowance: 0.003, materialDensity: 7850, minimumThickness: [{ maxDiameter: 1, thickness: 0.005 }, { maxDiameter: 2, thickness: 0.007 }] }, 1.2, 12).mass = 2674 kg
 * Example: vesselShell({ designPressure: 3e5, allowableStress: 138e6, jointEfficiency: 0.85, corrosionAllowance: 0.003, materialDensity: 7850, minimumThickness: [{ maxDiameter: 1, thickness: 0.005 }, { maxDiameter: 2, thickness: 0.007 }] }, 1.2, 12).thicknessCalculated = 0.0045369 m
 */
export function vesselShell(v: VesselData, D: number, L: number): VesselShell {
  const R = 0.5 * D
  const thicknessCalculated = shellThicknessThinWall(v.designPressure, R, v.allowableStress, v.jointEfficiency, v.corrosionAllowance)
  const thicknessMinimum = minimumThickness(v.minimumThickness, D)
  const thickness = thicknessCalculated > thicknessMinimum ? thicknessCalculated : thicknessMinimum
  const thinWallValid = !(v.designPressure > 0.385 * v.allowableStress * v.jointEfficiency || thicknessCalculated - v.corrosionAllowance > 0.5 * R)
  return { thicknessCalculated, thicknessMinimum, thickness, mass: shellMass(D, L, thickness, v.materialDensity), thinWallValid }
}
