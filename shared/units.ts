/**
 * Units for Scrubwright: one small mathjs instance (unit functions only, so the
 * client bundle stays small), a few custom units, and the table of quantity kinds
 * with their SI unit, case-file unit and US-customary display unit.
 *
 * Imports only mathjs (and nothing from the server), so the client can use it.
 *
 * Conventions
 * - Temperatures are absolute temperatures (degC, degF, K, degR), never differences.
 * - Pressure has two kinds: `pressure` (absolute) and `pressureGauge` (gauge, e.g. a
 *   vessel design pressure). A plain unit (Pa, kPa, bar, psi, atm) is read in the
 *   sense of the kind; the suffixed units `psia`, `bara`, `kPaa` are always absolute and
 *   `psig`, `barg`, `kPag` always gauge; converting between the two senses adds or
 *   subtracts the standard atmosphere, 101 325 Pa.
 * - Published exact factors (NIST SP 811): 1 ft = 0.3048 m, 1 lb = 0.45359237 kg,
 *   1 psi = 6894.757 Pa (6894.757293168...), degF = degC * 9/5 + 32.
 */
import { create, createUnitDependencies, unitDependencies, type FactoryFunctionMap, type Unit } from 'mathjs'

const math = create({ unitDependencies, createUnitDependencies } as FactoryFunctionMap)

/** Standard atmosphere [Pa], exact. */
export const STANDARD_ATMOSPHERE = 101325

// Custom units. mathjs already has mol with SI prefixes (kmol), h, degC, degF, psi, bar,
// atm, mmHg, dyn, lbm, gal, ft, in.
math.createUnit(
  {
    lbmol: { definition: '453.59237 mol', aliases: ['lbmole', 'lb-mol'] },
    cP: { definition: '0.001 Pa s', aliases: ['centipoise'] },
    gpm: { definition: '1 gal/min' },
    cfm: { definition: '1 ft^3/min' },
    // conventional inch of water: 25.4 mm x 1000 kg/m3 x 9.80665 m/s2
    inH2O: { definition: '249.08891 Pa', aliases: ['inchH2O'] },
  },
  { override: false },
)

/** Raised for an unknown unit, or a unit of the wrong dimension for the quantity kind. */
export class UnitError extends Error {
  readonly unit: string
  readonly kind?: string
  readonly reason: 'unknownUnit' | 'incompatibleUnit' | 'unknownKind' | 'notFinite'
  constructor(reason: UnitError['reason'], unit: string, message: string, kind?: string) {
    super(message)
    this.name = 'UnitError'
    this.reason = reason
    this.unit = unit
    this.kind = kind
  }
}

export interface QuantityKindInfo {
  /** SI unit used inside the engine. */
  si: string
  /** Unit of a bare number in a case file. */
  caseUnit: string
  /** Unit shown for SI display (often the case unit). */
  siDisplay: string
  /** Unit shown for US-customary display. */
  us: string
  label: string
}

/**
 * Quantity kinds. `si` is the engine unit, `caseUnit` the unit of a bare number in a
 * case file, `siDisplay` / `us` the display units for the SI / US customary switch.
 */
export const QUANTITY_KINDS = {
  molarFlow: { si: 'mol/s', caseUnit: 'kmol/h', siDisplay: 'kmol/h', us: 'lbmol/h', label: 'Molar flow' },
  massFlow: { si: 'kg/s', caseUnit: 'kg/h', siDisplay: 'kg/h', us: 'lbm/h', label: 'Mass flow' },
  gasVolumetricFlow: { si: 'm^3/s', caseUnit: 'm^3/s', siDisplay: 'm^3/s', us: 'cfm', label: 'Gas volumetric flow' },
  liquidVolumetricFlow: { si: 'm^3/s', caseUnit: 'm^3/h', siDisplay: 'm^3/h', us: 'gpm', label: 'Liquid volumetric flow' },
  temperature: { si: 'K', caseUnit: 'degC', siDisplay: 'degC', us: 'degF', label: 'Temperature' },
  pressure: { si: 'Pa', caseUnit: 'kPa', siDisplay: 'kPa', us: 'psi', label: 'Pressure (absolute)' },
  pressureGauge: { si: 'Pa', caseUnit: 'kPa', siDisplay: 'kPa', us: 'psi', label: 'Pressure (gauge)' },
  pressureDrop: { si: 'Pa', caseUnit: 'Pa', siDisplay: 'Pa', us: 'inH2O', label: 'Pressure drop' },
  stress: { si: 'Pa', caseUnit: 'MPa', siDisplay: 'MPa', us: 'psi', label: 'Stress' },
  length: { si: 'm', caseUnit: 'm', siDisplay: 'm', us: 'ft', label: 'Length' },
  smallLength: { si: 'm', caseUnit: 'mm', siDisplay: 'mm', us: 'in', label: 'Small length' },
  area: { si: 'm^2', caseUnit: 'm^2', siDisplay: 'm^2', us: 'ft^2', label: 'Area' },
  velocity: { si: 'm/s', caseUnit: 'm/s', siDisplay: 'm/s', us: 'ft/s', label: 'Velocity' },
  density: { si: 'kg/m^3', caseUnit: 'kg/m^3', siDisplay: 'kg/m^3', us: 'lbm/ft^3', label: 'Density' },
  viscosity: { si: 'Pa s', caseUnit: 'mPa s', siDisplay: 'mPa s', us: 'cP', label: 'Viscosity' },
  gasViscosity: { si: 'Pa s', caseUnit: 'Pa s', siDisplay: 'Pa s', us: 'cP', label: 'Gas viscosity' },
  surfaceTension: { si: 'N/m', caseUnit: 'mN/m', siDisplay: 'mN/m', us: 'dyn/cm', label: 'Surface tension' },
  molarMass: { si: 'kg/mol', caseUnit: 'kg/kmol', siDisplay: 'kg/kmol', us: 'lbm/lbmol', label: 'Molar mass' },
  mass: { si: 'kg', caseUnit: 'kg', siDisplay: 'kg', us: 'lbm', label: 'Mass' },
  time: { si: 's', caseUnit: 's', siDisplay: 's', us: 's', label: 'Time' },
  henrySolubility: { si: 'mol/(m^3 Pa)', caseUnit: 'mol/(m^3 Pa)', siDisplay: 'mol/(m^3 Pa)', us: 'mol/(m^3 Pa)', label: 'Henry solubility constant' },
  inverseTemperatureSlope: { si: 'K', caseUnit: 'K', siDisplay: 'K', us: 'K', label: 'd ln H / d(1/T)' },
} as const satisfies Record<string, QuantityKindInfo>

export type QuantityKind = keyof typeof QUANTITY_KINDS

/** A quantity as written in a case file: a bare number in the case unit, or value + unit. */
export type QuantityInput = number | { value: number; unit: string }

type PressureSense = 'absolute' | 'gauge' | 'plain'
const PRESSURE_SUFFIXED: Record<string, { base: string; sense: PressureSense }> = {
  psia: { base: 'psi', sense: 'absolute' },
  psig: { base: 'psi', sense: 'gauge' },
  bara: { base: 'bar', sense: 'absolute' },
  barg: { base: 'bar', sense: 'gauge' },
  kPaa: { base: 'kPa', sense: 'absolute' },
  kPag: { base: 'kPa', sense: 'gauge' },
  'kPa(a)': { base: 'kPa', sense: 'absolute' },
  'kPa(g)': { base: 'kPa', sense: 'gauge' },
  'bar(a)': { base: 'bar', sense: 'absolute' },
  'bar(g)': { base: 'bar', sense: 'gauge' },
  MPag: { base: 'MPa', sense: 'gauge' },
  MPaa: { base: 'MPa', sense: 'absolute' },
}

function splitPressureSense(unit: string): { base: string; sense: PressureSense } {
  const u = unit.trim()
  return PRESSURE_SUFFIXED[u] ?? { base: u, sense: 'plain' }
}

// Parsed units are cached: parsing is the slow part of mathjs.
const unitCache = new Map<string, Unit>()
function parseUnit(unit: string, kind?: string): Unit {
  let u = unitCache.get(unit)
  if (u) return u
  try {
    u = math.unit(1, unit) as Unit
  } catch {
    throw new UnitError('unknownUnit', unit, `Unknown unit "${unit}"`, kind)
  }
  if (unitCache.size > 500) unitCache.clear()
  unitCache.set(unit, u)
  return u
}

/** Convert a value between two units of one dimension (absolute temperatures). */
function convertPlain(value: number, from: string, to: string, kind?: string): number {
  if (!Number.isFinite(value)) throw new UnitError('notFinite', from, `Value ${value} is not a finite number`, kind)
  if (from === to) return value
  const uf = parseUnit(from, kind)
  const ut = parseUnit(to, kind)
  if (!uf.equalBase(ut)) {
    throw new UnitError('incompatibleUnit', from, `Unit "${from}" cannot be converted to "${to}"`, kind)
  }
  return (math.unit(value, from) as Unit).toNumber(to)
}

/**
 * Convert a number between units, e.g. convert(14.7, 'psi', 'kPa').
 * Gauge/absolute suffixes (psig, psia, barg, bara, kPag, kPaa) are honoured: converting
 * psig to psia adds one standard atmosphere. A plain unit on either side takes the
 * sense of the other side.
 */
export function convert(value: number, from: string, to: string): number {
  const f = splitPressureSense(from)
  const t = splitPressureSense(to)
  if (f.sense === 'plain' && t.sense === 'plain') return convertPlain(value, from, to)
  let pa = convertPlain(value, f.base, 'Pa')
  if (f.sense !== 'plain' && t.sense !== 'plain' && f.sense !== t.sense) {
    pa += f.sense === 'gauge' ? STANDARD_ATMOSPHERE : -STANDARD_ATMOSPHERE
  }
  return convertPlain(pa, 'Pa', t.base)
}

function kindInfo(kind: QuantityKind): QuantityKindInfo {
  const info = (QUANTITY_KINDS as Record<string, QuantityKindInfo>)[kind]
  if (!info) throw new UnitError('unknownKind', '', `Unknown quantity kind "${String(kind)}"`)
  return info
}

/** Sense implied by a quantity kind for a plain pressure unit. */
function kindSense(kind: QuantityKind): PressureSense {
  return kind === 'pressure' ? 'absolute' : kind === 'pressureGauge' ? 'gauge' : 'plain'
}

// Every supported conversion is affine (scale and offset), so each (kind, from, to) is
// worked out once through mathjs and cached as value * scale + offset.
const affineCache = new Map<string, { scale: number; offset: number }>()

function convertForKind(kind: QuantityKind, value: number, from: string, to: string): number {
  if (!Number.isFinite(value)) throw new UnitError('notFinite', from, `Value ${value} is not a finite number`, kind)
  const key = kind + '|' + from + '|' + to
  let m = affineCache.get(key)
  if (!m) {
    const offset = convertForKindSlow(kind, 0, from, to)
    const scale = convertForKindSlow(kind, 1, from, to) - offset
    m = { scale, offset }
    if (affineCache.size > 2000) affineCache.clear()
    affineCache.set(key, m)
  }
  return value * m.scale + m.offset
}

function convertForKindSlow(kind: QuantityKind, value: number, from: string, to: string): number {
  const info = kindInfo(kind)
  const sense = kindSense(kind)
  const f = splitPressureSense(from)
  const t = splitPressureSense(to)
  // check dimension against the kind's SI unit
  const siU = parseUnit(info.si, kind)
  const fu = parseUnit(f.base, kind)
  if (!fu.equalBase(siU)) {
    throw new UnitError('incompatibleUnit', from, `Unit "${from}" is not a unit of ${info.label.toLowerCase()} (expected e.g. ${info.caseUnit})`, kind)
  }
  const tu = parseUnit(t.base, kind)
  if (!tu.equalBase(siU)) {
    throw new UnitError('incompatibleUnit', to, `Unit "${to}" is not a unit of ${info.label.toLowerCase()}`, kind)
  }
  if (sense === 'plain') {
    if (f.sense !== 'plain' || t.sense !== 'plain') {
      // a gauge/absolute tag on a pressure difference or stress is meaningless: ignore the tag
      return convertPlain(value, f.base, t.base, kind)
    }
    return convertPlain(value, from, to, kind)
  }
  const fs = f.sense === 'plain' ? sense : f.sense
  const ts = t.sense === 'plain' ? sense : t.sense
  let pa = convertPlain(value, f.base, 'Pa', kind)
  if (fs !== ts) pa += fs === 'gauge' ? STANDARD_ATMOSPHERE : -STANDARD_ATMOSPHERE
  return convertPlain(pa, 'Pa', t.base, kind)
}

function splitQuantity(kind: QuantityKind, q: QuantityInput): { value: number; unit: string } {
  if (typeof q === 'number') return { value: q, unit: kindInfo(kind).caseUnit }
  return q
}

/** A case-file quantity (bare number in the case unit, or {value, unit}) to SI. */
export function toSI(kind: QuantityKind, q: QuantityInput): number {
  const { value, unit } = splitQuantity(kind, q)
  return convertForKind(kind, value, unit, kindInfo(kind).si)
}

/** An SI number to the given unit (default: the kind's case unit). */
export function fromSI(kind: QuantityKind, valueSI: number, unit?: string): number {
  const info = kindInfo(kind)
  return convertForKind(kind, valueSI, info.si, unit ?? info.caseUnit)
}

/** A case-file quantity to the bare number of the case unit. */
export function toCaseUnit(kind: QuantityKind, q: QuantityInput): number {
  const { value, unit } = splitQuantity(kind, q)
  return convertForKind(kind, value, unit, kindInfo(kind).caseUnit)
}

/** Display unit for a kind in a unit system. */
export function displayUnit(kind: QuantityKind, system: 'SI' | 'US'): string {
  const info = kindInfo(kind)
  return system === 'US' ? info.us : info.siDisplay
}

/** True when `unit` is a known unit of the kind's dimension. */
export function isUnitOf(kind: QuantityKind, unit: string): boolean {
  try {
    convertForKind(kind, 1, unit, kindInfo(kind).si)
    return true
  } catch {
    return false
  }
}
