/**
 * Client-side types for API answers. The case, studies, runs, options and cost-basis versions
 * come from the shared schemas; design and optimisation results follow the engine's contract
 * (server/engine/contract.ts), written out here because the client may not import server code.
 */
import type { CostBasisInput } from '@shared/schemas/costBasis.ts'

import type { CaseInput } from '@shared/schemas/case.ts'

export type { CaseInput }

/** A bare number in the case unit, or a value with its unit. */
export type Quantity = number | { value: number; unit: string }

export type EquilibriumModel = CaseInput['equilibrium']['model']

export interface CheckResult {
  key: string
  label: string
  status: 'pass' | 'warn' | 'fail'
  value: number
  limit: number
  /** 'max': the value must stay at or below the limit; 'min': at or above it */
  direction?: 'max' | 'min'
  unit: string
  advice?: string
  source?: string
}

export interface EngineWarning {
  code: string
  message: string
  path?: string
}

/** Design summary: SI, molar flows in kmol/h. */
export interface DesignSummary {
  minimumSolventFlow: number
  solventFlow: number
  absorptionFactor: number
  theoreticalStages: number
  actualTrays: number
  outletGasSoluteMoleFraction: number
  richSolventSoluteMoleFraction: number
  gasDensity: number
  flowParameter: number
  capacityFactor: number
  floodingVelocity: number
  downcomerAreaFraction: number
  holeAreaFraction: number
  traySpacing: number
  diameter: number
  selectedDiameter: number
  pressureDropPerTray: number
  columnPressureDrop: number
  columnHeight: number
  recovery: number
  solventFactor: number
  floodFraction: number
  gasFlow: number
  gasVolumetricFlow: number
  solventMassFlow: number
  solventVolumetricFlow: number
  soluteInGas: number
  soluteAbsorbed: number
  soluteLost: number
  operatingPressure: number
  designPressure: number
  shellThickness: number
  shellMass: number
  percentFlood: number
  fractionOfFloodTarget: number // absent on runs stored before it existed: read with ?? floodFraction
  [k: string]: number
}

export interface XY {
  x: number
  y: number
}

export interface CapitalItem {
  key: string
  label: string
  size: number
  sizeUnit: string
  purchased: number
  installed: number
  annual: number
}

export interface OperatingItem {
  key: string
  label: string
  quantity: number
  quantityUnit: string
  annual: number
}

export interface CostBreakdown {
  currency: string
  costIndex?: number
  capitalRecoveryFactor?: number
  purchasedCapital?: number
  installedCapital?: number
  annualisedCapital: number
  operatingCost: number
  totalAnnualCost: number
  soluteRecoveredPerYear?: number
  costPerKgRecovered?: number
  annual?: Record<string, number>
  capital?: CapitalItem[]
  operating?: OperatingItem[]
  warnings?: EngineWarning[]
}

export interface DesignResult {
  summary: DesignSummary
  checks: CheckResult[]
  warnings: EngineWarning[]
  cautions: string[]
  profile: {
    method: 'kremser' | 'stageByStage'
    methodNote?: string
    theoreticalStages?: number
    lastStageFraction?: number
    lastStageConvention?: string
    stages: { stage: number; x: number; y: number }[]
    equilibriumCurve: XY[]
    operatingLine: XY[]
  }
  detail?: Record<string, unknown>
  totalAnnualCost?: number
  costBreakdown?: CostBreakdown
}

export interface CurvePoint {
  x: number
  tac: number | null
  breakdown?: Record<string, number> | null
  feasible: boolean
  actualTrays?: number | null
  selectedDiameter?: number | null
  reason?: string
}

export interface SensitivityRow {
  item: string
  label: string
  unit?: string
  baseValue?: number
  lowValue?: number
  highValue?: number
  lowChange?: number
  highChange?: number
  lowLimited?: boolean
  highLimited?: boolean
  lowNote?: string
  highNote?: string
  low: { value?: number; tac: number; repricedTac?: number; recovery: number; solventFactor?: number }
  high: { value?: number; tac: number; repricedTac?: number; recovery: number; solventFactor?: number }
}

export interface BoundHit {
  variable: 'recovery' | 'solventFactor' | 'floodFraction' | 'traySpacing'
  bound: 'lower' | 'upper'
  value: number
  advice: string
}

export interface OptimizeResult {
  optimum: {
    recovery: number
    solventFactor: number
    traySpacing: number
    floodFraction: number
    actualTrays: number
    selectedDiameter: number
    totalAnnualCost: number
    breakdown?: CostBreakdown
    design?: DesignResult
  }
  evaluations: number
  curves: { recovery: CurvePoint[]; solventFactor: CurvePoint[] }
  sensitivity: SensitivityRow[]
  boundHits?: BoundHit[]
  cautions?: string[]
  bounds?: { recovery: [number, number]; solventFactor: [number, number]; floodFraction: [number, number]; traySpacings: number[] }
}

export type { StudyRow, RunRow, OptionRow } from '@shared/schemas/studies.ts'
import type { StudyRow, RunRow, OptionRow } from '@shared/schemas/studies.ts'

export interface Paged<T> {
  items: T[]
  total: number
  page: number
  pageSize: number
}

export interface RunView extends RunRow {
  inputs?: CaseInput
  search?: Record<string, unknown> | null
  result: DesignResult | OptimizeResult | null
}

export interface StudyPermissions {
  edit: boolean
  run: boolean
  pin: boolean
  submit: boolean
  review: boolean
  comment: boolean
  archive: boolean
  logOperation: boolean
}

export interface StudyView extends StudyRow {
  recommendedOptionId?: number | null
  parentStudyId?: number | null
  inputs: CaseInput
  search?: Record<string, unknown> | null
  runs: RunRow[]
  options: OptionRow[]
  lastSeenAt?: string | null
  can?: StudyPermissions
}

export type { CostBasisVersionView as CostBasisVersionRow } from '@shared/schemas/costBases.ts'
import type { CostBasisVersionView as CostBasisVersionRow } from '@shared/schemas/costBases.ts'

export interface CostBasisVersion extends CostBasisVersionRow {
  data: CostBasisInput
}

export interface CostPreset {
  key: string
  name: string
  indexName?: string
  targetIndex?: number
  targetYear?: string
  currency?: string
}

export interface ComponentEntry {
  name: string
  aliases?: string[]
  formula?: string
  molarMass?: number
  hasHenry?: boolean
  hasVapourPressure?: boolean
  hazards?: string[]
  source?: string
}

/** True when a run result is an optimisation result. */
export function isOptimizeResult(r: unknown): r is OptimizeResult {
  return typeof r === 'object' && r !== null && 'optimum' in r && 'curves' in r
}

export function isDesignResult(r: unknown): r is DesignResult {
  return typeof r === 'object' && r !== null && 'summary' in r && 'checks' in r
}

/** The design inside a run result, whichever kind. */
export function designOf(r: unknown): DesignResult | null {
  if (isDesignResult(r)) return r
  if (isOptimizeResult(r)) return r.optimum.design ?? null
  return null
}
