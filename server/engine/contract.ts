/**
 * The contract between the design engine, the cost model, the optimiser and the API.
 * Everything is SI unless the name says otherwise (molar flows in kmol/h as the
 * product's public convention; see each field).
 *
 * The design engine (server/engine/design.ts) produces a DesignResult; the cost model
 * (server/engine/costing/) reads only DesignSummary fields; the optimiser varies the
 * DesignVariables and calls the design engine.
 */

/**
 * The answer shapes (CheckResult, EngineWarning, DesignSummary, StageProfilePoint, DesignResult)
 * are defined once as zod schemas in shared/schemas/results.ts; the engine, the API, the OpenAPI
 * document and the client all take them from there.
 */
export type { CheckResult, EngineWarning, DesignSummary, StageProfilePoint, DesignResult } from '../../shared/schemas/results.ts'

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
