import type { DesignSummary, CheckResult } from '../../../shared/schemas/results.ts'
import type { OptionRow } from '../../../shared/schemas/studies.ts'

/** The report's data model: gathered by ../reports.ts, rendered by ./pdf.ts and ./xlsx.ts. */
export interface RunMeta {
  id: number
  kind: 'design' | 'optimize'
  createdAt: Date
  createdByName: string | null
  costBasisVersion: number | null
  engineVersion: string
}

export interface ValueRow {
  key: string
  label: string
  value: number | string
  unit: string
}

export interface CostRow {
  key: string
  label: string
  kind: 'capital' | 'operating'
  size: string
  purchased: number | null
  installed: number | null
  annual: number
}

export interface CurveSeries {
  key: 'recovery' | 'solventFactor'
  title: string
  xLabel: string
  xUnit: string
  /** x in display units (recovery in %), TAC and its capital / operating parts per year. */
  points: { x: number; tac: number; capital: number; operating: number; actualTrays: number | null }[]
  infeasible: number
  optimumX: number
  optimumTac: number
}

export interface ReviewRow {
  kind: string
  who: string
  at: Date
  body: string
}

export interface ReportModel {
  generatedAt: Date
  generatedBy: string
  /** The cost-basis version in force on the report date (the runs keep the version they were priced with). */
  costBasisInForce: { version: number; effectiveDate: string | null } | null
  site: { id: number; name: string }
  study: { id: number; name: string; description: string; status: string; revision: number; ownerName: string; updatedAt: Date }
  inputs: ValueRow[]
  inputsNote: string | null
  design: { run: RunMeta; source: string; summary: ValueRow[]; raw: DesignSummary; checks: CheckResult[]; warnings: string[] } | null
  costs: { currency: string; costIndex: number; rows: CostRow[]; annualisedCapital: number; operatingCost: number; totalAnnualCost: number; costPerKgRecovered: number; soluteRecoveredPerYear: number; capitalRecoveryFactor: number; installedCapital: number } | null
  optimise: { run: RunMeta; recovery: number; solventFactor: number; traySpacing: number; floodFraction: number; actualTrays: number; selectedDiameter: number; totalAnnualCost: number; evaluations: number } | null
  curves: CurveSeries[]
  currency: string
  options: (OptionRow & { tac: number | null })[]
  recommendedOptionId: number | null
  review: ReviewRow[]
  cautions: string[]
}
