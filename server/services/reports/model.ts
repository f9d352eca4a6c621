import type { DesignSummary } from '../../../shared/schemas/results.ts'
import type { OptionRow } from '../../../shared/schemas/studies.ts'
import type { ConfidenceSection } from './confidence.ts'
import type { UnitSystem } from './units.ts'

/**
 * The report's data model: gathered by ../reports.ts (numbers already in the reader's unit
 * system, labels as on screen), rendered by ./pdf.ts and ./xlsx.ts.
 */
export interface RunMeta {
  id: number
  kind: 'design' | 'optimize'
  createdAt: Date
  createdByName: string | null
  costBasisVersion: number | null
  engineVersion: string
}

/** One labelled value in its display unit; `digits` are the significant digits shown (the workbook keeps them all). */
export interface Row {
  key: string
  label: string
  value: number | string | null
  unit: string
  digits?: number
}

/** Rows under a title, as the screens group them. */
export interface RowGroup {
  title: string
  rows: Row[]
}

export interface CheckRow {
  key: string
  label: string
  value: number
  limit: number
  direction: 'max' | 'min' | null
  unit: string
  status: 'pass' | 'warn' | 'fail'
  advice: string | null
}

export interface CostRow {
  key: string
  label: string
  kind: 'capital' | 'operating'
  size: number
  sizeUnit: string
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

/** The stage construction of the design: mole fractions (the same in every unit system). */
export interface ProfilePart {
  methodNote: string
  theoreticalStages: number
  lastStageFraction: number
  stages: { stage: number; x: number; y: number }[]
  equilibrium: { x: number; y: number }[]
  operating: { x: number; y: number }[]
}

/** One logged month of the approved design, rated and priced, with its cost gap split into causes. */
export interface OperatingMonth {
  month: string
  gasFlow: number // display unit
  solventFlow: number // display unit
  solventNeeded: number | null // display unit
  expectedRecovery: number // %
  measuredRecovery: number | null // %
  achievedEfficiency: number | null // %
  designEfficiency: number // %
  percentFlood: number
  insideWindow: boolean
  outside: string[]
  /** Costs of the month (currency). */
  reference: number | null
  actual: number
  gap: number | null
  prices: number | null
  throughput: number | null
  excessSolvent: number | null
  efficiencyLoss: number | null
  other: number | null
}

export interface OperatingPart {
  designRunId: number
  costBasisVersion: number | null
  flowUnit: string
  months: OperatingMonth[]
  drift: string | null
  issue: string | null
  toDate: { actual: number; reference: number; gap: number }
}

/**
 * A section another part of the product adds to the report (e.g. the confidence of a result):
 * rendered after the operating log in the PDF and as its own sheet in the workbook.
 */
export interface ReportSection {
  key: string
  title: string
  notes: string[]
  columns: { title: string; unit?: string }[]
  rows: (number | string | null)[][]
}

export interface ReportModel {
  generatedAt: Date
  generatedBy: string
  unitSystem: UnitSystem
  /** The cost-basis version in force on the report date (the runs keep the version they were priced with). */
  costBasisInForce: { version: number; effectiveDate: string | null } | null
  site: { id: number; name: string }
  study: { id: number; name: string; description: string; status: string; revision: number; ownerName: string; updatedAt: Date }
  /** The vendor-enquiry numbers, on the first page. */
  dataSheet: RowGroup[]
  inputs: RowGroup[]
  inputsNote: string | null
  design: { run: RunMeta; source: string; groups: RowGroup[]; raw: DesignSummary; checks: CheckRow[]; warnings: string[] } | null
  profile: ProfilePart | null
  costs: { currency: string; costIndex: number; rows: CostRow[]; annualisedCapital: number; operatingCost: number; totalAnnualCost: number; costPerKgRecovered: number; soluteRecoveredPerYear: number; capitalRecoveryFactor: number; installedCapital: number } | null
  optimise: { run: RunMeta; rows: Row[]; totalAnnualCost: number; evaluations: number } | null
  curves: CurveSeries[]
  currency: string
  options: (OptionRow & { tac: number | null; diameter: number | null })[]
  recommendedOptionId: number | null
  operating: OperatingPart | null
  /** Sections added by other features; empty when none. */
  sections: ReportSection[]
  review: ReviewRow[]
  cautions: string[]
  /** The chance the design meets its target (./confidence.ts); null when the inputs give no design. */
  confidence?: ConfidenceSection | null
}

/** The causes a month's cost gap is split into, in the order shown. */
export const COST_GAP_PARTS = [
  { key: 'throughput', label: 'Throughput' },
  { key: 'excessSolvent', label: 'Solvent beyond need' },
  { key: 'efficiencyLoss', label: 'Efficiency loss' },
  { key: 'prices', label: 'Prices' },
  { key: 'other', label: 'Other' },
] as const satisfies readonly { key: keyof OperatingMonth; label: string }[]

/** Review events in words. */
export const REVIEW_WORDS: Record<string, string> = { comment: 'Comment', submit: 'Submitted for review', approve: 'Approved', return: 'Returned for changes', reopen: 'Reopened' }
