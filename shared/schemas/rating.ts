/**
 * Rating of a standing column: the request (a case plus the as-built column and the solvent
 * flow) and the answer. Shared by the engine, the API, the command line and the client.
 *
 * Quantities follow the case-file conventions (a bare number in the case unit of its kind, or
 * { "value": v, "unit": "..." }); answers are SI with molar flows in kmol/h.
 */
import { z } from 'zod'
import { caseSchema, columnSchema, quantity } from './case.ts'
import { checkResultSchema, engineWarningSchema } from './results.ts'

/** The as-built column. Optional items are filled by the design rules (the answer lists them). */
export const asBuiltColumnSchema = columnSchema.extend({
  diameter: quantity('length'),
  actualTrays: z.number().int('must be a whole number of trays').positive('must be at least 1').max(500),
  traySpacing: quantity('length'),
  weirLength: quantity('length').optional(),
  downcomerAreaFraction: z.number().optional(),
  activeAreaFraction: z.number().optional(),
  weirHeight: quantity('smallLength').optional(),
}).strict()

/** One rating case: a design case without the targets, plus `column` and `solventFlow`. */
export const rateCaseSchema = caseSchema
  .omit({ recovery: true, solventFactor: true, column: true })
  .extend({
    column: asBuiltColumnSchema,
    solventFlow: quantity('molarFlow'),
  })

export const rateBatchSchema = z.looseObject({ cases: z.array(rateCaseSchema).min(1) })

export type AsBuiltColumnInput = z.infer<typeof asBuiltColumnSchema>
export type RateCaseInput = z.infer<typeof rateCaseSchema>

// ------------------------------------------------------------------ the answer


/** A point of the operating window: solvent flow and gas flow [kmol/h]. */
export const windowPointSchema = z.object({ solventFlow: z.number(), gasFlow: z.number() })
export type WindowPoint = z.infer<typeof windowPointSchema>

export const WINDOW_BOUNDARIES = ['flooding', 'entrainment', 'weeping', 'downcomerBackup'] as const
export type WindowBoundaryKey = (typeof WINDOW_BOUNDARIES)[number]

export const operatingWindowSchema = z.object({
  /** Each limit as a polyline of gas flow against solvent flow; points only where the limit falls inside the searched range. */
  boundaries: z.array(
    z.object({
      key: z.enum(WINDOW_BOUNDARIES),
      label: z.string(),
      side: z.enum(['upper', 'lower']),
      limit: z.string(),
      points: z.array(windowPointSchema),
    }),
  ),
  /** The stable region: for each solvent flow, the gas flows between the lower and the upper bound. */
  region: z.array(z.object({ solventFlow: z.number(), gasFlowMin: z.number(), gasFlowMax: z.number() })),
  current: windowPointSchema,
  /** True when the current point lies inside every limit. */
  inside: z.boolean(),
  /** The limits the current point is beyond (keys of boundaries). */
  violated: z.array(z.enum(WINDOW_BOUNDARIES)),
  solventFlowRange: z.tuple([z.number(), z.number()]),
  gasFlowRange: z.tuple([z.number(), z.number()]),
  basis: z.string(),
})
export type OperatingWindow = z.infer<typeof operatingWindowSchema>

export const ratingSummarySchema = z.object({
  recovery: z.number(),
  outletGasSoluteMoleFraction: z.number(),
  richSolventSoluteMoleFraction: z.number(),
  theoreticalStages: z.number(),
  overallEfficiency: z.number(),
  percentFlood: z.number(),
  floodingGasFlow: z.number(), // kmol/h at this L/V
  weepingGasFlow: z.number(), // kmol/h at this solvent flow
  pressureDropPerTray: z.number(), // Pa
  columnPressureDrop: z.number(), // Pa
})
export type RatingSummary = z.infer<typeof ratingSummarySchema>

export const ratingResultSchema = z.object({
  summary: ratingSummarySchema,
  operation: z.object({
    gasFlow: z.number(), // kmol/h
    solventFlow: z.number(), // kmol/h
    inletGasSoluteMoleFraction: z.number(),
    absorptionFactor: z.number(),
    method: z.enum(['kremser', 'stageByStage']),
    flowParameter: z.number(),
    floodingVelocity: z.number(), // m/s on the net area
  }),
  column: z.object({
    diameter: z.number(), // m
    actualTrays: z.number(),
    traySpacing: z.number(), // m
    weirLength: z.number(), // m
    downcomerAreaFraction: z.number(),
    activeAreaFraction: z.number(),
    weirHeight: z.number(), // m
    holeAreaFraction: z.number(), // hole / active
    towerArea: z.number(), // m2
    netArea: z.number(),
    activeArea: z.number(),
    holeArea: z.number(),
    downcomerArea: z.number(),
  }),
  /** Column items that were not given and were filled by a design rule. */
  filled: z.array(z.object({ path: z.string(), value: z.number(), unit: z.string(), rule: z.string() })),
  checks: z.array(checkResultSchema),
  window: operatingWindowSchema,
  warnings: z.array(engineWarningSchema),
  cautions: z.array(z.string()),
})
export type RatingResult = z.infer<typeof ratingResultSchema>

/** Optional window settings beside a rating request (flows in kmol/h). */
export const windowOptionsSchema = z
  .object({
    solventFlowMin: z.number().positive().optional(),
    solventFlowMax: z.number().positive().optional(),
    points: z.number().int().min(5).max(201).optional(),
  })
  .strict()
export type WindowOptionsInput = z.infer<typeof windowOptionsSchema>

/**
 * Monitoring of a standing column in its operating log: each logged month rated with the
 * as-built column (flows in kmol/h), the drift status and the split of the month's cost gap.
 * The engine (server/engine/rating/monitoring.ts), the API answer and the client take their
 * types from these.
 */
export const monthRatingSchema = z.object({
  month: z.string().meta({ description: 'YYYY-MM' }),
  gasFlow: z.number().meta({ description: 'kmol/h' }),
  solventFlow: z.number().meta({ description: 'kmol/h' }),
  inletMoleFraction: z.number(),
  expectedRecovery: z.number(),
  measuredRecovery: z.number().nullable(),
  /** Overall efficiency the column achieved (null without a measurement or when the measurement is beyond any stage count). */
  achievedEfficiency: z.number().nullable(),
  designEfficiency: z.number(),
  belowDriftMargin: z.boolean(),
  percentFlood: z.number(),
  insideWindow: z.boolean(),
  violated: z.array(z.enum(WINDOW_BOUNDARIES)),
  /** Solvent the design recovery needed at the month's gas with the as-built column [kmol/h]; null when no solvent rate reaches it. */
  solventNeeded: z.number().nullable(),
  note: z.string().optional(),
})
export type MonthRating = z.infer<typeof monthRatingSchema>

/** A month's cost gap against the approved optimum, split so that the parts add up to the gap (currency). */
export const costGapSplitSchema = z.object({
  /** Approved optimum's month cost at design throughput, approval basis. */
  reference: z.number(),
  actual: z.number(),
  gap: z.number(),
  prices: z.number(),
  throughput: z.number(),
  excessSolvent: z.number(),
  efficiencyLoss: z.number(),
  other: z.number(),
})
export type CostGapSplit = z.infer<typeof costGapSplitSchema>

export const driftStatusSchema = z.object({
  margin: z.number(),
  run: z.number().int(),
  warning: z.boolean(),
  /** First month of the latest run of months below the margin (when warning). */
  since: z.string().nullable(),
  message: z.string().nullable(),
})
export type DriftStatus = z.infer<typeof driftStatusSchema>

const designPointSchema = z.object({ gasFlow: z.number(), solventFlow: z.number(), recovery: z.number() })

export const monitoringSchema = z.object({
  ratingCase: z.record(z.string(), z.unknown()),
  designPoint: designPointSchema.extend({ overallEfficiency: z.number() }),
  drift: driftStatusSchema,
  window: operatingWindowSchema,
  months: z.array(monthRatingSchema.extend({ costGap: costGapSplitSchema.nullable() })),
})
export type Monitoring = z.infer<typeof monitoringSchema>

/** The standing column of an approved study: its rating case, design point, rating and logged months. */
export const standingColumnSchema = z.object({
  ratingCase: z.record(z.string(), z.unknown()),
  designPoint: designPointSchema,
  rating: ratingResultSchema,
  months: z.array(z.object({ month: z.string(), gasFlow: z.number(), solventFlow: z.number() })),
})
export type StandingColumn = z.infer<typeof standingColumnSchema>
