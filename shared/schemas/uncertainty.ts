/**
 * Uncertainty propagation: the request (a case, optionally a cost basis, and an `uncertainty`
 * object of distributions) and the answer (the chance of meeting the target, the spread of
 * recovery, percent flood and cost, what drives the spread). Shared by the engine, the API, the
 * command line and the client.
 *
 * Every distribution is of a MULTIPLIER on the nominal value (median or mean 1 by default): K x 1.2
 * means a K 20 % above the case's.
 */
import { z } from 'zod'
import { caseSchema } from './case.ts'
import { costBasisSchema } from './costBasis.ts'
import { searchSpecSchema } from './search.ts'

const positive = z.number().positive()

/** A distribution of a multiplier on a nominal value. `null` or `fixed`: held at the nominal value. */
export const distributionSchema = z.discriminatedUnion('distribution', [
  z.object({
    distribution: z.literal('lognormal'),
    /** Standard deviation of ln(multiplier). */
    sigma: positive.max(2),
    /** Median of the multiplier. */
    median: positive.default(1),
  }).strict(),
  z.object({
    distribution: z.literal('normal'),
    /** Standard deviation relative to the nominal value (0.15 = 15 %). */
    relativeSd: positive.max(2),
    mean: positive.default(1),
  }).strict(),
  z.object({ distribution: z.literal('uniform'), low: z.number().nonnegative(), high: positive }).strict()
    .refine((d) => d.low < d.high, { message: 'low must be below high', path: ['high'] }),
  z.object({ distribution: z.literal('triangular'), low: z.number().nonnegative(), mode: positive, high: positive }).strict()
    .refine((d) => d.low <= d.mode && d.mode <= d.high && d.low < d.high, { message: 'needs low <= mode <= high with low < high', path: ['mode'] }),
  z.object({ distribution: z.literal('fixed') }).strict(),
])
export type Distribution = z.infer<typeof distributionSchema>

/** The uncertain quantities the engine knows, in a fixed order (the order of the answer). */
export const UNCERTAIN_KEYS = ['K', 'efficiency', 'gasFlow', 'soluteMoleFraction', 'electricity', 'solventCost', 'productValue', 'emissionCharge', 'capitalCost'] as const
export type UncertainKey = (typeof UNCERTAIN_KEYS)[number]

export const uncertainLabels: Record<UncertainKey, string> = {
  K: 'Equilibrium K',
  efficiency: 'Tray efficiency',
  gasFlow: 'Gas flow',
  soluteMoleFraction: 'Inlet solute fraction',
  electricity: 'Electricity price',
  solventCost: 'Solvent cost',
  productValue: 'Product value',
  emissionCharge: 'Emission charge',
  capitalCost: 'Installed capital',
}

/** Defaults used only when the uncertainty object does not mention K or efficiency at all. */
export const DEFAULT_K_DISTRIBUTION = { distribution: 'lognormal', sigma: 0.2, median: 1 } as const
export const DEFAULT_EFFICIENCY_DISTRIBUTION = { distribution: 'normal', relativeSd: 0.15, mean: 1 } as const
export const DEFAULT_SAMPLES = 10000

const dist = distributionSchema.nullable().optional()

export const uncertaintySpecSchema = z.object({
  samples: z.number().int().min(100).max(200000).default(DEFAULT_SAMPLES),
  seed: z.number().int().min(0).max(4294967295).default(1),
  K: dist,
  efficiency: dist,
  gasFlow: dist,
  soluteMoleFraction: dist,
  electricity: dist,
  solventCost: dist,
  productValue: dist,
  emissionCharge: dist,
  capitalCost: dist,
}).strict()
export type UncertaintySpecInput = z.input<typeof uncertaintySpecSchema>
export type UncertaintySpec = z.infer<typeof uncertaintySpecSchema>

/** The request: { case, costBasis?, search? (its emissionLimit sets the target), uncertainty? }. */
export const uncertaintyRequestSchema = z.looseObject({
  case: caseSchema,
  costBasis: z.union([z.object({ preset: z.string() }).loose(), costBasisSchema]).optional(),
  search: searchSpecSchema.partial().optional().meta({ description: 'only emissionLimit [kg/h] is used: the target becomes the release limit' }),
  uncertainty: uncertaintySpecSchema.optional(),
  siteId: z.number().int().positive().optional(),
})

/** The robust optimum's settings (key `robust` of an optimisation request). */
export const robustSpecSchema = z.object({
  confidence: z.number().gt(0.5).lt(1).default(0.95),
  uncertainty: uncertaintySpecSchema.optional(),
  /** Samples per candidate design inside the search (common random numbers); the winner is re-checked with `uncertainty.samples`. */
  searchSamples: z.number().int().min(100).max(20000).default(1000),
}).strict()
export type RobustSpec = z.infer<typeof robustSpecSchema>
export type RobustSpecInput = z.input<typeof robustSpecSchema>

// ------------------------------------------------------------------ the answer

const finite = z.number()
export const spreadSchema = z.object({ mean: finite, p05: finite, p50: finite, p95: finite })
export type Spread = z.infer<typeof spreadSchema>

const proportionErrorSchema = z.object({
  standardError: finite.meta({ description: 'sqrt(p(1-p)/(n-1)): an upper bound for Latin hypercube sampling' }),
  low95: finite,
  high95: finite.meta({ description: 'Wilson score interval, 95 %' }),
})

export const uncertainAssumptionSchema = z.looseObject({
  key: z.enum(UNCERTAIN_KEYS),
  label: z.string(),
  distribution: distributionSchema,
  /** How the input was chosen: given in the request, the product default, or held nominal. */
  origin: z.enum(['given', 'default']),
  /** Smallest and largest multiplier drawn (after truncation). */
  range: z.tuple([finite, finite]),
  note: z.string().optional(),
})

export const contributionSchema = z.looseObject({
  key: z.enum(UNCERTAIN_KEYS),
  label: z.string(),
  /** Spearman rank correlation of the multiplier with recovery. */
  rankCorrelation: finite,
  /** Share of the spread: rho^2 / sum rho^2. */
  share: finite,
})

export const uncertaintyResultSchema = z.looseObject({
  samples: z.number().int(),
  seed: z.number().int(),
  target: z.looseObject({
    kind: z.enum(['recovery', 'emissionLimit']),
    recovery: finite.meta({ description: 'the recovery the column must reach (for an emission limit: at nominal gas)' }),
    emissionLimit: finite.nullable().meta({ description: 'kg/h' }),
  }),
  design: z.looseObject({
    actualTrays: z.number().int(),
    selectedDiameter: finite,
    traySpacing: finite,
    solventFlow: finite.meta({ description: 'kmol/h' }),
    designRecovery: finite,
    nominalRecovery: finite.meta({ description: 'recovery of the built column at nominal values (trays rounded up)' }),
    nominalPercentFlood: finite,
    nominalTotalAnnualCost: finite,
    overallEfficiency: finite,
    method: z.string(),
  }),
  probabilityMeetsTarget: finite,
  probabilityFlooding: finite,
  probabilityMeetsTargetWithoutFlooding: finite,
  samplingError: z.object({ probabilityMeetsTarget: proportionErrorSchema, probabilityFlooding: proportionErrorSchema }),
  recovery: spreadSchema,
  percentFlood: spreadSchema,
  totalAnnualCost: spreadSchema,
  currency: z.string(),
  contributions: z.array(contributionSchema),
  contributionsToCost: z.array(contributionSchema).meta({ description: 'the same rank correlations with the total annualised cost' }),
  histogram: z.looseObject({
    variable: z.literal('recovery'),
    edges: z.array(finite),
    counts: z.array(z.number().int()),
    target: finite,
  }),
  assumptions: z.array(uncertainAssumptionSchema),
  beyondFloodingCorrelation: z.number().int().meta({ description: 'samples whose liquid load lies beyond the flooding correlation (counted as flooding; left out of the percent-flood spread)' }),
  failedSamples: z.number().int().meta({ description: 'samples that could not be rated (count as missing the target)' }),
  stats: z.looseObject({ ms: finite, msPerSample: finite }),
  warnings: z.array(z.looseObject({ code: z.string(), message: z.string(), path: z.string().optional() })),
  cautions: z.array(z.string()),
})
export type UncertaintyResult = z.infer<typeof uncertaintyResultSchema>

/** The robust optimum in an optimisation answer. */
export const robustResultSchema = z.looseObject({
  confidence: finite,
  currency: z.string(),
  floor: z.looseObject({ recovery: finite, emissionLimit: finite.nullable() }),
  found: z.boolean(),
  reason: z.string().optional(),
  heldAtNominalOptimum: z.array(z.string()),
  nominal: z.looseObject({
    recovery: finite, solventFactor: finite, actualTrays: z.number().int(), selectedDiameter: finite, solventFlow: finite,
    totalAnnualCost: finite, expectedTotalAnnualCost: finite, probabilityMeetsFloor: finite,
  }),
  robust: z.looseObject({
    recovery: finite, solventFactor: finite, traySpacing: finite, floodFraction: finite, actualTrays: z.number().int(), selectedDiameter: finite, solventFlow: finite,
    totalAnnualCost: finite, expectedTotalAnnualCost: finite, probabilityMeetsFloor: finite, probabilityStandardError: finite,
  }).nullable(),
  margin: z.looseObject({ extraTrays: z.number().int(), extraSolventFlow: finite, extraSolventFraction: finite, extraTotalAnnualCost: finite, extraExpectedTotalAnnualCost: finite }).nullable(),
  searchSamples: z.number().int(),
  checkSamples: z.number().int(),
  candidates: z.number().int(),
  ms: finite,
})
export type RobustResult = z.infer<typeof robustResultSchema>
