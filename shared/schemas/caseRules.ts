/**
 * The rules of each case field, shared by the case schema (server, command line) and the form:
 * what the field is called in the person's words, how it is shown (a quantity in the person's
 * unit system, a percentage or a plain number), its hard limits, a typical range, the default the
 * engine takes when it is left out, and a one-line help text.
 *
 * Limits, typical ranges and defaults are in the case unit of the field (a bare number as a case
 * file holds it: kmol/h, °C, kPa, mm, a fraction for percentages). Messages name the value in the
 * person's unit system when one is known (see setUnitSystemSource), otherwise in the case unit.
 * Imports only ../units.ts.
 */
import { QUANTITY_KINDS, displayUnit, fromSI, prettyUnit, toSI, type QuantityInput, type QuantityKind } from '../units.ts'

export type ShowSystem = 'SI' | 'US'

/** How a field is shown: a physical quantity, or a fraction shown scaled (percent) or plain. */
export type FieldShown = { kind: QuantityKind } | { scale: number; unit: string }

export interface Limit {
  /** In the case unit (fraction for percentages). */
  value: number
  /** True: the limit itself is not allowed. */
  open: boolean
  /** Words used instead of the number, e.g. 'absolute zero'. */
  words?: string
}

export interface CaseFieldRule {
  /** Label on the form. */
  label: string
  /** The field in a sentence: 'the gas flow'. */
  noun: string
  shown: FieldShown
  min?: Limit
  max?: Limit
  /** Typical range in the case unit. */
  typical?: [number, number]
  /** What the engine takes when the field is blank: a case-unit number, or words. */
  default?: number | string
  /** One line: what it is. Words may hold {kind:value} (a case-unit value), shown in the person's units. */
  help: string
  /** Left blank, the field is an error. */
  required?: boolean
}

const PERCENT: FieldShown = { scale: 100, unit: '%' }
const MOL_PERCENT: FieldShown = { scale: 100, unit: 'mol %' }
const PLAIN: FieldShown = { scale: 1, unit: '' }
const q = (kind: QuantityKind): FieldShown => ({ kind })
const positive: Limit = { value: 0, open: true }
const nonNegative: Limit = { value: 0, open: false }
const aboveAbsoluteZero: Limit = { value: -273.15, open: true, words: 'absolute zero' }

/**
 * The field rules, keyed by case path (`*` stands for an index). Defaults equal the engine's
 * CASE_DEFAULTS (a test keeps them together); typical ranges are common practice.
 */
export const CASE_FIELD_RULES: Record<string, CaseFieldRule> = {
  'gas.flow': { label: 'Gas flow into the column', noun: 'the gas flow', shown: q('molarFlow'), min: positive, typical: [10, 5000], required: true, help: 'Total molar flow of the gas entering at the bottom (carrier and solute).' },
  'gas.temperature': { label: 'Gas temperature', noun: 'the gas temperature', shown: q('temperature'), min: aboveAbsoluteZero, typical: [5, 60], required: true, help: 'Temperature of the gas entering the column.' },
  'gas.pressure': { label: 'Column pressure (absolute)', noun: 'the column pressure', shown: q('pressure'), min: positive, typical: [100, 1000], required: true, help: 'Absolute pressure in the column; atmospheric is {pressure:101.325}.' },
  'gas.soluteMoleFraction': { label: 'Solute in the gas', noun: 'the solute in the gas', shown: MOL_PERCENT, min: positive, max: { value: 1, open: true }, typical: [0.001, 0.1], required: true, help: 'Mole fraction of the solute in the entering gas.' },
  'gas.carrierMolarMass': { label: 'Carrier molar mass', noun: 'the carrier molar mass', shown: q('molarMass'), min: positive, typical: [2, 100], help: 'Molar mass of the gas that carries the solute (air is about 29).' },
  'solute.molarMass': { label: 'Solute molar mass', noun: 'the solute molar mass', shown: q('molarMass'), min: positive, typical: [15, 200], help: 'Molar mass of the solute.' },
  'solvent.temperature': { label: 'Lean-solvent temperature', noun: 'the lean-solvent temperature', shown: q('temperature'), min: aboveAbsoluteZero, typical: [5, 50], default: 'the gas temperature', help: 'Temperature of the solvent fed at the top; the column is taken at this temperature.' },
  'solvent.soluteMoleFraction': { label: 'Solute in the lean solvent', noun: 'the solute in the lean solvent', shown: MOL_PERCENT, min: nonNegative, max: { value: 1, open: true }, typical: [0, 0.001], default: 0, help: 'Solute already in the solvent fed at the top (0 for fresh solvent).' },
  'solvent.molarMass': { label: 'Solvent molar mass', noun: 'the solvent molar mass', shown: q('molarMass'), min: positive, typical: [18, 200], help: 'Molar mass of the solvent.' },
  'solvent.density': { label: 'Solvent density', noun: 'the solvent density', shown: q('density'), min: positive, typical: [700, 1300], help: 'Liquid density of the solvent at column temperature.' },
  'solvent.viscosity': { label: 'Solvent viscosity', noun: 'the solvent viscosity', shown: q('viscosity'), min: positive, typical: [0.3, 50], help: 'Liquid viscosity of the solvent at column temperature.' },
  'solvent.surfaceTension': { label: 'Solvent surface tension', noun: 'the solvent surface tension', shown: q('surfaceTension'), min: positive, typical: [20, 75], help: 'Surface tension of the solvent; it enters the flooding limit.' },
  'equilibrium.K': { label: 'K = y / x', noun: 'K', shown: PLAIN, min: positive, typical: [0.01, 10], required: true, help: 'Distribution coefficient at column conditions: gas mole fraction over liquid mole fraction.' },
  'equilibrium.Hcp': { label: 'Solubility constant at 298.15 K', noun: 'the solubility constant', shown: q('henrySolubility'), min: positive, default: 'the component library', help: 'Henry solubility constant (concentration in the liquid over partial pressure).' },
  'equilibrium.B': { label: 'Temperature slope d ln H / d(1/T)', noun: 'the temperature slope', shown: q('inverseTemperatureSlope'), default: 'the component library', help: 'How the solubility changes with temperature (van ’t Hoff); typically 2000 to 8000 K.' },
  'equilibrium.gammaInf': { label: 'Activity coefficient at infinite dilution γ∞', noun: 'γ∞', shown: PLAIN, min: positive, typical: [1, 20], default: 'the component library', help: 'Activity coefficient of the solute in the solvent at infinite dilution.' },
  'equilibrium.vapourPressure': { label: 'Vapour pressure of the solute', noun: 'the vapour pressure', shown: q('pressure'), min: positive, default: 'the library’s Antoine constants', help: 'Vapour pressure of the pure solute at column temperature.' },
  'equilibrium.temperature': { label: 'Temperature of the table', noun: 'the temperature of the table', shown: q('temperature'), min: aboveAbsoluteZero, typical: [5, 60], help: 'Temperature at which the x–y points were measured; it should match the column.' },
  'equilibrium.points.*.0': { label: 'x, liquid', noun: 'x', shown: PLAIN, min: nonNegative, max: { value: 1, open: true }, required: true, help: 'Mole fraction of solute in the liquid.' },
  'equilibrium.points.*.1': { label: 'y, gas', noun: 'y', shown: PLAIN, min: nonNegative, max: { value: 1, open: true }, required: true, help: 'Mole fraction of solute in the gas in equilibrium with x.' },
  recovery: { label: 'Recovery of the solute', noun: 'recovery', shown: PERCENT, min: positive, max: { value: 1, open: true }, typical: [0.9, 0.995], required: true, help: 'Share of the entering solute washed out of the gas.' },
  solventFactor: { label: 'Solvent factor L / Lmin', noun: 'L/Lmin', shown: PLAIN, min: { value: 1, open: true }, typical: [1.2, 2], required: true, help: 'Solvent rate as a multiple of the minimum; at 1 the column would need endless trays.' },
  'efficiency.value': { label: 'Tray efficiency', noun: 'the tray efficiency', shown: PERCENT, min: positive, max: { value: 1, open: false }, typical: [0.2, 0.8], required: true, help: 'Overall efficiency: theoretical stages over actual trays.' },
  'tray.holeDiameter': { label: 'Hole diameter', noun: 'the hole diameter', shown: q('smallLength'), min: positive, typical: [3, 12], default: 4.5, help: 'Diameter of the holes in the tray deck.' },
  'tray.holePitch': { label: 'Hole pitch', noun: 'the hole pitch', shown: q('smallLength'), min: positive, typical: [7.5, 40], default: 12, help: 'Centre-to-centre distance of the holes, 2.5 to 4 hole diameters.' },
  'tray.thickness': { label: 'Tray deck thickness', noun: 'the deck thickness', shown: q('smallLength'), min: positive, typical: [1.5, 4], default: 2, help: 'Thickness of the tray deck plate.' },
  'tray.weirHeight': { label: 'Outlet weir height', noun: 'the weir height', shown: q('smallLength'), min: positive, typical: [25, 75], default: 50, help: 'Height of the outlet weir above the deck.' },
  'tray.downcomerClearance': { label: 'Downcomer clearance', noun: 'the downcomer clearance', shown: q('smallLength'), min: positive, typical: [25, 50], default: 'the weir height less {smallLength:10}', help: 'Gap under the downcomer apron.' },
  'tray.spacing': { label: 'Tray spacing', noun: 'the tray spacing', shown: q('length'), min: positive, typical: [0.3, 0.9], default: 'a rule by diameter', help: 'Distance between trays.' },
  'tray.floodFraction': { label: 'Design approach to flood', noun: 'the approach to flood', shown: PERCENT, min: positive, max: { value: 1, open: true }, typical: [0.6, 0.85], default: 0.8, help: 'Gas velocity as a share of the flooding velocity.' },
  'tray.foamingFactor': { label: 'Foaming (system) factor', noun: 'the foaming factor', shown: PLAIN, min: positive, max: { value: 1.5, open: false }, typical: [0.5, 1], default: 1, help: 'Derates the flooding limit: 1 for non-foaming systems, lower for foaming ones.' },
  'tray.turndownFraction': { label: 'Turndown', noun: 'the turndown', shown: PERCENT, min: positive, max: { value: 1, open: false }, typical: [0.3, 0.6], default: 0.5, help: 'Lowest gas rate, as a share of design, the trays must handle without weeping.' },
  'column.temperature': { label: 'Column temperature', noun: 'the column temperature', shown: q('temperature'), min: aboveAbsoluteZero, typical: [5, 60], default: 'the lean-solvent temperature', help: 'Temperature for equilibrium and liquid properties.' },
  'column.diameterStep': { label: 'Diameter step (rounding up)', noun: 'the diameter step', shown: q('length'), min: positive, typical: [0.05, 0.15], default: 0.05, help: 'The diameter is rounded up to a multiple of this step.' },
  'column.topAllowance': { label: 'Space above the top tray', noun: 'the space above the top tray', shown: q('length'), min: nonNegative, typical: [0.5, 1.5], default: 1, help: 'Height for the mist eliminator and gas outlet.' },
  'column.bottomAllowance': { label: 'Space below the bottom tray', noun: 'the space below the bottom tray', shown: q('length'), min: nonNegative, typical: [1.5, 3], default: 3, help: 'Height for the gas inlet and the liquid sump.' },
  'vessel.designPressure': { label: 'Design pressure (gauge)', noun: 'the design pressure', shown: q('pressureGauge'), min: nonNegative, typical: [170, 1000], default: 'the larger of 1.1 × operating and operating + {pressureGauge:170} (gauge)', help: 'Gauge pressure the shell is designed for.' },
  'vessel.allowableStress': { label: 'Allowable stress of the shell', noun: 'the allowable stress', shown: q('stress'), min: positive, typical: [100, 140], default: 138, help: 'Allowable stress of the shell material at design temperature.' },
  'vessel.jointEfficiency': { label: 'Weld joint efficiency', noun: 'the joint efficiency', shown: PLAIN, min: positive, max: { value: 1, open: false }, typical: [0.7, 1], default: 0.85, help: 'Weld joint efficiency: 1 fully radiographed, 0.85 spot, 0.7 none.' },
  'vessel.corrosionAllowance': { label: 'Corrosion allowance', noun: 'the corrosion allowance', shown: q('smallLength'), min: nonNegative, typical: [0, 6], default: 3, help: 'Extra wall thickness for corrosion over the life of the vessel.' },
  'vessel.materialDensity': { label: 'Shell material density', noun: 'the shell material density', shown: q('density'), min: positive, typical: [7800, 8000], default: 7850, help: 'Density of the shell metal, for its weight.' },
}

/** The rule of a case path (indices in the path match `*`), or undefined. */
export function ruleFor(path: string): CaseFieldRule | undefined {
  return CASE_FIELD_RULES[path] ?? CASE_FIELD_RULES[path.replace(/\.\d+(?=\.)/g, '.*')]
}

// ------------------------------------------------------------------ the person's unit system

let systemSource: () => ShowSystem | null = () => null

/**
 * Where messages take the person's unit system from: the server sets the request's system
 * (X-Unit-System header), the client the signed-in person's. Without one, case units.
 */
export function setUnitSystemSource(source: () => ShowSystem | null): void {
  systemSource = source
}
export function currentUnitSystem(): ShowSystem | null {
  return systemSource()
}

// ------------------------------------------------------------------ numbers in the person's units

function trim(v: number, digits = 4): string {
  if (v === 0) return '0'
  return String(Number(v.toPrecision(digits)))
}

/** The unit a field is shown in, typeset (°C, mol %, kmol/h). */
export function shownUnit(shown: FieldShown, system: ShowSystem | null): string {
  if ('kind' in shown) return prettyUnit(system ? displayUnit(shown.kind, system) : QUANTITY_KINDS[shown.kind].caseUnit)
  return shown.unit
}

/** A case-unit number in the shown unit, as a number. */
export function caseToShown(shown: FieldShown, v: number, system: ShowSystem | null): number {
  if ('kind' in shown) return system ? fromSI(shown.kind, toSI(shown.kind, v), displayUnit(shown.kind, system)) : v
  return v * shown.scale
}

function withUnit(n: string, unit: string): string {
  return unit ? `${n} ${unit}` : n
}

/** A case-unit number with its unit in the person's system: '300 kmol/h', '120 %'. */
export function formatCaseValue(shown: FieldShown, v: number, system: ShowSystem | null, digits = 4): string {
  return withUnit(trim(caseToShown(shown, v, system), digits), shownUnit(shown, system))
}

/** A value as typed in a case (bare number or {value, unit}) in the person's system. */
function formatInput(shown: FieldShown, v: QuantityInput, system: ShowSystem | null): string {
  if (typeof v === 'number') return formatCaseValue(shown, v, system)
  if ('kind' in shown) {
    const si = toSI(shown.kind, v)
    const unit = system ? displayUnit(shown.kind, system) : QUANTITY_KINDS[shown.kind].caseUnit
    return withUnit(trim(fromSI(shown.kind, si, unit)), prettyUnit(unit))
  }
  return `${v.value} ${v.unit}`
}

function limitText(rule: CaseFieldRule, l: Limit, system: ShowSystem | null): string {
  return l.words ?? formatCaseValue(rule.shown, l.value, system)
}

/** Words with {kind:value} tokens, the values shown in the person's units. */
export function withUnits(text: string, system: ShowSystem | null): string {
  return text.replace(/\{(\w+):(-?[\d.]+)\}/g, (all, kind: string, v: string) =>
    kind in QUANTITY_KINDS ? formatCaseValue({ kind: kind as QuantityKind }, Number(v), system, 3) : all,
  )
}

/** The help text of a field in the person's units. */
export function helpText(rule: CaseFieldRule, system: ShowSystem | null): string {
  return withUnits(rule.help, system)
}

/** The typical range in the person's units: '3–12 mm', or '' when the rule has none. */
export function typicalText(rule: CaseFieldRule, system: ShowSystem | null): string {
  if (!rule.typical) return ''
  const [lo, hi] = rule.typical
  const unit = shownUnit(rule.shown, system)
  return withUnit(`${trim(caseToShown(rule.shown, lo, system), 3)}–${trim(caseToShown(rule.shown, hi, system), 3)}`, unit)
}

/**
 * The default the engine takes when the field is blank, in the person's units, or ''. Without
 * the unit when `bare` (a field shows its unit beside the number).
 */
export function defaultText(rule: CaseFieldRule, system: ShowSystem | null, bare = false): string {
  if (rule.default === undefined) return ''
  if (typeof rule.default === 'string') return withUnits(rule.default, system)
  return bare ? trim(caseToShown(rule.shown, rule.default, system)) : formatCaseValue(rule.shown, rule.default, system)
}

/**
 * What is wrong with a value of a field, as a sentence in the person's units
 * ('-300 kmol/h: the gas flow must be positive'), or null when it keeps the rule.
 */
export function ruleProblem(rule: CaseFieldRule, v: QuantityInput, system: ShowSystem | null = currentUnitSystem()): string | null {
  let c: number
  try {
    c = typeof v === 'number' ? v : 'kind' in rule.shown ? fromSI(rule.shown.kind, toSI(rule.shown.kind, v)) : v.value
  } catch {
    return null // the unit itself is refused elsewhere
  }
  if (!Number.isFinite(c)) return `not a number: enter ${rule.noun}`
  const { min, max } = rule
  const belowMin = min !== undefined && (min.open ? c <= min.value : c < min.value)
  const aboveMax = max !== undefined && (max.open ? c >= max.value : c > max.value)
  if (!belowMin && !aboveMax) return null
  let must: string
  if (belowMin && min) {
    if (min.value === 0 && !min.words) must = min.open ? 'must be positive' : 'must not be negative'
    else must = `must be ${min.open ? 'above' : 'at least'} ${limitText(rule, min, system)}`
  } else {
    must = `must be ${max!.open ? 'below' : 'at most'} ${limitText(rule, max!, system)}`
  }
  return `${formatInput(rule.shown, v, system)}: ${rule.noun} ${must}`
}

/** The message for a blank required field. */
export function requiredText(rule: CaseFieldRule | undefined): string {
  return rule ? `required: enter ${rule.noun}` : 'required'
}
