/** Sensitivity (tornado) of the optimum to the cost basis. */
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import { toR, type Box, type Evaluator, type SensitivityEntry, type X } from './evaluator.ts'
import { refine } from './search.ts'

export interface SensItem {
  item: string
  label: string
  unit: string
  get: (b: CostBasisData) => number
  set: (b: CostBasisData, v: number) => void
  integer?: boolean
  max?: number
}

export const sensitivityItems: SensItem[] = [
  { item: 'electricityPrice', label: 'Electricity price', unit: 'currency/kWh', get: (b) => b.utilities.electricityPrice, set: (b, v) => { b.utilities.electricityPrice = v } },
  { item: 'solventCost', label: 'Solvent make-up / treatment cost', unit: 'currency/m3', get: (b) => b.utilities.solventCost, set: (b, v) => { b.utilities.solventCost = v } },
  { item: 'productValue', label: 'Product value', unit: 'currency/kg', get: (b) => b.utilities.productValue, set: (b, v) => { b.utilities.productValue = v } },
  { item: 'emissionCharge', label: 'Emission charge', unit: 'currency/kg', get: (b) => b.utilities.emissionCharge, set: (b, v) => { b.utilities.emissionCharge = v } },
  { item: 'interestRate', label: 'Interest rate', unit: '1/yr', get: (b) => b.capital.interestRate, set: (b, v) => { b.capital.interestRate = v } },
  { item: 'economicLife', label: 'Economic life', unit: 'yr', integer: true, get: (b) => b.capital.economicLife, set: (b, v) => { b.capital.economicLife = v } },
  { item: 'operatingHours', label: 'Operating hours', unit: 'h/yr', max: 8760, get: (b) => b.general.operatingHours, set: (b, v) => { b.general.operatingHours = v } },
  {
    item: 'installationFactors',
    label: 'Installation factors (all)',
    unit: '×',
    get: () => 1,
    set: (b, v) => {
      const f = b.capital.installationFactors
      f.shell *= v
      f.platforms *= v
      f.trays *= v
      f.pump *= v
      f.motor *= v
      f.blower *= v
    },
  },
  { item: 'equipmentCost', label: 'Equipment cost level (cost index)', unit: '-', get: (b) => b.general.targetIndex, set: (b, v) => { b.general.targetIndex = v } },
  { item: 'shellMaterialFactor', label: 'Shell and tray material cost', unit: '×', get: () => 1, set: (b, v) => {
    b.correlations.shell.materialFactor *= v
    b.correlations.trays.materialFactorConstant *= v
    b.correlations.trays.materialFactorSlope *= v
  } },
]

/**
 * A copy of plain data (objects, arrays, numbers, strings): the cost basis is copied twice per
 * item, and structuredClone's serialiser costs several times this walk.
 */
function clonePlain<T>(v: T): T {
  if (Array.isArray(v)) return v.map(clonePlain) as T
  if (v !== null && typeof v === 'object') {
    const out: Record<string, unknown> = {}
    for (const k of Object.keys(v)) out[k] = clonePlain((v as Record<string, unknown>)[k])
    return out as T
  }
  return v
}

/** Made on first need: building a number format loads the locale data (tens of ms). */
let thousands: Intl.NumberFormat | undefined

/**
 * A number with its thousands separated as en-GB writes them (1,234,567): whole numbers written
 * without exponent are grouped here, anything else goes through Intl.NumberFormat('en-GB').
 */
export function groupThousands(r: number): string {
  const s = String(r)
  if (/^-?\d+$/.test(s) && !Object.is(r, -0)) return s.replace(/\B(?=(\d{3})+$)/g, ',')
  return (thousands ??= new Intl.NumberFormat('en-GB')).format(r)
}

/** A number for a note: 4 significant digits, thousands separated. */
function num(v: number): string {
  const r = Number(v.toPrecision(4))
  return Math.abs(r) >= 1000 ? groupThousands(r) : String(r)
}
const signedPct = (c: number): string => `${c >= 0 ? '+' : '\u2212'}${Number(Math.abs(100 * c).toPrecision(3))} %`

/** The value used for one bar, its relative change and a note saying what was used and why it was limited. */
export function sensitivityValue(it: SensItem, base: number, change: number): { value: number; change: number; limited: boolean; note: string } {
  const asked = base * (1 + change)
  let v = asked
  const why: string[] = []
  if (it.integer) {
    v = Math.max(1, Math.round(v))
    if (v !== asked) why.push(`rounded to a whole number of ${it.unit === 'yr' ? 'years' : 'units'}`)
  }
  if (it.max !== undefined && v > it.max) {
    v = it.max
    why.push(it.item === 'operatingHours' ? `capped at ${num(it.max)} ${it.unit}, the hours in a year` : `capped at ${num(it.max)} ${it.unit}`)
  }
  const used = v / base - 1
  const limited = Math.abs(v - asked) > 1e-12 * Math.abs(asked)
  const unit = it.unit === '×' ? '\u00d7 base' : it.unit === '-' ? '' : it.unit
  let note = `${signedPct(used)}: ${num(v)}${unit ? ` ${unit}` : ''}`
  if (limited) note += ` (${why.join(', ')}; ${signedPct(change)} asked)`
  return { value: v, change: used, limited, note }
}

/**
 * Sensitivity (tornado): each cost-basis item changed by ±fraction (integer items rounded,
 * operating hours capped at 8760 h/yr, items whose base value is 0 left out), re-optimised
 * locally from the base optimum (ridge searches on its tray count and the neighbouring counts,
 * a short pattern search and one polish round; the spacing stays unless the pattern search
 * moves it). Each bar carries the value actually used and a note saying why when it was limited;
 * repricedTac is the base optimum's design priced at that value (the re-optimised tac is never
 * above it: the local search starts there and accepts only improvements).
 */
export function sensitivity(ev: Evaluator, basis: CostBasisData, box: Box, at: X, fraction: number): SensitivityEntry[] {
  const out: SensitivityEntry[] = []
  for (const it of sensitivityItems) {
    const base = it.get(basis)
    if (base === 0) continue
    const side = (sign: -1 | 1) => {
      const sv = sensitivityValue(it, base, sign * fraction)
      const b = clonePlain(basis)
      it.set(b, sv.value)
      const repricedTac = ev.tac(at, b)
      const p = refine(ev, b, box, { x: at, tac: repricedTac }, true)
      return { sv, bar: { value: sv.value, tac: p.tac, repricedTac, recovery: toR(p.x.u), solventFactor: p.x.s } }
    }
    const lo = side(-1)
    const hi = side(1)
    out.push({
      item: it.item,
      label: it.label,
      unit: it.unit,
      baseValue: base,
      lowValue: lo.sv.value,
      highValue: hi.sv.value,
      lowChange: lo.sv.change,
      highChange: hi.sv.change,
      lowLimited: lo.sv.limited,
      highLimited: hi.sv.limited,
      lowNote: lo.sv.note,
      highNote: hi.sv.note,
      low: lo.bar,
      high: hi.bar,
    })
  }
  return out
}
