/**
 * Quantities inside the engine's words (advice, notes). A quantity is written as a token
 * `{kind:SI value}`, e.g. `{smallLength:0.4572}`, never with a unit of its own: the edge words it
 * in the reader's unit system (shared/quantityText.ts, used by the client, the report and the
 * command lines). The kinds are those of shared/units.ts.
 */
export type WordKind = 'length' | 'smallLength'

/** The token for an SI value of a kind [m for both length kinds]. */
export function quantityToken(kind: WordKind, valueSI: number): string {
  return `{${kind}:${valueSI}}`
}
