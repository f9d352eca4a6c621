/**
 * The contract between the design engine, the cost model, the optimiser and the API.
 * Everything is SI unless the name says otherwise (molar flows in kmol/h as the
 * product's public convention; see each field).
 *
 * The design engine (server/engine/design.ts) produces a DesignResult; the cost model
 * (server/engine/costing/) reads only DesignSummary fields; the optimiser varies the
 * DesignVariables and calls the design engine.
 */

/** A pass / warn / fail verdict for one tray or column check. */
export interface CheckResult {
  key: string // e.g. 'pressureDropPerTray', 'weeping', 'entrainment', 'downcomerBackup', 'downcomerResidence', 'flooding'
  label: string // human wording, e.g. 'Downcomer backup'
  status: 'pass' | 'warn' | 'fail'
  value: number
  limit: number
  /** 'max': the value must stay at or below the limit; 'min': at or above it */
  direction: 'max' | 'min'
  unit: string // unit of value and limit, e.g. 'Pa', 'm', 's', '-'
  advice?: string // what to change when not pass
  source?: string // added by the design engine: method and reference key(s) in server/engine/references.ts
}

export interface EngineWarning {
  code: string // e.g. 'outsideValidity'
  message: string
  path?: string // input field concerned, e.g. 'tray.holeDiameter'
}

/** Flat summary; the first keys are the published interface (stable), the rest serve the cost model and the UI. */
export interface DesignSummary {
  // the stable public keys (SI; kmol/h for molar flows)
  minimumSolventFlow: number // kmol/h
  solventFlow: number // kmol/h
  absorptionFactor: number // -
  theoreticalStages: number // - (fractional)
  actualTrays: number // integer
  outletGasSoluteMoleFraction: number
  richSolventSoluteMoleFraction: number
  gasDensity: number // kg/m3 (at the end with the largest vapour load)
  flowParameter: number // -
  capacityFactor: number // m/s
  floodingVelocity: number // m/s
  downcomerAreaFraction: number // -
  holeAreaFraction: number // - (hole area / active area)
  traySpacing: number // m
  diameter: number // m, as calculated
  selectedDiameter: number // m, rounded up to the standard step
  pressureDropPerTray: number // Pa
  columnPressureDrop: number // Pa
  columnHeight: number // m (tangent to tangent)

  // needed by the cost model and the UI
  recovery: number // fraction of solute absorbed, 0..1
  solventFactor: number // L / Lmin
  floodFraction: number // design fraction of flood
  gasFlow: number // kmol/h, inlet
  gasVolumetricFlow: number // m3/s at column inlet conditions
  solventMassFlow: number // kg/h
  solventVolumetricFlow: number // m3/h
  soluteInGas: number // kg/h entering with the gas
  soluteAbsorbed: number // kg/h
  soluteLost: number // kg/h leaving with the cleaned gas
  operatingPressure: number // Pa abs
  designPressure: number // Pa gauge used for the shell
  shellThickness: number // m, including corrosion allowance
  shellMass: number // kg, shell + two heads
  percentFlood: number // % of flood achieved at the selected diameter (worst end): the achieved approach to flood
  fractionOfFloodTarget: number // the design target fraction of flood the diameter was sized for (= floodFraction)

  // added by the design engine (additive)
  overallEfficiency?: number // - (O'Connell or the fixed user value)
  achievedRecovery?: number // recovery reached with actualTrays (= recovery unless vars.actualTrays adds trays)
}

export interface StageProfilePoint {
  stage: number // 1 = top
  x: number // liquid mole fraction leaving the stage
  y: number // gas mole fraction leaving the stage
}

export interface DesignResult {
  summary: DesignSummary
  checks: CheckResult[]
  warnings: EngineWarning[]
  cautions: string[] // always includes the preliminary-vessel caution
  profile: {
    method: 'kremser' | 'stageByStage'
    /** which method ran and why, in words */
    methodNote: string
    /** ideal stages counted (fractional) = stages.length - 1 + lastStageFraction */
    theoreticalStages: number
    /** fraction of the last stage in `stages` that is counted (0..1] */
    lastStageFraction: number
    /** the convention used for that fraction, with its reason */
    lastStageConvention: string
    stages: StageProfilePoint[]
    equilibriumCurve: { x: number; y: number }[] // for the operating diagram
    operatingLine: { x: number; y: number }[]
  }
  detail: Record<string, unknown> // anything else the UI shows (per-section numbers)
}

/** The variables the optimiser moves; everything else comes from the case. */
export interface DesignVariables {
  recovery: number
  solventFactor: number
  traySpacing: number // m
  floodFraction: number
  /** Optional: force more trays than the minimum (extra trays raise recovery margin). */
  actualTrays?: number
}

/** Structured reason for an infeasible or invalid design. */
export interface EngineIssue {
  path: string // input field, e.g. 'solventFactor'
  code: string // e.g. 'belowMinimumSolvent', 'recoveryOutOfRange', 'flooding'
  message: string // a sentence a person understands
}
