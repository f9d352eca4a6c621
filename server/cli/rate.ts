/**
 * Command line: `npm run --silent rate -- FILE.json`
 *
 * FILE holds one rating case (a design case without recovery and solventFactor, plus the
 * as-built `column` and the `solventFlow`), or { "cases": [...] } for a batch (output: an
 * array in order). Prints the rating JSON to stdout. Exit codes: 0 ok; 2 bad or infeasible
 * input (message with the field path on stderr); 1 other.
 *
 * Same structure as design.ts: the work is in rateOutput / formatOutput.
 */
import { fileURLToPath } from 'node:url'
import { reportCliError } from './errors.ts'
import { ENGINE_VERSION } from '../engine/index.ts'
import { isRateBatch, rateBatch, rateCase } from '../engine/rating/index.ts'
import type { RatingResult } from '../../shared/schemas/rating.ts'
import { readCaseFile } from './input.ts'

export type RateOutput = RatingResult | RatingResult[]

/** Rating output for parsed JSON (one case -> result; batch -> array of results). */
export function rateOutput(raw: unknown): RateOutput {
  return isRateBatch(raw) ? rateBatch(raw) : rateCase(raw)
}

/** JSON text: one case pretty-printed; a batch as an array with one compact result per line. */
export function formatOutput(result: RateOutput): string {
  if (!Array.isArray(result)) return JSON.stringify(result, null, 2) + '\n'
  if (result.length === 0) return '[]\n'
  return '[\n' + result.map((r) => JSON.stringify(r)).join(',\n') + '\n]\n'
}

/** Run the command; returns the exit code. */
export function main(argv: string[], out: (s: string) => void = (s) => process.stdout.write(s), err: (s: string) => void = (s) => process.stderr.write(s)): number {
  const args = argv.filter((a) => a !== '--')
  if (args.length !== 1 || args[0] === '-h' || args[0] === '--help') {
    err(`usage: npm run --silent rate -- FILE.json   (Scrubwright rating engine ${ENGINE_VERSION})\n`)
    return args.length === 1 ? 0 : 2
  }
  try {
    out(formatOutput(rateOutput(readCaseFile(args[0]!))))
    return 0
  } catch (e) {
    return reportCliError(e, err)
  }
}

// Run directly from source (tsx); the compiled command runs through bin/, where this module is bundled into the entry.
if (process.argv[1]?.endsWith('.ts') && fileURLToPath(import.meta.url) === process.argv[1]) {
  process.exitCode = main(process.argv.slice(2))
}
