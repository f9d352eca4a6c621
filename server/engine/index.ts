/**
 * Engine entry points: parse (zod) -> normalise (units, library) -> design.
 */
import { z } from 'zod'
import { batchSchema, caseSchema, type CaseInput } from '../../shared/schemas/case.ts'
import type { DesignResult, DesignVariables } from './contract.ts'
import { normaliseCase, mergeLibraries, type CaseSI, type ComponentLibrary } from './case.ts'
import { designSI, type DesignOptions } from './design.ts'
import { InvalidInputError } from './errors.ts'
import { readPlainCase } from './caseParts/plainCase.ts'
import { COMPONENT_LIBRARY } from './caseParts/components.ts'

export { ENGINE_VERSION } from './version.ts'

export { COMPONENT_LIBRARY }

function zodPath(path: PropertyKey[]): string {
  return path.map((p) => String(p)).join('.')
}

/** Turn a zod error into an InvalidInputError (first issue as path/reason, all as issues). */
export function invalidFromZod(err: z.ZodError, prefix = ''): InvalidInputError {
  const issues = err.issues.map((i) => {
    const path = prefix + zodPath(i.path)
    return { path, code: 'invalidInput', message: i.message }
  })
  const first = issues[0] ?? { path: prefix.replace(/\.$/, ''), code: 'invalidInput', message: 'invalid input' }
  return new InvalidInputError(first.path, first.message, issues)
}

/**
 * Parse a raw case (unknown JSON) with the shared schema. A plain case (bare numbers, known keys,
 * every rule kept) is read without zod, to the same result (caseParts/plainCase.ts).
 */
export function parseCase(raw: unknown, prefix = ''): CaseInput {
  const plain = readPlainCase(raw)
  if (plain) return plain
  const r = caseSchema.safeParse(raw)
  if (!r.success) throw invalidFromZod(r.error, prefix)
  return r.data
}

export interface EvaluateOptions extends DesignOptions {
  /** Site components added to (or replacing) the library entries. */
  library?: ComponentLibrary
  vars?: Partial<DesignVariables>
}

/** Parse and normalise a raw case to SI. */
export function caseToSI(raw: unknown, opts?: { library?: ComponentLibrary }, prefix = ''): CaseSI {
  const input = parseCase(raw, prefix)
  const lib = mergeLibraries(COMPONENT_LIBRARY, opts?.library)
  try {
    return normaliseCase(input, lib)
  } catch (e) {
    if (e instanceof InvalidInputError && prefix) {
      throw new InvalidInputError(prefix + e.path, e.reason, e.issues.map((i) => ({ ...i, path: prefix + i.path })))
    }
    throw e
  }
}

/**
 * Evaluate one raw case: zod parse -> normalise -> design.
 * @throws InvalidInputError | InfeasibleDesignError | ConvergenceError
 */
export function evaluateCase(raw: unknown, opts?: EvaluateOptions): DesignResult {
  const c = caseToSI(raw, opts)
  return designSI(c, opts?.vars, opts)
}

/**
 * Evaluate a batch { cases: [...] } (or a bare array). Results in order. The first
 * invalid case throws (with the path prefixed by cases.<i>), since a batch is one input.
 * Infeasible cases also throw unless `collectErrors` is set, in which case their
 * slot holds { error: { code, issues } }.
 */
export function evaluateBatch(
  raw: unknown,
  opts?: EvaluateOptions & { collectErrors?: boolean },
): (DesignResult | { error: { code: string; message: string; issues: unknown[] } })[] {
  const list = Array.isArray(raw) ? { cases: raw } : raw
  const r = batchSchema.safeParse(list)
  if (!r.success) throw invalidFromZod(r.error)
  const lib = mergeLibraries(COMPONENT_LIBRARY, opts?.library)
  const out: (DesignResult | { error: { code: string; message: string; issues: unknown[] } })[] = []
  r.data.cases.forEach((input, i) => {
    let c: CaseSI
    try {
      c = normaliseCase(input, lib)
    } catch (e) {
      if (e instanceof InvalidInputError) {
        throw new InvalidInputError(`cases.${i}.${e.path}`, e.reason, e.issues.map((x) => ({ ...x, path: `cases.${i}.${x.path}` })))
      }
      throw e
    }
    if (opts?.collectErrors) {
      try {
        out.push(designSI(c, opts?.vars, opts))
      } catch (e) {
        const err = e as Error & { code?: string; issues?: unknown[] }
        if (err.code) out.push({ error: { code: err.code, message: err.message, issues: err.issues ?? [] } })
        else throw e
      }
    } else out.push(designSI(c, opts?.vars, opts))
  })
  return out
}

export { designSI, normaliseCase }
export type { CaseSI, DesignResult, DesignVariables }
export * from './errors.ts'
