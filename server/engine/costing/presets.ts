/**
 * Cost-basis presets shipped with the product (data/cost-presets/*.json, ./presetData.ts), parsed
 * with the shared schema. JSON imports keep the engine free of file I/O.
 */
import { costBasisSchema, type CostBasisData } from '../../../shared/schemas/costBasis.ts'
import { PRESET_DATA as raw } from './presetData.ts'

/** The preset used when a request names none: the Cobalt Ridge demo basis. */
export const DEFAULT_PRESET = 'halvard-cobalt-ridge'

const cache = new Map<string, CostBasisData>()

export interface PresetInfo {
  key: string
  name: string
  indexName: string
  targetIndex: number
  targetYear: string
  currency: string
}

/** Keys and names of the shipped presets. */
export function listPresets(): PresetInfo[] {
  return Object.keys(raw).map((key) => {
    const b = loadPreset(key)
    return {
      key,
      name: b.name,
      indexName: b.general.indexName,
      targetIndex: b.general.targetIndex,
      targetYear: b.general.targetYear,
      currency: b.general.currency,
    }
  })
}

/** A preset by key, parsed and validated; a fresh deep copy each call (callers may edit it). */
export function loadPreset(key: string): CostBasisData {
  let b = cache.get(key)
  if (!b) {
    const r = hasPreset(key) ? raw[key] : undefined
    if (r === undefined) {
      throw new RangeError(`Unknown cost preset '${key}'. Known: ${Object.keys(raw).join(', ')}`)
    }
    b = costBasisSchema.parse(r)
    cache.set(key, b)
  }
  return structuredClone(b)
}

/** Is this a known preset key? */
export function hasPreset(key: string): boolean {
  return Object.prototype.hasOwnProperty.call(raw, key)
}
