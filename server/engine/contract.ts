/**
 * The contract between the design engine, the cost model, the optimiser and the API.
 * Everything is SI, the design summary included (molar flows in mol/s, mass flows in kg/s, the
 * solvent's volumetric flow in m^3/s). The public answer carries kmol/h, kg/h and m^3/h: the
 * edges (server/services/engine-gateway.ts, the command lines) convert with
 * shared/summaryUnits.ts.
 *
 * The design engine (server/engine/design.ts) produces a DesignResult; the cost model
 * (server/engine/costing/) reads only DesignSummary fields; the optimiser varies the
 * DesignVariables and calls the design engine.
 */

/**
 * The answer shapes (CheckResult, EngineWarning, DesignSummary, StageProfilePoint, DesignResult)
 * are defined once as zod schemas in shared/schemas/results.ts; the engine, the API, the OpenAPI
 * document and the client all take them from there. Inside the engine, DesignSummary and
 * DesignResult are their SI forms (same keys; shared/summaryUnits.ts).
 */
export type { CheckResult, EngineWarning, StageProfilePoint } from '../../shared/schemas/results.ts'
export type { DesignSummarySI as DesignSummary, DesignResultSI as DesignResult } from '../../shared/summaryUnits.ts'
import type { DesignSummarySI } from '../../shared/summaryUnits.ts'
import type { DesignSummary as SummaryFields } from '../../shared/schemas/results.ts'

/** Mark a summary the engine built in SI as such (a type-only brand; nothing happens at run time). */
export function summaryInSI(s: SummaryFields): DesignSummarySI {
  return s as DesignSummarySI
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
