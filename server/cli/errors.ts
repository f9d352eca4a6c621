import { InvalidInputError, InfeasibleDesignError, ConvergenceError } from '../engine/errors.ts'
import { NoFeasibleDesignError } from '../engine/optimisation/index.ts'

/**
 * The command lines' error report: the reason on stderr and the exit code.
 * 2: bad input (field paths) or valid input that no design satisfies (structured reasons);
 * 1: anything else (a fault: the stack is printed).
 */
export function reportCliError(e: unknown, err: (s: string) => void): number {
  if (e instanceof InvalidInputError) {
    err(`invalid input: ${e.message}\n`)
    for (const i of e.issues.slice(1, 10)) err(`  ${i.path}: ${i.message}\n`)
    return 2
  }
  if (e instanceof InfeasibleDesignError) {
    err('infeasible design:\n')
    for (const i of e.issues) err(`  ${i.path} [${i.code}]: ${i.message}\n`)
    return 2
  }
  if (e instanceof NoFeasibleDesignError) {
    err(`no feasible design: ${e.message}\n`)
    for (const r of e.reasons.slice(0, 10)) err(`  ${r}\n`)
    return 2
  }
  if (e instanceof ConvergenceError) {
    err(`no convergence: ${e.message}\n`)
    return 2
  }
  err(`error: ${(e as Error).stack ?? String(e)}\n`)
  return 1
}
