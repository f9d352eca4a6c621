import { defineStore } from 'pinia'
import { computed, shallowRef } from 'vue'
import type { QuantityInput, QuantityKind } from '@shared/units.ts'
import { useSessionStore } from './session.ts'
import { prettyUnit } from '@/utils/unitLabel.ts'

type UnitsModule = typeof import('@shared/units.ts')

let loading: Promise<UnitsModule> | null = null

/**
 * Unit conversion for display. The units library (built on mathjs) is loaded on first use,
 * so it stays out of the first download. Case values are numbers in the case unit of their
 * kind; display values are in the person's unit system.
 */
export const useUnitsStore = defineStore('units', () => {
  const lib = shallowRef<UnitsModule | null>(null)
  const session = useSessionStore()
  const system = computed(() => session.unitSystem)
  const ready = computed(() => lib.value !== null)

  function ensureLoaded(): Promise<UnitsModule> {
    if (lib.value) return Promise.resolve(lib.value)
    // The table of common units first; mathjs (any other unit) follows in the background.
    loading ??= import('@shared/units.ts').then((m) => {
      void import('@shared/units-mathjs.ts').then((x) => x.installMathjsUnits())
      return m
    })
    return loading.then((m) => {
      lib.value = m
      return m
    })
  }

  /** Display unit of a kind in the person's system, as the library spells it. */
  function unitOf(kind: QuantityKind): string {
    const m = lib.value
    if (!m) return ''
    return m.displayUnit(kind, system.value)
  }

  /** Display unit typeset for people (°C, m³/h). */
  function label(kind: QuantityKind): string {
    return prettyUnit(unitOf(kind))
  }

  /** A case quantity (number in the case unit or {value, unit}) to the display unit. */
  function caseToDisplay(kind: QuantityKind, q: QuantityInput): number | null {
    const m = lib.value
    if (!m) return null
    try {
      return m.fromSI(kind, m.toSI(kind, q), m.displayUnit(kind, system.value))
    } catch {
      return null
    }
  }

  /** A number typed in the display unit to a bare number in the case unit. */
  function displayToCase(kind: QuantityKind, value: number): number | null {
    const m = lib.value
    if (!m) return null
    try {
      return m.toCaseUnit(kind, { value, unit: m.displayUnit(kind, system.value) })
    } catch {
      return null
    }
  }

  /** An SI (engine) number to the display unit. */
  function siToDisplay(kind: QuantityKind, valueSI: number): number | null {
    const m = lib.value
    if (!m) return null
    try {
      return m.fromSI(kind, valueSI, m.displayUnit(kind, system.value))
    } catch {
      return null
    }
  }

  /** A number in any unit the library knows to the display unit of the kind. */
  function unitToDisplay(kind: QuantityKind, value: number, unit: string): number | null {
    const m = lib.value
    if (!m) return null
    try {
      return m.convert(value, unit, m.displayUnit(kind, system.value))
    } catch {
      return null
    }
  }

  return { lib, system, ready, ensureLoaded, unitOf, label, caseToDisplay, displayToCase, siToDisplay, unitToDisplay }
})
