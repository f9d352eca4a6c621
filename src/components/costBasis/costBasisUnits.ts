import type * as UnitsModule from '@shared/units.ts'
import { costBasisFieldKinds } from '@shared/schemas/costBasis.ts'
import { prettyUnit } from '@/utils/unitLabel.ts'

type UnitsLib = Pick<typeof UnitsModule, 'fromSI' | 'displayUnit' | 'priceScale' | 'priceBasis' | 'convert'>

export interface FieldDisplay {
  /** Shown number = stored number × scale. */
  scale: number
  /** Unit typeset for people, e.g. 'USD/1000 gal', 'psig', 'mm'. */
  unit: string
}

/**
 * How a cost-basis field with a physical unit is shown in a unit system: the scale from the
 * stored SI number and the unit label. Null for fields without a kind (dimensionless, or in a
 * correlation's own units) or before the units library is loaded.
 */
export function costBasisFieldDisplay(path: string, system: 'SI' | 'US', currency: string, lib: UnitsLib | null): FieldDisplay | null {
  const k = costBasisFieldKinds[path]
  if (!k || !lib) return null
  const cur = currency || 'currency'
  if (k.price) {
    const b = lib.priceBasis(k.price, system)
    return { scale: lib.priceScale(k.price, system), unit: `${cur}/${b.count === 1 ? '' : `${b.count.toLocaleString('en-US')} `}${prettyUnit(b.unit)}` }
  }
  if (k.quantity) {
    const unit = lib.displayUnit(k.quantity, system)
    const gauge = k.quantity === 'pressureGauge'
    return { scale: lib.fromSI(k.quantity, 1, unit), unit: gauge ? (unit === 'psi' ? 'psig' : `${prettyUnit(unit)} (gauge)`) : prettyUnit(unit) }
  }
  return null
}

/** The solvent price per US gallon, shown beside the price per 1000 gal. */
export function perGallon(pricePerM3: number, lib: Pick<typeof UnitsModule, 'convert'>): number {
  return pricePerM3 * lib.convert(1, 'gal', 'm^3')
}
