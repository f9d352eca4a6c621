/**
 * Typed errors of the design engine. The API maps InvalidInputError -> 400,
 * InfeasibleDesignError -> 422, ConvergenceError -> 422 (or 500 when unexpected).
 */
import type { EngineIssue } from './contract.ts'

/** Bad input: a missing, negative or out-of-range number, an unknown unit or component. */
export class InvalidInputError extends Error {
  readonly code = 'invalidInput'
  readonly path: string
  readonly reason: string
  /** All problems found (the first is also in path/reason). */
  readonly issues: EngineIssue[]
  constructor(path: string, reason: string, issues?: EngineIssue[]) {
    super(path ? `${path}: ${reason}` : reason)
    this.name = 'InvalidInputError'
    this.path = path
    this.reason = reason
    this.issues = issues ?? [{ path, code: 'invalidInput', message: reason }]
  }
}

/** The inputs are valid but no design satisfies them (below minimum solvent, flooding ...). */
export class InfeasibleDesignError extends Error {
  readonly code = 'infeasibleDesign'
  readonly issues: EngineIssue[]
  constructor(issues: EngineIssue[]) {
    super(issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join('; '))
    this.name = 'InfeasibleDesignError'
    this.issues = issues
  }
}

/** An iterative solver did not converge. */
export class ConvergenceError extends Error {
  readonly code = 'convergence'
  readonly iterations: number
  readonly residual: number
  constructor(message: string, iterations: number, residual: number) {
    super(`${message} (after ${iterations} iterations, residual ${residual})`)
    this.name = 'ConvergenceError'
    this.iterations = iterations
    this.residual = Number.isFinite(residual) ? residual : Number.MAX_VALUE
  }
}

export function infeasible(path: string, code: string, message: string): InfeasibleDesignError {
  return new InfeasibleDesignError([{ path, code, message }])
}

export function isEngineError(e: unknown): e is InvalidInputError | InfeasibleDesignError | ConvergenceError {
  return e instanceof InvalidInputError || e instanceof InfeasibleDesignError || e instanceof ConvergenceError
}
