import { displayUnit, fromSI, toSI, type QuantityInput, type QuantityKind } from '../../../shared/units.ts'
import type { Row } from './model.ts'

export type UnitSystem = 'SI' | 'US'

/** A units-library unit typeset for people, as the screens show it: m^3/h -> m³/h, degC -> °C. */
export function prettyUnit(unit: string): string {
  return unit
    .replace(/degC/g, '°C')
    .replace(/degF/g, '°F')
    .replace(/\^2/g, '²')
    .replace(/\^3/g, '³')
    .replace(/lbm\b/g, 'lb')
    .replace(/ s\b/g, '·s')
}

/**
 * Report values in the reader's unit system: SI numbers (or case quantities) to the display
 * unit of their kind, with the unit spelled as on screen.
 */
export class DisplayUnits {
  constructor(readonly system: UnitSystem) {}

  unit(kind: QuantityKind): string {
    return prettyUnit(displayUnit(kind, this.system))
  }

  fromSI(kind: QuantityKind, valueSI: number): number {
    return fromSI(kind, valueSI, displayUnit(kind, this.system))
  }

  /** A quantity in a named unit (e.g. the engine's 'kmol/h') to the display unit. */
  from(kind: QuantityKind, value: number, unit: string): number {
    return this.fromSI(kind, toSI(kind, { value, unit }))
  }

  /** A case-file quantity (bare number in the case unit, or value + unit) to the display unit; null when it does not convert. */
  fromCase(kind: QuantityKind, q: QuantityInput): number | null {
    try {
      return this.fromSI(kind, toSI(kind, q))
    } catch {
      return null
    }
  }

  /** A report row of an SI value. */
  row(key: string, label: string, kind: QuantityKind, valueSI: number, digits = 4): Row {
    return { key, label, value: this.fromSI(kind, valueSI), unit: this.unit(kind), digits }
  }
}

/** A row without a unit system: percent, counts, words. */
export function plain(key: string, label: string, value: number | string | null, unit = '', digits = 4): Row {
  return { key, label, value, unit, digits }
}
