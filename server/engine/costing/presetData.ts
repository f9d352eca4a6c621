/**
 * The cost-basis presets shipped with the product (data/cost-presets/*.json) as stored, by key.
 * Each is exactly what the shared cost-basis schema gives back for it (a test checks this), so a
 * reader that loads no schema (the design command's quick path) may price with them as they are;
 * everything else reads them through ./presets.ts.
 */
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import seider from '../../../data/cost-presets/seider-3rd-ce500.json' with { type: 'json' }
import turton from '../../../data/cost-presets/turton-3rd-cepci397.json' with { type: 'json' }
import cobaltRidge from '../../../data/cost-presets/halvard-cobalt-ridge.json' with { type: 'json' }
import marrowBay from '../../../data/cost-presets/halvard-marrow-bay.json' with { type: 'json' }

export const PRESET_DATA: Readonly<Record<string, unknown>> = {
  'seider-3rd-ce500': seider,
  'turton-3rd-cepci397': turton,
  'halvard-cobalt-ridge': cobaltRidge,
  'halvard-marrow-bay': marrowBay,
}

/** A shipped preset as stored (read-only: do not edit it), or undefined for an unknown key. */
export function presetAsStored(key: string): CostBasisData | undefined {
  return Object.prototype.hasOwnProperty.call(PRESET_DATA, key) ? (PRESET_DATA[key] as CostBasisData) : undefined
}
