/**
 * Command line: `npm run --silent optimize -- FILE.json`
 *
 * FILE: { "case": {...}, "costBasis": {...} | { "preset": "name" } (omitted: the demo basis),
 *         "search": {...} (optional; every field has a default),
 *         "robust": { "confidence": 0.95, "uncertainty": {...} } (optional: the lowest expected cost
 *         that meets the recovery floor with that confidence, beside the nominal optimum) }
 * Prints { optimum, evaluations, curves, sensitivity, ... } as JSON on stdout.
 * Exit codes: 0 ok; 2 bad input (field path on stderr) or no feasible design (the reasons); 1 other.
 * Add --no-sensitivity to skip the tornado (faster).
 */
import { fileURLToPath } from 'node:url'
import { reportCliError } from './errors.ts'
import { caseToSI, InvalidInputError } from '../engine/index.ts'
import { optimise } from '../engine/optimisation/optimise.ts'
import type { OptimiseResult } from '../engine/optimisation/index.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import { readCaseFile, costBasisFrom, searchFrom, isObject } from './input.ts'
import { robustOptimum } from '../engine/uncertainty/robust.ts'
import { robustToPublic } from '../../shared/summaryUnits.ts'
import { invalidFromZod } from '../engine/index.ts'
import { robustSpecSchema } from '../../shared/schemas/uncertainty.ts'

/** The JSON printed by the command (the full design of the optimum is left out; see `design`). */
export function optimizeOutput(res: OptimiseResult, basis: CostBasisData) {
  const o = res.optimum
  return {
    optimum: {
      recovery: o.recovery,
      solventFactor: o.solventFactor,
      traySpacing: o.traySpacing,
      floodFraction: o.floodFraction,
      actualTrays: o.actualTrays,
      selectedDiameter: o.selectedDiameter,
      columnHeight: o.design.summary.columnHeight,
      totalAnnualCost: o.totalAnnualCost,
      breakdown: o.breakdown,
      checks: o.design.checks,
    },
    evaluations: res.evaluations,
    costBasis: { name: basis.name, currency: basis.general.currency, indexName: basis.general.indexName, targetIndex: basis.general.targetIndex, targetYear: basis.general.targetYear },
    bounds: res.bounds,
    curves: res.curves,
    sensitivity: res.sensitivity,
    stats: res.stats,
    cautions: res.cautions,
  }
}

/** Parse an optimize file and run the optimiser. */
export function runOptimizeFile(raw: unknown, opts: { sensitivity?: boolean } = {}) {
  if (!isObject(raw)) throw new InvalidInputError('', 'the file must hold a JSON object { "case", "costBasis", "search" }')
  if (!isObject(raw.case)) throw new InvalidInputError('case', 'required: the case to optimise (same fields as a design case)')
  // recovery and solvent factor are the optimiser's variables; a case may leave them out
  const caseRaw = { recovery: 0.95, solventFactor: 1.5, ...raw.case }
  const c = caseToSI(caseRaw, undefined, 'case.')
  const basis = costBasisFrom(raw.costBasis)
  const search = searchFrom(raw.search)
  if (opts.sensitivity === false) search.sensitivity = false
  for (const k of Object.keys(raw)) {
    if (!['case', 'costBasis', 'search', 'robust', 'name', 'description'].includes(k)) throw new InvalidInputError(k, 'unknown top-level field')
  }
  if (raw.robust === undefined) return optimizeOutput(optimise(c, basis, search), basis)
  // { "robust": { "confidence": 0.95, "uncertainty": {...} } }: the robust optimum beside the nominal one
  const r = robustSpecSchema.safeParse(raw.robust)
  if (!r.success) throw invalidFromZod(r.error, 'robust.')
  const res = optimise(c, basis, search)
  return { ...optimizeOutput(res, basis), robust: robustToPublic(robustOptimum(c, basis, search, res, r.data)) }
}

/** Run the command; returns the exit code. */
export function main(
  argv: string[],
  out: (s: string) => void = (s) => process.stdout.write(s),
  err: (s: string) => void = (s) => process.stderr.write(s),
): number {
  const flags = argv.filter((a) => a.startsWith('--') && a !== '--')
  const args = argv.filter((a) => !a.startsWith('--'))
  if (args.length !== 1 || args[0] === '-h') {
    err('usage: npm run --silent optimize -- FILE.json [--no-sensitivity]\n')
    return 2
  }
  try {
    const result = runOptimizeFile(readCaseFile(args[0]!), { sensitivity: !flags.includes('--no-sensitivity') })
    out(JSON.stringify(result, null, 2) + '\n')
    return 0
  } catch (e) {
    return reportCliError(e, err)
  }
}

// Run directly from source (tsx); the compiled command runs through bin/, where this module is bundled into the entry.
if (process.argv[1]?.endsWith('.ts') && fileURLToPath(import.meta.url) === process.argv[1]) {
  process.exitCode = main(process.argv.slice(2))
}
