import type * as UnitsModule from '@shared/units.ts'
import type { QuantityKind } from '@shared/units.ts'
import { capitalItemKeys, operatingItemKeys, costItemLabels } from '@shared/schemas/costBasis.ts'

/** Cost items of the cost model, in display order, with their kind (defined once, in the shared schema). */
export const CAPITAL_ITEMS = capitalItemKeys
export const OPERATING_ITEMS = operatingItemKeys
export const COST_ITEM_LABELS: Record<string, string> = costItemLabels

export function isCapitalItem(key: string): boolean {
  return (CAPITAL_ITEMS as readonly string[]).includes(key)
}

/** Sum of the capital (annualised) and operating parts of an item map. */
export function splitAnnual(annual: Record<string, number> | null | undefined): { capital: number; operating: number } {
  let capital = 0
  let operating = 0
  for (const [k, v] of Object.entries(annual ?? {})) {
    if (!Number.isFinite(v)) continue
    if (isCapitalItem(k)) capital += v
    else operating += v
  }
  return { capital, operating }
}

type UnitsLib = Pick<typeof UnitsModule, 'convert' | 'displayUnit'>

/** Quantity kind of each unit a cost correlation or an operating quantity may be written in. */
const SIZE_KINDS: [QuantityKind, string[]][] = [
  ['mass', ['kg', 'lb', 'lbm', 't', 'tonne']],
  ['length', ['m', 'ft', 'in', 'mm']],
  ['area', ['m^2', 'ft^2']],
  ['volume', ['m^3', 'gal', 'ft^3', 'L']],
  ['power', ['W', 'kW', 'hp']],
  ['gasVolumetricFlow', ['m^3/s', 'm^3/h', 'cfm', 'ft^3/min']],
  ['energy', ['kWh', 'J', 'MJ']],
]

/** A unit as written in a cost basis ('m3', 'gpm·ft^0.5') in the units library's spelling. */
export function libraryUnit(u: string): string {
  return u
    .trim()
    .replace(/·/g, ' ')
    .replace(/\bm([23])\b/g, 'm^$1')
    .replace(/\bft([23])\b/g, 'ft^$1')
}

function kindOf(unit: string): QuantityKind | null {
  for (const [kind, list] of SIZE_KINDS) if (list.includes(unit)) return kind
  return null
}

/** Display units of the pump's flow x head^0.5 size in each system. */
const FLOW_HEAD: Record<'SI' | 'US', [string, string]> = { SI: ['m^3/h', 'm'], US: ['gpm', 'ft'] }

export interface ShownSize {
  value: number
  /** Unit in the units library's spelling (typeset it with prettyUnit). */
  unit: string
  /** True when the value was converted from the correlation's own unit. */
  converted: boolean
}

/**
 * A cost-correlation size (or an operating quantity per year) in the person's unit system:
 * lb, ft, hp, gpm·ft^0.5 of a correlation become kg, m, kW, m³/h·m^0.5 in SI and the reverse in
 * US units. A unit the table does not know is shown as it is.
 */
export function sizeInSystem(value: number, unit: string, system: 'SI' | 'US', lib: UnitsLib | null): ShownSize {
  const same = { value, unit: libraryUnit(unit), converted: false }
  if (!lib || !Number.isFinite(value)) return same
  const u = libraryUnit(unit)
  const perYear = /\/yr$/.test(u)
  const base = perYear ? u.replace(/\/yr$/, '') : u
  const fh = /^(\S+) (\S+)\^0\.5$/.exec(base)
  try {
    if (fh && fh[1] && fh[2]) {
      const [q, h] = FLOW_HEAD[system]
      const v = value * lib.convert(1, fh[1], q) * Math.sqrt(lib.convert(1, fh[2], h))
      return { value: v, unit: `${q} ${h}^0.5`, converted: fh[1] !== q || fh[2] !== h }
    }
    const kind = kindOf(base)
    if (!kind) return same
    const to = lib.displayUnit(kind, system)
    const factor = lib.convert(1, base, to)
    if (factor === 1) return same
    return { value: value * factor, unit: perYear ? `${to}/yr` : to, converted: true }
  } catch {
    return same
  }
}
