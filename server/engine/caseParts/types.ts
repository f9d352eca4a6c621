/** The case in SI, as the design engine reads it (see ../case.ts for the units). */
import type { EngineWarning } from '../contract.ts'
import type { SpacingRuleRow } from '../hydraulics/flooding.ts'
import type { MinThicknessRow } from '../vessel/shell.ts'
import type { AntoineSI } from '../properties/vapourPressure.ts'

export type EquilibriumSI =
  | { model: 'constantK'; K: number }
  | { model: 'henry'; Hcp: number; B: number }
  | {
      model: 'modifiedRaoult'
      gammaInf: number
      activityModel: 'constant' | 'margules'
      antoine: AntoineSI | null
      /** fixed vapour pressure at column T [Pa], overrides antoine */
      vapourPressure: number | null
    }
  | { model: 'table'; x: number[]; y: number[] }

export interface CaseSI {
  name?: string
  gas: {
    flow: number // mol/s, total inlet gas
    temperature: number // K, inlet gas
    pressure: number // Pa abs, column (inlet) pressure
    soluteMoleFraction: number // y_{N+1}
    carrierMolarMass: number // kg/mol
    carrierName: string | null
    viscosity: number | null // Pa s (information; not used by the correlations chosen)
  }
  solute: { name: string | null; molarMass: number; hazards: string[] }
  solvent: {
    name: string | null
    temperature: number // K, inlet
    soluteMoleFraction: number // x0
    molarMass: number // kg/mol
    density: number // kg/m3
    viscosity: number // Pa s
    surfaceTension: number // N/m
  }
  equilibrium: EquilibriumSI
  /** Temperature for equilibrium and liquid properties [K] (default: solvent inlet temperature). */
  columnTemperature: number
  recovery: number
  solventFactor: number
  tray: {
    holeDiameter: number // m
    holePitch: number // m
    thickness: number // m
    spacing: number | 'auto' // m
    floodFraction: number
    foamingFactor: number
    weirHeight: number // m
    downcomerClearance: number // m (apron clearance under the downcomer)
    turndownFraction: number // lowest gas rate as a fraction of design, for the weeping check
    spacingRule: SpacingRuleRow[]
  }
  efficiency: { model: 'oconnell' } | { model: 'fixed'; value: number }
  method: 'auto' | 'kremser' | 'stageByStage'
  column: { diameterStep: number; topAllowance: number; bottomAllowance: number }
  vessel: {
    designPressure: number // Pa gauge
    allowableStress: number // Pa
    jointEfficiency: number
    corrosionAllowance: number // m
    materialDensity: number // kg/m3
    minimumThickness: MinThicknessRow[]
  }
  /** Notes from normalisation (defaults taken, library values used), passed on as warnings. */
  warnings: EngineWarning[]
  /** Hazard cautions from the library (solute and carrier). */
  cautions: string[]
}

// ---------------------------------------------------------------- defaults

/** Defaults of optional fields; documented in data/examples/README.md. */
