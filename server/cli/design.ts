/**
 * Command line: `npm run --silent design -- FILE.json`
 *
 * FILE holds one case, or { "cases": [...] } for a batch (output: an array in order).
 * An optional "costBasis" beside the case (or the cases) — a full cost basis or
 * { "preset": "name" } — prices each design: its summary gains totalAnnualCost and costBreakdown.
 * Prints the design JSON to stdout. Exit codes: 0 ok; 2 bad or infeasible input (message with
 * the field path on stderr); 1 other.
 *
 * The work is in runDesignFile / designOutput so other commands (e.g. with a cost basis)
 * can extend it.
 */
import { fileURLToPath } from 'node:url'
import { reportCliError } from './errors.ts'
import { evaluateBatch, evaluateCase, ENGINE_VERSION } from '../engine/index.ts'
import type { DesignResult } from '../engine/contract.ts'
import { priceDesign } from '../engine/costing/index.ts'
import { costBasisFrom, readCaseFile } from './input.ts'

export type DesignOutput = DesignResult | ReturnType<typeof evaluateBatch>

/** True when the parsed JSON is a batch ({ cases: [...] } or an array). */
export function isBatch(raw: unknown): boolean {
  return Array.isArray(raw) || (typeof raw === 'object' && raw !== null && 'cases' in raw)
}

/** Design output for parsed JSON (one case -> result; batch -> array of results). */
export function designOutput(raw: unknown): DesignOutput {
  const hasBasis = typeof raw === 'object' && raw !== null && !Array.isArray(raw) && 'costBasis' in raw
  const basis = hasBasis ? costBasisFrom((raw as { costBasis: unknown }).costBasis) : null
  const out = isBatch(raw) ? evaluateBatch(raw) : evaluateCase(raw)
  if (basis) {
    for (const r of Array.isArray(out) ? out : [out]) {
      if (!r || typeof r !== 'object' || !('summary' in r)) continue
      const priced = priceDesign(r as DesignResult, basis)
      Object.assign((r as DesignResult).summary, { totalAnnualCost: priced.totalAnnualCost, costBreakdown: priced.costBreakdown })
    }
  }
  return out
}

/**
 * JSON text of the output: one case pretty-printed; a batch as an array with one compact
 * result per line (valid JSON, and far smaller for large batches).
 */
export function formatOutput(result: DesignOutput): string {
  if (!Array.isArray(result)) return JSON.stringify(result, null, 2) + '\n'
  if (result.length === 0) return '[]\n'
  return '[\n' + result.map((r) => JSON.stringify(r)).join(',\n') + '\n]\n'
}

/** Run the command; returns the exit code. */
export function main(argv: string[], out: (s: string) => void = (s) => process.stdout.write(s), err: (s: string) => void = (s) => process.stderr.write(s)): number {
  const args = argv.filter((a) => a !== '--')
  if (args.length !== 1 || args[0] === '-h' || args[0] === '--help') {
    err(`usage: npm run --silent design -- FILE.json   (Scrubwright design engine ${ENGINE_VERSION})\n`)
    return args.length === 1 ? 0 : 2
  }
  try {
    const result = designOutput(readCaseFile(args[0]!))
    out(formatOutput(result))
    return 0
  } catch (e) {
    return reportCliError(e, err)
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  process.exitCode = main(process.argv.slice(2))
}
