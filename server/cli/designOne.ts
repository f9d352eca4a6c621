/**
 * One design as the design command prints it, and the command's quick path: a file holding one
 * plain case (bare numbers in the case units, known keys, every field rule kept; see
 * server/engine/caseParts/plainCase.ts) is read, designed and printed without loading the
 * schemas (zod), the batch machinery or the cost presets, so the command starts in node's own
 * start-up time. Anything else, and any case the engine refuses, goes the full way
 * (./design.ts), which gives the messages. Imports nothing that builds a schema.
 */
import type { DesignResult } from '../engine/contract.ts'
import type { DesignResult as PublicDesign } from '../../shared/schemas/results.ts'
import { designToPublic } from '../../shared/summaryUnits.ts'
import { quantityText } from '../../shared/quantityText.ts'
import { readPlainCase } from '../engine/caseParts/plainCase.ts'
import { COMPONENT_LIBRARY } from '../engine/caseParts/components.ts'
import { normaliseCase } from '../engine/case.ts'
import { designSI } from '../engine/design.ts'
import { priceDesign } from '../engine/costing/costDesign.ts'
import { presetAsStored } from '../engine/costing/presetData.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'

/** The engine's notes with their quantity tokens worded in SI, the case file's units (the same array when none has a token). */
export function wordedInSI<W extends { message: string }>(warnings: W[]): W[] {
  return warnings.some((w) => w.message.includes('{')) ? warnings.map((w) => ({ ...w, message: quantityText(w.message, 'SI') })) : warnings
}

/**
 * A design in the public units (kmol/h, kg/h, m3/h in the summary) with its notes worded; priced
 * (the summary gains totalAnnualCost and costBreakdown) when a cost basis is given.
 */
export function publicDesign(r: DesignResult, basis: CostBasisData | null = null): PublicDesign {
  const out = designToPublic(r)
  out.warnings = wordedInSI(out.warnings)
  if (basis) {
    const priced = priceDesign(r, basis)
    Object.assign(out.summary, { totalAnnualCost: priced.totalAnnualCost, costBreakdown: priced.costBreakdown })
  }
  return out
}

/** The cost basis of a { "preset": "key" } that names a shipped preset and nothing else; null otherwise. */
function plainPreset(v: unknown): CostBasisData | null {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) return null
  const keys = Object.keys(v)
  if (keys.length !== 1 || keys[0] !== 'preset') return null
  const key = (v as { preset: unknown }).preset
  return typeof key === 'string' ? (presetAsStored(key) ?? null) : null
}

/** The printed text of one design (what formatOutput gives for a single case). */
export function designText(d: PublicDesign): string {
  return JSON.stringify(d, null, 2) + '\n'
}

/**
 * The printed design of a file's text when it is one plain case, with no cost basis or one that
 * names a shipped preset alone, and the engine designs it; null otherwise (a batch, NDJSON, units,
 * a changed or full cost basis, anything refused), for the full path to answer.
 */
export function quickDesignText(text: string): string | null {
  let raw: unknown
  try {
    raw = JSON.parse(text) as unknown
  } catch {
    return null
  }
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw) || 'cases' in raw) return null
  let basis: CostBasisData | null = null
  if ('costBasis' in raw) {
    const { costBasis, ...rest } = raw as { costBasis: unknown }
    basis = plainPreset(costBasis)
    if (!basis) return null
    raw = rest
  }
  const input = readPlainCase(raw)
  if (!input) return null
  try {
    return designText(publicDesign(designSI(normaliseCase(input, COMPONENT_LIBRARY)), basis))
  } catch {
    return null
  }
}
