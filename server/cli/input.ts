/**
 * What both command lines read: the case file, the cost basis of a file (full, a preset, or a
 * preset with changes) and the search settings. Errors are the engine's InvalidInputError with
 * the field path, reported by ./errors.ts.
 */
import { readFileSync } from 'node:fs'
import { InvalidInputError, invalidFromZod } from '../engine/index.ts'
import { DEFAULT_PRESET, hasPreset, listPresets, loadPreset } from '../engine/costing/presets.ts'
import { costBasisSchema, type CostBasisData } from '../../shared/schemas/costBasis.ts'
import { searchSpecSchema, type SearchSpec } from '../../shared/schemas/search.ts'

/** The JSON of a case file; a missing file or bad JSON is an InvalidInputError. */
export function readCaseFile(file: string): unknown {
  let text: string
  try {
    text = readFileSync(file, 'utf8')
  } catch (e) {
    throw new InvalidInputError('', `cannot read ${file}: ${(e as Error).message}`)
  }
  try {
    return JSON.parse(text) as unknown
  } catch (e) {
    throw new InvalidInputError('', `${file} is not valid JSON: ${(e as Error).message}`)
  }
}

export function isObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v)
}

/** Objects merged key by key (arrays and values replaced). */
function deepMerge(base: unknown, over: unknown): unknown {
  if (!isObject(base) || !isObject(over)) return over
  const out: Record<string, unknown> = { ...base }
  for (const [k, v] of Object.entries(over)) out[k] = k in base ? deepMerge(base[k], v) : v
  return out
}

/**
 * The cost basis of an optimize file: a full object; { "preset": "key" }; a preset with changes
 * ({ "preset": "key", "utilities": { "electricityPrice": 0.1 } }, merged field by field); or
 * omitted (the demo basis).
 */
export function costBasisFrom(raw: unknown): CostBasisData {
  if (raw === undefined) return loadPreset(DEFAULT_PRESET)
  if (isObject(raw) && 'preset' in raw) {
    const { preset, ...changes } = raw
    if (typeof preset !== 'string' || !hasPreset(preset)) {
      throw new InvalidInputError('costBasis.preset', `unknown preset '${String(preset)}'; known: ${listPresets().map((p) => p.key).join(', ')}`)
    }
    if (Object.keys(changes).length === 0) return loadPreset(preset)
    raw = deepMerge(loadPreset(preset), changes)
  }
  const r = costBasisSchema.safeParse(raw)
  if (!r.success) throw invalidFromZod(r.error, 'costBasis.')
  return r.data
}

/** The search spec of an optimize file (defaults for what is omitted). */
export function searchFrom(raw: unknown): SearchSpec {
  const r = searchSpecSchema.safeParse(raw ?? {})
  if (!r.success) throw invalidFromZod(r.error, 'search.')
  return r.data
}
