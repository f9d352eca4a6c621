/**
 * Command line: `npm run --silent uncertainty -- FILE.json`
 *
 * FILE: { "case": {...}, "costBasis": {...} | { "preset": "name" } (omitted: the demo basis),
 *         "search": { "emissionLimit": kg/h } (optional: the target becomes the release limit),
 *         "uncertainty": { "samples", "seed", "K", "efficiency", "gasFlow", ... } (optional) }
 * The case is designed at nominal values; the built column is rated in every sample. Prints
 * { probabilityMeetsTarget, probabilityFlooding, recovery, percentFlood, totalAnnualCost,
 * contributions, histogram, ... } as JSON on stdout.
 * Exit codes: 0 ok; 2 bad input (field path on stderr) or no nominal design; 1 other.
 */
import { fileURLToPath } from 'node:url'
import { reportCliError } from './errors.ts'
import { caseToSI, InvalidInputError } from '../engine/index.ts'
import { parseUncertainty, uncertaintySI } from '../engine/uncertainty/index.ts'
import type { UncertaintyResult } from '../../shared/schemas/uncertainty.ts'
import { uncertaintyToPublic } from '../../shared/summaryUnits.ts'
import { readCaseFile, costBasisFrom, searchFrom, isObject } from './input.ts'

/** Parse an uncertainty file and propagate. */
export function runUncertaintyFile(raw: unknown): UncertaintyResult {
  if (!isObject(raw)) throw new InvalidInputError('', 'the file must hold a JSON object { "case", "costBasis", "uncertainty" }')
  if (!isObject(raw.case)) throw new InvalidInputError('case', 'required: the case to design and rate (same fields as a design case)')
  for (const k of Object.keys(raw)) {
    if (!['case', 'costBasis', 'search', 'uncertainty', 'name', 'description'].includes(k)) throw new InvalidInputError(k, 'unknown top-level field')
  }
  const c = caseToSI(raw.case, undefined, 'case.')
  const basis = costBasisFrom(raw.costBasis)
  const search = searchFrom(raw.search)
  return uncertaintyToPublic(uncertaintySI(c, basis, parseUncertainty(raw.uncertainty), search.emissionLimit))
}

/** Run the command; returns the exit code. */
export function main(argv: string[], out: (s: string) => void = (s) => process.stdout.write(s), err: (s: string) => void = (s) => process.stderr.write(s)): number {
  const args = argv.filter((a) => a !== '--')
  if (args.length !== 1 || args[0] === '-h' || args[0] === '--help') {
    err('usage: npm run --silent uncertainty -- FILE.json\n')
    return args.length === 1 ? 0 : 2
  }
  try {
    out(JSON.stringify(runUncertaintyFile(readCaseFile(args[0]!)), null, 2) + '\n')
    return 0
  } catch (e) {
    return reportCliError(e, err)
  }
}

// Run directly from source (tsx); the compiled command runs through bin/, where this module is bundled into the entry.
if (process.argv[1]?.endsWith('.ts') && fileURLToPath(import.meta.url) === process.argv[1]) {
  process.exitCode = main(process.argv.slice(2))
}
