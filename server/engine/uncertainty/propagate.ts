/**
 * Uncertainty propagation through a built column: the case is designed at nominal values, then
 * the column (trays, diameter, solvent flow) is held and rated in n sampled worlds (Latin
 * hypercube over the multipliers of K, efficiency, gas flow, inlet solute fraction and the
 * prices). The answer: the chance the column meets its target (the case's recovery, or the
 * emission limit when one is set) and floods, the spread of recovery, percent flood and total
 * annualised cost, and what drives the spread of recovery.
 */
import {
  DEFAULT_EFFICIENCY_DISTRIBUTION,
  DEFAULT_K_DISTRIBUTION,
  UNCERTAIN_KEYS,
  uncertainLabels,
  type Distribution,
  type UncertainKey,
  type UncertaintySpec,
} from '../../../shared/schemas/uncertainty.ts'
import type { CostBasisData } from '../../../shared/schemas/costBasis.ts'
import { markSI, type UncertaintyResultSI } from '../../../shared/summaryUnits.ts'
import type { CaseSI } from '../case.ts'
import type { DesignResult } from '../contract.ts'
import { designSI } from '../design.ts'
import { InvalidInputError } from '../errors.ts'
import { fixColumn, rateSample, scratchOf, type FixedColumn, type SampleMultipliers, type SampleRating } from './column.ts'
import { latinHypercube, samplerOf } from './distributions.ts'
import { correlation, histogramOf, proportionError, ranksOf, spreadOf } from './statistics.ts'

type Active = Exclude<Distribution, { distribution: 'fixed' }>

/** One input as sampled: its distribution, where it came from, its draws and their ranks. */
export interface SampledInput {
  key: UncertainKey
  distribution: Active
  origin: 'given' | 'default'
  range: [number, number]
  note?: string
  values: Float64Array
  ranks: Uint32Array
}

/** The draws of a study: the same for every design rated with them (common random numbers). */
export interface SampleSet {
  n: number
  seed: number
  inputs: SampledInput[]
}

/** The target a sample must meet. */
export interface Target {
  kind: 'recovery' | 'emissionLimit'
  recovery: number
  /** kg/h; null when the target is a recovery */
  emissionLimit: number | null
}

/** Truncation of each multiplier to what the quantity allows. */
function boundsOf(key: UncertainKey, c: CaseSI, designEfficiency: number): { lo: number; hi: number; note?: string } {
  switch (key) {
    case 'efficiency':
      return { lo: 0.01, hi: 1 / designEfficiency, note: 'truncated so the overall efficiency stays at or below 1' }
    case 'soluteMoleFraction':
      return { lo: 1e-6, hi: 0.5 / c.gas.soluteMoleFraction, note: 'truncated to an inlet mole fraction below 0.5' }
    default:
      return { lo: 0.01, hi: Infinity, note: undefined }
  }
}

/**
 * Draw the samples of a study.
 * @param designEfficiency the nominal overall efficiency (bounds the efficiency multiplier)
 * @throws InvalidInputError when a distribution has no mass where the quantity is physical
 */
export function drawSamples(spec: UncertaintySpec, c: CaseSI, designEfficiency: number, n = spec.samples): SampleSet {
  const inputs: SampledInput[] = []
  UNCERTAIN_KEYS.forEach((key, stream) => {
    const given = spec[key]
    let d: Distribution | null | undefined = given
    let origin: 'given' | 'default' = 'given'
    if (given === undefined && (key === 'K' || key === 'efficiency')) {
      d = key === 'K' ? DEFAULT_K_DISTRIBUTION : DEFAULT_EFFICIENCY_DISTRIBUTION
      origin = 'default'
    }
    if (!d || d.distribution === 'fixed') return
    const { lo, hi, note } = boundsOf(key, c, designEfficiency)
    const s = samplerOf(d, lo, hi)
    if (!s) throw new InvalidInputError(`uncertainty.${key}`, `the distribution puts no weight on physical values (multiplier between ${lo} and ${hi.toPrecision(4)})`)
    const { values, ranks } = latinHypercube(s, n, spec.seed, stream)
    let lo2 = Infinity, hi2 = -Infinity
    for (const v of values) {
      if (v < lo2) lo2 = v
      if (v > hi2) hi2 = v
    }
    inputs.push({ key, distribution: d, origin, range: [lo2, hi2], ...(note && s.mass < 1 - 1e-9 ? { note } : {}), values, ranks })
  })
  return { n, seed: spec.seed, inputs }
}

/** The rated samples, as arrays. */
export interface SampleOutputs {
  recovery: Float64Array
  percentFlood: Float64Array
  totalAnnualCost: Float64Array
  meets: Uint8Array
  flooding: Uint8Array
  failed: number
  beyondFlooding: number
}

/** Does a rated sample meet the target? */
export function meetsTarget(r: SampleRating, t: Target): boolean {
  if (!Number.isFinite(r.recovery)) return false
  return t.kind === 'emissionLimit' ? r.soluteLost <= t.emissionLimit! : r.recovery >= t.recovery
}

/** Rate a fixed column in every sample. */
export function rateAll(fc: FixedColumn, set: SampleSet, target: Target): SampleOutputs {
  const n = set.n
  const o: SampleOutputs = {
    recovery: new Float64Array(n),
    percentFlood: new Float64Array(n),
    totalAnnualCost: new Float64Array(n),
    meets: new Uint8Array(n),
    flooding: new Uint8Array(n),
    failed: 0,
    beyondFlooding: 0,
  }
  const m: SampleMultipliers = { K: 1, efficiency: 1, gasFlow: 1, soluteMoleFraction: 1, electricity: 1, solventCost: 1, productValue: 1, emissionCharge: 1, capitalCost: 1 }
  const w = scratchOf(fc)
  const r: SampleRating = { recovery: 0, percentFlood: 0, totalAnnualCost: 0, soluteLost: 0, overallEfficiency: 0 }
  const cols = set.inputs.map((i) => ({ key: i.key, v: i.values }))
  for (let i = 0; i < n; i++) {
    for (const col of cols) m[col.key] = col.v[i]!
    rateSample(fc, m, w, r)
    o.recovery[i] = r.recovery
    o.totalAnnualCost[i] = r.totalAnnualCost
    if (!Number.isFinite(r.recovery)) o.failed++
    if (r.percentFlood === Infinity) {
      o.beyondFlooding++
      o.percentFlood[i] = NaN
      o.flooding[i] = 1
    } else {
      o.percentFlood[i] = r.percentFlood
      o.flooding[i] = r.percentFlood > 100 ? 1 : 0
    }
    o.meets[i] = meetsTarget(r, target) ? 1 : 0
  }
  return o
}

/** The target of a case: its recovery, or the emission limit [kg/h] when one is given. */
export function targetOf(c: CaseSI, emissionLimit: number | undefined): Target {
  if (emissionLimit === undefined) return { kind: 'recovery', recovery: c.recovery, emissionLimit: null }
  const soluteIn = c.gas.flow * c.gas.soluteMoleFraction * c.solute.molarMass * 3600
  return { kind: 'emissionLimit', recovery: Math.max(0, 1 - emissionLimit / soluteIn), emissionLimit }
}

export interface PropagateInput {
  c: CaseSI
  basis: CostBasisData
  spec: UncertaintySpec
  emissionLimit?: number
  /** A design to hold instead of the case designed at nominal values. */
  design?: DesignResult
}

const CAUTION =
  'The probabilities hold only as far as the distributions do: they describe the assumed scatter of K, efficiency, flows and prices, not errors of the correlations themselves beyond it. Confirm a permit-critical design with site data and a licensed engineer.'

/**
 * Propagate the uncertainty of a case through its nominal design.
 * @throws InvalidInputError | InfeasibleDesignError (the nominal design) | ConvergenceError
 */
export function propagate(input: PropagateInput): UncertaintyResultSI {
  const t0 = performance.now()
  const { c, basis, spec } = input
  const design = input.design ?? designSI(c, undefined, { profile: false, detail: false })
  const fc = fixColumn(c, design, basis)
  const target = targetOf(c, input.emissionLimit)
  const set = drawSamples(spec, c, fc.designEfficiency)
  const out = rateAll(fc, set, target)
  const nominal = rateSample(fc, { K: 1, efficiency: 1, gasFlow: 1, soluteMoleFraction: 1, electricity: 1, solventCost: 1, productValue: 1, emissionCharge: 1, capitalCost: 1 }, scratchOf(fc), { recovery: 0, percentFlood: 0, totalAnnualCost: 0, soluteLost: 0, overallEfficiency: 0 })
  const n = set.n
  let kMeet = 0, kFlood = 0, kBoth = 0
  for (let i = 0; i < n; i++) {
    kMeet += out.meets[i]!
    kFlood += out.flooding[i]!
    if (out.meets[i] && !out.flooding[i]) kBoth++
  }
  const recRanks = ranksOf(out.recovery)
  const raw = set.inputs.map((inp) => ({ key: inp.key, rho: correlation(inp.ranks, recRanks) }))
  const sum = raw.reduce((a, r) => a + r.rho * r.rho, 0)
  const contributions = raw
    .map((r) => ({ key: r.key, label: uncertainLabels[r.key], rankCorrelation: r.rho, share: sum > 0 ? (r.rho * r.rho) / sum : 0 }))
    .sort((a, b) => b.share - a.share)
  const costRanks = ranksOf(out.totalAnnualCost)
  const rawCost = set.inputs.map((inp) => ({ key: inp.key, rho: correlation(inp.ranks, costRanks) }))
  const sumCost = rawCost.reduce((a, r) => a + r.rho * r.rho, 0)
  const contributionsToCost = rawCost
    .map((r) => ({ key: r.key, label: uncertainLabels[r.key], rankCorrelation: r.rho, share: sumCost > 0 ? (r.rho * r.rho) / sumCost : 0 }))
    .sort((a, b) => b.share - a.share)
  const hist = histogramOf(out.recovery, 40)
  const warnings = c.warnings.slice()
  if (out.failed > 0) warnings.push({ code: 'samplesNotRated', message: `${out.failed} of ${n} samples could not be rated (no liquid in equilibrium with the sampled inlet gas, or a loaded lean solvent); they count as missing the target`, path: 'uncertainty' })
  if (out.beyondFlooding > 0) warnings.push({ code: 'beyondFloodingCorrelation', message: `${out.beyondFlooding} of ${n} samples load the trays beyond the flooding correlation; they count as flooding`, path: 'uncertainty' })
  const ms = performance.now() - t0
  const s = design.summary
  return markSI({
    samples: n,
    seed: set.seed,
    target: { ...target },
    design: {
      actualTrays: s.actualTrays,
      selectedDiameter: s.selectedDiameter,
      traySpacing: s.traySpacing,
      solventFlow: s.solventFlow, // mol/s (kmol/h at the edge: uncertaintyToPublic)
      designRecovery: c.recovery,
      nominalRecovery: nominal.recovery,
      nominalPercentFlood: Number.isFinite(nominal.percentFlood) ? nominal.percentFlood : 0,
      nominalTotalAnnualCost: nominal.totalAnnualCost,
      overallEfficiency: nominal.overallEfficiency,
      method: fc.nominal.method,
    },
    probabilityMeetsTarget: kMeet / n,
    probabilityFlooding: kFlood / n,
    probabilityMeetsTargetWithoutFlooding: kBoth / n,
    samplingError: { probabilityMeetsTarget: proportionError(kMeet, n), probabilityFlooding: proportionError(kFlood, n) },
    recovery: spreadOf(out.recovery),
    percentFlood: spreadOf(out.percentFlood),
    totalAnnualCost: spreadOf(out.totalAnnualCost),
    currency: fc.cost.currency,
    contributions,
    contributionsToCost,
    histogram: { variable: 'recovery', edges: hist.edges, counts: hist.counts, target: target.recovery },
    assumptions: set.inputs.map((i) => ({ key: i.key, label: uncertainLabels[i.key], distribution: i.distribution, origin: i.origin, range: i.range, ...(i.note ? { note: i.note } : {}) })),
    beyondFloodingCorrelation: out.beyondFlooding,
    failedSamples: out.failed,
    stats: { ms, msPerSample: ms / n },
    warnings,
    cautions: [...new Set([CAUTION, ...design.cautions])],
  })
}
