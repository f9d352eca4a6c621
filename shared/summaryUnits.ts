/**
 * The design summary at the edge. Inside the engine the summary is SI like everything else (molar
 * flows in mol/s, mass flows in kg/s, the solvent's volumetric flow in m^3/s); the public answer
 * (the API, the command lines, stored runs: shared/schemas/results.ts) carries molar flows in
 * kmol/h, mass flows in kg/h and the solvent's volumetric flow in m^3/h, the case-file units.
 * This file is the one table of which summary field is converted, and the two conversions,
 * both through the units library (shared/units.ts).
 *
 * The other summary fields (lengths, pressures, velocities, fractions, the gas volumetric flow in
 * m^3/s) are SI in both.
 */
import type { DesignResult, DesignSummary } from './schemas/results.ts'
import type { RobustResult, UncertaintyResult } from './schemas/uncertainty.ts'
import { fromSI, toSI, type QuantityKind } from './units.ts'

declare const inSI: unique symbol

/**
 * The engine's design summary: the keys of the public summary, every value in SI. The brand (a
 * type-only symbol, nothing at run time) keeps a public summary, read back from a stored run,
 * from reaching the engine without `summaryToSI`.
 */
export type DesignSummarySI = DesignSummary & { readonly [inSI]: true }

/** The engine's design result: the public shape with its summary in SI. */
export type DesignResultSI = DesignResult & { summary: DesignSummarySI }

/** Summary fields whose public unit is not SI, with their quantity kind (public unit = the kind's case unit). */
export const SUMMARY_PUBLIC_UNITS = {
  minimumSolventFlow: 'molarFlow', // kmol/h
  solventFlow: 'molarFlow', // kmol/h
  gasFlow: 'molarFlow', // kmol/h
  solventMassFlow: 'massFlow', // kg/h
  solventVolumetricFlow: 'liquidVolumetricFlow', // m^3/h
  soluteInGas: 'massFlow', // kg/h
  soluteAbsorbed: 'massFlow', // kg/h
  soluteLost: 'massFlow', // kg/h
} as const satisfies Partial<Record<keyof DesignSummary, QuantityKind>>

const CONVERTED = Object.entries(SUMMARY_PUBLIC_UNITS) as [keyof typeof SUMMARY_PUBLIC_UNITS, QuantityKind][]

/** Mark a summary converted to SI as such. */
function summaryInSI(s: DesignSummary): DesignSummarySI {
  return s as DesignSummarySI
}

/** The engine's SI summary in the public units (a new object; same keys in the same order). */
export function summaryToPublic(s: DesignSummarySI): DesignSummary {
  const out: DesignSummary = { ...s }
  for (const [key, kind] of CONVERTED) out[key] = fromSI(kind, s[key])
  return out
}

/** A public summary (e.g. of a stored run) in SI, for the engine (a new object). */
export function summaryToSI(s: DesignSummary): DesignSummarySI {
  const out: DesignSummary = { ...s }
  for (const [key, kind] of CONVERTED) out[key] = toSI(kind, s[key])
  return summaryInSI(out)
}

/** The engine's design result in the public units: only the summary changes (a new object, same key order). */
export function designToPublic(d: DesignResultSI): DesignResult {
  return { ...d, summary: summaryToPublic(d.summary) }
}

/**
 * The engine's uncertainty answer: the public shape with the design's solvent flow in mol/s. The
 * brand keeps it from being sent without `uncertaintyToPublic`.
 */
export type UncertaintyResultSI = UncertaintyResult & { readonly [inSI]: true }

/** The engine's robust optimum: the public shape with its solvent flows in mol/s. */
export type RobustResultSI = RobustResult & { readonly [inSI]: true }

/** Mark an engine answer built with SI flows as such (type only). */
export function markSI<T extends UncertaintyResult | RobustResult>(r: T): T & { readonly [inSI]: true } {
  return r as T & { readonly [inSI]: true }
}

/** The uncertainty answer in the public units (solvent flow in kmol/h; a new object). */
export function uncertaintyToPublic(r: UncertaintyResultSI): UncertaintyResult {
  return { ...r, design: { ...r.design, solventFlow: fromSI('molarFlow', r.design.solventFlow) } }
}

/** The robust optimum in the public units (solvent flows in kmol/h; a new object). */
export function robustToPublic(r: RobustResultSI): RobustResult {
  const kmolh = (x: number) => fromSI('molarFlow', x)
  return {
    ...r,
    nominal: { ...r.nominal, solventFlow: kmolh(r.nominal.solventFlow) },
    robust: r.robust ? { ...r.robust, solventFlow: kmolh(r.robust.solventFlow) } : r.robust,
    margin: r.margin ? { ...r.margin, extraSolventFlow: kmolh(r.margin.extraSolventFlow) } : r.margin,
  }
}
