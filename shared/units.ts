/**
 * Units for Scrubwright: a table of the units people use for each quantity kind (exact
 * published factors), the table of quantity kinds with their SI unit, case-file unit and
 * US-customary display unit, and, for any other unit, mathjs, loaded only when a case needs
 * it (see units-mathjs.ts): most cases never pay for loading a general units library.
 *
 * Imports nothing (neither the server nor mathjs), so the client can use it.
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
/** Standard atmosphere [Pa], exact. */
export const STANDARD_ATMOSPHERE = 101325

/** An affine map to the SI unit of a group: si = value * scale + offset. */
export interface Affine {
  scale: number
  offset: number
}

// Exact factors (NIST SP 811, 2008, appendix B): ft 0.3048 m; in 0.0254 m; lb 0.45359237 kg;
// US gallon 231 in^3 = 3.785411784e-3 m^3; psi = lbf/in^2 with g_n = 9.80665 m/s^2;
// standard atmosphere 101 325 Pa; torr = atm/760; conventional mmHg 133.322387415 Pa;
// horsepower = 550 ft lbf/s = 745.699 87 W; kWh = 3.6 MJ; litre = 1e-3 m^3;
// conventional inch of water 25.4 mm x 1000 kg/m^3 x g_n; degF = K x 9/5 - 459.67.
const FT = 0.3048
const IN = 0.0254
const LB = 0.45359237
const GAL = 231 * IN ** 3
const PSI = (LB * 9.80665) / IN ** 2
const H = 3600
// horsepower (mechanical) = 550 ft lbf/s
const HP = 550 * FT * LB * 9.80665

/** Units by SI unit: a number is a scale, a pair is [scale, offset]. */
const UNIT_TABLE: Record<string, Record<string, number | [number, number]>> = {
  'mol/s': { 'mol/s': 1, 'mol/h': 1 / H, 'mol/min': 1 / 60, 'kmol/s': 1000, 'kmol/min': 1000 / 60, 'kmol/h': 1000 / H, 'lbmol/s': LB * 1000, 'lbmol/min': (LB * 1000) / 60, 'lbmol/h': (LB * 1000) / H },
  'kg/s': { 'kg/s': 1, 'kg/min': 1 / 60, 'kg/h': 1 / H, 'g/s': 1e-3, 't/h': 1000 / H, 'lbm/s': LB, 'lbm/min': LB / 60, 'lbm/h': LB / H, 'lb/h': LB / H, 'lb/s': LB },
  'm^3/s': { 'm^3/s': 1, 'm^3/min': 1 / 60, 'm^3/h': 1 / H, 'L/s': 1e-3, 'L/min': 1e-3 / 60, 'L/h': 1e-3 / H, 'ft^3/s': FT ** 3, 'ft^3/min': FT ** 3 / 60, 'ft^3/h': FT ** 3 / H, cfm: FT ** 3 / 60, gpm: GAL / 60, 'gal/min': GAL / 60, 'gal/h': GAL / H },
  K: { K: 1, degC: [1, 273.15], degF: [5 / 9, 459.67 * (5 / 9)], degR: 5 / 9 },
  Pa: { Pa: 1, hPa: 100, kPa: 1000, MPa: 1e6, GPa: 1e9, bar: 1e5, mbar: 100, atm: STANDARD_ATMOSPHERE, psi: PSI, torr: STANDARD_ATMOSPHERE / 760, mmHg: 133.322387415, inH2O: 25.4e-3 * 1000 * 9.80665, 'N/m^2': 1, 'N/mm^2': 1e6 },
  m: { m: 1, mm: 1e-3, cm: 1e-2, km: 1000, ft: FT, in: IN, inch: IN },
  'm^2': { 'm^2': 1, 'cm^2': 1e-4, 'mm^2': 1e-6, 'ft^2': FT ** 2, 'in^2': IN ** 2 },
  'm/s': { 'm/s': 1, 'cm/s': 1e-2, 'm/min': 1 / 60, 'm/h': 1 / H, 'km/h': 1000 / H, 'ft/s': FT, 'ft/min': FT / 60, 'ft/h': FT / H },
  'kg/m^3': { 'kg/m^3': 1, 'g/cm^3': 1000, 'g/L': 1, 'kg/L': 1000, 'lbm/ft^3': LB / FT ** 3, 'lb/ft^3': LB / FT ** 3, 'lbm/gal': LB / GAL },
  'Pa s': { 'Pa s': 1, 'Pa*s': 1, 'mPa s': 1e-3, 'mPa*s': 1e-3, cP: 1e-3, centipoise: 1e-3, 'lbm/(ft s)': LB / FT },
  'N/m': { 'N/m': 1, 'mN/m': 1e-3, 'dyn/cm': 1e-3 },
  'kg/mol': { 'kg/mol': 1, 'kg/kmol': 1e-3, 'g/mol': 1e-3, 'lbm/lbmol': 1e-3, 'lb/lbmol': 1e-3 },
  kg: { kg: 1, g: 1e-3, t: 1000, tonne: 1000, lbm: LB, lb: LB },
  s: { s: 1, min: 60, h: H, day: 86400 },
  'm^3': { 'm^3': 1, L: 1e-3, gal: GAL, 'ft^3': FT ** 3 },
  W: { W: 1, kW: 1000, MW: 1e6, hp: HP },
  J: { J: 1, kJ: 1000, MJ: 1e6, kWh: 3.6e6 },
  'mol/(m^3 Pa)': { 'mol/(m^3 Pa)': 1 },
}

/** The table itself, for the tests that check it against published factors and mathjs. */
export const UNIT_TABLE_FOR_TESTS: Readonly<typeof UNIT_TABLE> = UNIT_TABLE

/** SI unit of each unit in the table (first group wins). */
const GROUP_OF = new Map<string, string>()
for (const [si, units] of Object.entries(UNIT_TABLE)) for (const u of Object.keys(units)) if (!GROUP_OF.has(u)) GROUP_OF.set(u, si)

/**
 * A general units parser for units outside the table: the affine map of `unit` to `si`, or
 * 'unknown' / 'incompatible'. Installed by units-mathjs.ts (in the browser) or loaded on first
 * need in Node.
 */
export interface UnitFallback {
  affine(unit: string, si: string): Affine | 'unknown' | 'incompatible'
}

let fallback: UnitFallback | null | undefined

/** Install the parser used for units outside the table (null: table only). */
export function setUnitFallback(f: UnitFallback | null): void {
  fallback = f
  affineCache.clear()
}

type NodeProcess = { getBuiltinModule?: (id: string) => unknown }
type NodeRequire = ((id: string) => unknown) & { resolve: (id: string) => string }
type ModuleBuiltin = { createRequire: (from: string) => NodeRequire }

/** mathjs's unit parts only (its CommonJS files, about a tenth of the package); the whole package if its layout differs. */
function requireMathjsUnits(req: NodeRequire): MathjsModule {
  try {
    const dir = req.resolve('mathjs').replace(/[\\/]index\.js$/, '')
    const { create } = req(`${dir}/core/create.js`) as Pick<MathjsModule, 'create'>
    const { unitDependencies } = req(`${dir}/entry/dependenciesAny/dependenciesUnitFunction.generated.js`) as Pick<MathjsModule, 'unitDependencies'>
    const { createUnitDependencies } = req(`${dir}/entry/dependenciesAny/dependenciesCreateUnit.generated.js`) as Pick<MathjsModule, 'createUnitDependencies'>
    return { create, unitDependencies, createUnitDependencies }
  } catch {
    return req('mathjs') as MathjsModule
  }
}

/** In Node, mathjs is required the first time a unit outside the table appears. */
function getFallback(): UnitFallback | null {
  if (fallback !== undefined) return fallback
  fallback = null
  const proc = (globalThis as { process?: NodeProcess }).process
  const mod = proc?.getBuiltinModule?.('node:module') as ModuleBuiltin | undefined
  if (mod) {
    fallback = mathjsFallback(requireMathjsUnits(mod.createRequire(import.meta.url)))
  }
  return fallback
}

interface MathUnit {
  equalBase(other: MathUnit): boolean
  toNumber(unit: string): number
}
/** The parts of mathjs the fallback uses. */
export interface MathjsModule {
  create(factories: never): {
    createUnit(defs: Record<string, { definition: string; aliases?: string[] }>, opts: { override: boolean }): unknown
    unit(value: number, unit: string): MathUnit
  }
  unitDependencies: unknown
  createUnitDependencies: unknown
}

/** A fallback built on one small mathjs instance (unit functions only) with our few extra units. */
export function mathjsFallback(m: MathjsModule): UnitFallback {
  const math = m.create({ unitDependencies: m.unitDependencies, createUnitDependencies: m.createUnitDependencies } as never)
  math.createUnit(
    {
      lbmol: { definition: '453.59237 mol', aliases: ['lbmole', 'lb-mol'] },
      cP: { definition: '0.001 Pa s', aliases: ['centipoise'] },
      gpm: { definition: '1 gal/min' },
      cfm: { definition: '1 ft^3/min' },
      inH2O: { definition: '249.08891 Pa', aliases: ['inchH2O'] },
    },
    { override: false },
  )
  return {
    affine(unit, si) {
      let u: MathUnit
      try {
        u = math.unit(1, unit)
      } catch {
        return 'unknown'
      }
      if (!u.equalBase(math.unit(1, si))) return 'incompatible'
      const offset = math.unit(0, unit).toNumber(si)
      return { scale: math.unit(1, unit).toNumber(si) - offset, offset }
    },
  }
}

/** The affine map of `unit` to the SI unit `si`; throws UnitError (reason set, message generic). */
function affineTo(unit: string, si: string, kind?: string): Affine {
  const entry = UNIT_TABLE[si]?.[unit]
  if (entry !== undefined) return typeof entry === 'number' ? { scale: entry, offset: 0 } : { scale: entry[0], offset: entry[1] }
  const fb = GROUP_OF.has(unit) ? null : getFallback()
  const r = fb ? fb.affine(unit, si) : GROUP_OF.has(unit) ? 'incompatible' : 'unknown'
  if (r === 'unknown') throw new UnitError('unknownUnit', unit, `Unknown unit "${unit}"`, kind)
  if (r === 'incompatible') throw new UnitError('incompatibleUnit', unit, `Unit "${unit}" cannot be converted to "${si}"`, kind)
  return r
}

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
  volume: { si: 'm^3', caseUnit: 'm^3', siDisplay: 'm^3', us: 'gal', label: 'Volume' },
  power: { si: 'W', caseUnit: 'kW', siDisplay: 'kW', us: 'hp', label: 'Power' },
  energy: { si: 'J', caseUnit: 'kWh', siDisplay: 'kWh', us: 'kWh', label: 'Energy' },
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

/** Convert a value between two units of one dimension (absolute temperatures). */
function convertPlain(value: number, from: string, to: string, kind?: string): number {
  if (!Number.isFinite(value)) throw new UnitError('notFinite', from, `Value ${value} is not a finite number`, kind)
  if (from === to) return value
  const si = GROUP_OF.get(from) ?? GROUP_OF.get(to) ?? to
  let f: Affine, t: Affine
  try {
    f = affineTo(from, si, kind)
    t = affineTo(to, si, kind)
  } catch (e) {
    if (e instanceof UnitError && e.reason === 'incompatibleUnit') {
      throw new UnitError('incompatibleUnit', from, `Unit "${from}" cannot be converted to "${to}"`, kind)
    }
    throw e
  }
  return (value * f.scale + f.offset - t.offset) / t.scale
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

// Every supported conversion is affine (scale and offset): each (kind, from, to) is worked out
// once and cached as value * scale + offset.
// Maps inside maps (kind -> from -> to): a key joined into one string would be built and hashed
// for every quantity of every case.
const affineCache = new Map<QuantityKind, Map<string, Map<string, Affine>>>()
let affineCount = 0

function convertForKind(kind: QuantityKind, value: number, from: string, to: string): number {
  if (!Number.isFinite(value)) throw new UnitError('notFinite', from, `Value ${value} is not a finite number`, kind)
  let byFrom = affineCache.get(kind)
  if (!byFrom) affineCache.set(kind, (byFrom = new Map()))
  let byTo = byFrom.get(from)
  if (!byTo) byFrom.set(from, (byTo = new Map()))
  let m = byTo.get(to)
  if (!m) {
    m = affineForKind(kind, from, to)
    if (++affineCount > 2000) {
      affineCache.clear()
      affineCount = 1
      affineCache.set(kind, (byFrom = new Map()))
      byFrom.set(from, (byTo = new Map()))
    }
    byTo.set(to, m)
  }
  return value * m.scale + m.offset
}

/** The affine map of a unit of the kind to SI, with the kind named in the error. */
function kindAffine(kind: QuantityKind, info: QuantityKindInfo, unit: string, side: 'from' | 'to'): Affine {
  try {
    return affineTo(unit, info.si, kind)
  } catch (e) {
    if (e instanceof UnitError && e.reason === 'incompatibleUnit') {
      const hint = side === 'from' ? ` (expected e.g. ${info.caseUnit})` : ''
      throw new UnitError('incompatibleUnit', unit, `Unit "${unit}" is not a unit of ${info.label.toLowerCase()}${hint}`, kind)
    }
    throw e
  }
}

function affineForKind(kind: QuantityKind, from: string, to: string): Affine {
  const info = kindInfo(kind)
  const sense = kindSense(kind)
  const f = splitPressureSense(from)
  const t = splitPressureSense(to)
  const fa = kindAffine(kind, info, f.base, 'from')
  const ta = kindAffine(kind, info, t.base, 'to')
  let shift = 0 // Pa added between the two senses
  if (sense !== 'plain') {
    const fs = f.sense === 'plain' ? sense : f.sense
    const ts = t.sense === 'plain' ? sense : t.sense
    if (fs !== ts) shift = fs === 'gauge' ? STANDARD_ATMOSPHERE : -STANDARD_ATMOSPHERE
  }
  // a gauge/absolute tag on a pressure difference or stress is meaningless: the tag is ignored
  return { scale: fa.scale / ta.scale, offset: (fa.offset + shift - ta.offset) / ta.scale }
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

/**
 * Prices per amount of a quantity (currency per kWh, per m³, per kg...). A price is stored per
 * one `stored` unit; it is shown per `count` display units of the person's system, e.g. a
 * solvent price stored per m³ is shown per 1000 gal in US customary units.
 */
export interface PriceKindInfo {
  /** Quantity kind of the amount priced. */
  kind: QuantityKind
  /** Unit of one stored price: currency per one of these. */
  stored: string
  SI: { count: number; unit: string }
  US: { count: number; unit: string }
}

export const PRICE_KINDS = {
  pricePerEnergy: { kind: 'energy', stored: 'kWh', SI: { count: 1, unit: 'kWh' }, US: { count: 1, unit: 'kWh' } },
  pricePerVolume: { kind: 'volume', stored: 'm^3', SI: { count: 1, unit: 'm^3' }, US: { count: 1000, unit: 'gal' } },
  pricePerMass: { kind: 'mass', stored: 'kg', SI: { count: 1, unit: 'kg' }, US: { count: 1, unit: 'lb' } },
  pricePerBulkMass: { kind: 'mass', stored: 't', SI: { count: 1, unit: 't' }, US: { count: 1000, unit: 'lb' } },
} as const satisfies Record<string, PriceKindInfo>

export type PriceKind = keyof typeof PRICE_KINDS

/** How many currency units per displayed basis one currency unit per stored basis is worth. */
export function priceScale(kind: PriceKind, system: 'SI' | 'US'): number {
  const info: PriceKindInfo = PRICE_KINDS[kind]
  const basis = info[system]
  // price per basis = price per stored unit x (stored units in one basis)
  return convert(basis.count, basis.unit, info.stored)
}

/** The display basis of a price, e.g. { count: 1000, unit: 'gal' }. */
export function priceBasis(kind: PriceKind, system: 'SI' | 'US'): { count: number; unit: string } {
  return PRICE_KINDS[kind][system]
}

export { prettyUnit } from './unitText.ts'
