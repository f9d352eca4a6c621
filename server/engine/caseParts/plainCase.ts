/**
 * The plain case, read without zod: a case whose quantities are bare numbers in the case units,
 * whose sections hold only known keys, and whose every value keeps its field rule
 * (shared/schemas/caseRules.ts) is what caseSchema accepts, and its output is a copy of the input.
 * readPlainCase checks exactly that and returns the copy; anything else (a { value, unit }
 * quantity, a table, a spacing rule, an unknown key, a value that breaks a rule, a missing
 * required field) returns null, and the caller parses with caseSchema, which gives the
 * messages. A test compares the two on every example case and on changed ones.
 */
import type { CaseInput } from '../../../shared/schemas/case.ts'
import { ruleFor, ruleProblem, type CaseFieldRule } from '../../../shared/schemas/caseRules.ts'

type Obj = Record<string, unknown>

/** A field: its path in the case rules, or '' for a finite number without a rule; 'string' for a non-empty string. */
type FieldSpec = Readonly<Record<string, string>>

const isPlainObject = (v: unknown): v is Obj => {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) return false
  const p = Object.getPrototypeOf(v)
  return p === Object.prototype || p === null
}

const rules = new Map<string, CaseFieldRule | null>()
function rule(path: string): CaseFieldRule | null {
  let r = rules.get(path)
  if (r === undefined) rules.set(path, (r = ruleFor(path) ?? null))
  return r
}

/** A finite number that keeps the rule of its field ('' for none; a path without a rule goes to the schema). */
function numberOk(v: unknown, path: string): boolean {
  if (typeof v !== 'number' || !Number.isFinite(v)) return false
  if (path === '') return true
  const r = rule(path)
  return r !== null && ruleProblem(r, v, null) === null
}

/** A copy of a section whose keys are all in `spec` and whose values all keep their rules; null otherwise. */
function section(v: unknown, spec: FieldSpec, required: readonly string[] = []): Obj | null {
  if (!isPlainObject(v)) return null
  for (const k of required) if (!(k in v)) return null
  const out: Obj = {}
  for (const k in v) {
    if (!Object.prototype.hasOwnProperty.call(spec, k)) return null
    const x = v[k]
    const s = spec[k]!
    if (s === 'string') {
      if (typeof x !== 'string' || x.length === 0) return null
    } else if (s.startsWith('=')) {
      if (!s.slice(1).split('|').includes(x as string)) return null
    } else if (!numberOk(x, s)) return null
    out[k] = x
  }
  return out
}

const GAS: FieldSpec = { flow: 'gas.flow', temperature: 'gas.temperature', pressure: 'gas.pressure', soluteMoleFraction: 'gas.soluteMoleFraction', carrierMolarMass: 'gas.carrierMolarMass', carrier: 'string', viscosity: '' }
const SOLUTE: FieldSpec = { name: 'string', molarMass: 'solute.molarMass' }
const SOLVENT: FieldSpec = {
  name: 'string',
  temperature: 'solvent.temperature',
  soluteMoleFraction: 'solvent.soluteMoleFraction',
  molarMass: 'solvent.molarMass',
  density: 'solvent.density',
  viscosity: 'solvent.viscosity',
  surfaceTension: 'solvent.surfaceTension',
}
const EQUILIBRIUM: Readonly<Record<string, FieldSpec>> = {
  constantK: { model: 'string', K: 'equilibrium.K' },
  henry: { model: 'string', Hcp: 'equilibrium.Hcp', B: 'equilibrium.B' },
  modifiedRaoult: { model: 'string', gammaInf: 'equilibrium.gammaInf', activityModel: '=constant|margules', vapourPressure: 'equilibrium.vapourPressure' },
}
const TRAY: FieldSpec = {
  holeDiameter: 'tray.holeDiameter',
  holePitch: 'tray.holePitch',
  thickness: 'tray.thickness',
  spacing: 'tray.spacing',
  floodFraction: 'tray.floodFraction',
  foamingFactor: 'tray.foamingFactor',
  weirHeight: 'tray.weirHeight',
  downcomerClearance: 'tray.downcomerClearance',
  turndownFraction: 'tray.turndownFraction',
}
const EFFICIENCY: Readonly<Record<string, FieldSpec>> = { oconnell: { model: 'string' }, fixed: { model: 'string', value: 'efficiency.value' } }
const COLUMN: FieldSpec = { temperature: 'column.temperature', diameterStep: 'column.diameterStep', topAllowance: 'column.topAllowance', bottomAllowance: 'column.bottomAllowance' }
const VESSEL: FieldSpec = {
  designPressure: 'vessel.designPressure',
  allowableStress: 'vessel.allowableStress',
  jointEfficiency: 'vessel.jointEfficiency',
  corrosionAllowance: 'vessel.corrosionAllowance',
  materialDensity: 'vessel.materialDensity',
}

/** A library name, or an object section. */
function nameOr(v: unknown, spec: FieldSpec): string | Obj | null {
  if (typeof v === 'string') return v.length > 0 ? v : null
  return section(v, spec)
}

/** One of several sections chosen by their `model`. */
function byModel(v: unknown, specs: Readonly<Record<string, FieldSpec>>, required: Readonly<Record<string, readonly string[]>>): Obj | null {
  if (!isPlainObject(v) || typeof v.model !== 'string' || !Object.prototype.hasOwnProperty.call(specs, v.model)) return null
  return section(v, specs[v.model]!, required[v.model])
}

/** The tray: a spacing of 'auto' or a length; no spacing rule (that one goes through the schema). */
function tray(v: unknown): Obj | null {
  if (!isPlainObject(v)) return null
  if (v.spacing === 'auto') {
    const { spacing: _auto, ...rest } = v
    const out = section(rest, TRAY)
    return out && { ...out, spacing: 'auto' }
  }
  return section(v, TRAY)
}

const KNOWN = new Set(['name', 'description', 'gas', 'solute', 'solvent', 'equilibrium', 'recovery', 'solventFactor', 'tray', 'efficiency', 'method', 'column', 'vessel'])

/** The case as caseSchema would return it, when the case is plain; null when it must go through caseSchema. */
export function readPlainCase(raw: unknown): CaseInput | null {
  if (!isPlainObject(raw)) return null
  const out: Obj = {}
  for (const k in raw) {
    if (k === '__proto__') return null
    const v = raw[k]
    if (v === undefined) return null
    if (!KNOWN.has(k)) out[k] = v
  }
  if (raw.name !== undefined) {
    if (typeof raw.name !== 'string') return null
    out.name = raw.name
  }
  if (raw.description !== undefined) {
    if (typeof raw.description !== 'string') return null
    out.description = raw.description
  }
  const gas = section(raw.gas, GAS, ['flow', 'temperature', 'pressure', 'soluteMoleFraction'])
  const solute = nameOr(raw.solute, SOLUTE)
  const solvent = nameOr(raw.solvent, SOLVENT)
  const equilibrium = byModel(raw.equilibrium, EQUILIBRIUM, { constantK: ['K'] })
  if (!gas || !solute || !solvent || !equilibrium) return null
  if (!numberOk(raw.recovery, 'recovery') || !numberOk(raw.solventFactor, 'solventFactor')) return null
  out.gas = gas
  out.solute = solute
  out.solvent = solvent
  out.equilibrium = equilibrium
  out.recovery = raw.recovery
  out.solventFactor = raw.solventFactor
  if (raw.tray !== undefined && !(out.tray = tray(raw.tray))) return null
  if (raw.efficiency !== undefined && !(out.efficiency = byModel(raw.efficiency, EFFICIENCY, { fixed: ['value'] }))) return null
  if (raw.method !== undefined) {
    if (raw.method !== 'auto' && raw.method !== 'kremser' && raw.method !== 'stageByStage') return null
    out.method = raw.method
  }
  if (raw.column !== undefined && !(out.column = section(raw.column, COLUMN))) return null
  if (raw.vessel !== undefined && !(out.vessel = section(raw.vessel, VESSEL))) return null
  return out as CaseInput
}
