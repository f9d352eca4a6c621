/**
 * One slot per case of a batch: the design (or only its summary), or the reason the case was
 * refused, in the error shape of the API: { error: { code, message, issues: [{ path, message }] } }.
 * A refused case never stops the others. Faults (anything that is not an engine error) are
 * thrown: they are bugs, not answers.
 */
import { parseCase, COMPONENT_LIBRARY } from '../index.ts'
import { mergeLibraries, normaliseCase, type ComponentLibrary } from '../case.ts'
import { designSI } from '../design.ts'
import { InvalidInputError, InfeasibleDesignError, ConvergenceError } from '../errors.ts'
import type { DesignResult } from '../contract.ts'

export interface SlotIssue {
  path: string
  message: string
}
export interface ErrorSlot {
  error: { code: string; message: string; issues: SlotIssue[] }
}
export type Slot = { ok: true; value: DesignResult | { summary: DesignResult['summary'] } } | { ok: false; value: ErrorSlot }

/** The error slot of an engine error (paths prefixed, e.g. "cases.3."), or null for a fault. */
export function errorSlot(e: unknown, prefix: string): ErrorSlot | null {
  const issues = (list: { path: string; message: string }[]) => list.map((i) => ({ path: i.path ? prefix + i.path : prefix.replace(/\.$/, ''), message: i.message }))
  if (e instanceof InvalidInputError) return { error: { code: e.code, message: e.path ? `${prefix}${e.path}: ${e.reason}` : e.reason, issues: issues(e.issues) } }
  if (e instanceof InfeasibleDesignError) return { error: { code: e.code, message: 'No design satisfies this case.', issues: issues(e.issues) } }
  if (e instanceof ConvergenceError) return { error: { code: e.code, message: e.message, issues: [{ path: prefix.replace(/\.$/, ''), message: e.message }] } }
  return null
}

/** The slot of text that is not JSON (an NDJSON line that does not parse). */
export function invalidJsonSlot(message: string, path: string): ErrorSlot {
  return { error: { code: 'invalidJson', message: `${path}: not valid JSON (${message})`, issues: [{ path, message: `not valid JSON: ${message}` }] } }
}

export interface SlotContext {
  /** The component library (built-in merged with a site's own), merged once for the batch. */
  library: ComponentLibrary
  /** Adds prices to a design (a cost basis), if any. */
  price?: (d: DesignResult) => void
  /** Keep only the summary of each design. */
  summaryOnly?: boolean
}

/** A context with the built-in library (plus a site's components). */
export function slotContext(opts: { library?: ComponentLibrary; price?: (d: DesignResult) => void; summaryOnly?: boolean } = {}): SlotContext {
  return { library: mergeLibraries(COMPONENT_LIBRARY, opts.library), price: opts.price, summaryOnly: opts.summaryOnly }
}

/** Design one raw case of a batch into its slot. */
export function caseSlot(raw: unknown, prefix: string, ctx: SlotContext): Slot {
  try {
    const c = normaliseCase(parseCase(raw), ctx.library)
    const d = designSI(c)
    ctx.price?.(d)
    return { ok: true, value: ctx.summaryOnly ? { summary: d.summary } : d }
  } catch (e) {
    const slot = errorSlot(e, prefix)
    if (!slot) throw e
    return { ok: false, value: slot }
  }
}
