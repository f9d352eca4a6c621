/**
 * Quantities inside words. The engine writes a quantity in a sentence (advice, a note) as a token
 * `{kind:value}`: the value in SI of a quantity kind of ./units.ts, e.g. `{smallLength:0.4572}`.
 * The engine writes them (server/engine/words.ts); the edge (the client, the report) words it in the reader's unit system with quantityText:
 * '18 in' or '457.2 mm'. Text without tokens passes unchanged. Imports only ./units.ts and ./unitText.ts.
 */
import { QUANTITY_KINDS, displayUnit, fromSI, type QuantityKind } from './units.ts'
import { prettyUnit } from './unitText.ts'

/** Words with `{kind:SI value}` tokens, each quantity in the display unit of the system (4 significant digits). */
export function quantityText(text: string, system: 'SI' | 'US', digits = 4): string {
  return text.replace(/\{(\w+):(-?\d+(?:\.\d+)?(?:e[-+]?\d+)?)\}/g, (all, kind: string, v: string) => {
    if (!(kind in QUANTITY_KINDS)) return all
    const k = kind as QuantityKind
    const unit = displayUnit(k, system)
    const n = fromSI(k, Number(v), unit)
    return `${String(Number(n.toPrecision(digits)))} ${prettyUnit(unit)}`
  })
}
