/**
 * Client-side types for API answers. The case, studies, runs, options and cost-basis versions
 * come from the shared schemas; the design and optimisation answers are the shared answer
 * schemas (shared/schemas/results.ts), the same ones the engine returns.
 */
import type { CostBasisInput } from '@shared/schemas/costBasis.ts'
import type { CaseInput } from '@shared/schemas/case.ts'
import type { PricedDesign, OptimisationResult } from '@shared/schemas/results.ts'

export type { CaseInput }
export type {
  CheckResult,
  EngineWarning,
  DesignSummary,
  XY,
  CapitalItem,
  OperatingItem,
  CostBreakdown,
  CurvePoint,
  SensitivityEntry as SensitivityRow,
  BoundHit,
} from '@shared/schemas/results.ts'

/** A bare number in the case unit, or a value with its unit. */
export type Quantity = number | { value: number; unit: string }

export type EquilibriumModel = CaseInput['equilibrium']['model']

/** A design as answered by the API: priced when a cost basis applied. */
export type DesignResult = PricedDesign
export type OptimizeResult = OptimisationResult

export type { StudyRow, RunRow, OptionRow, StudyPermissions } from '@shared/schemas/studies.ts'
import type { StudyRow, RunRow, OptionRow, StudyPermissions } from '@shared/schemas/studies.ts'

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
