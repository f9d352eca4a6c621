import { z } from 'zod'
import { robustResultSchema, uncertaintyResultSchema } from './uncertainty.ts'

/**
 * The answers of the engine, defined once: the design engine, the cost model and the optimiser
 * return these shapes (server/engine/contract.ts takes its types from here), the OpenAPI document
 * describes them and the client parses its answers with them.
 *
 * SI throughout, except molar flows in kmol/h and mass flows in kg/h (the product's public
 * convention), and money in the cost basis's currency per year.
 *
 * The answer objects are loose: a field the engine adds is kept by the client's parse and
 * accepted by these types, rather than silently dropped. The fields listed are the ones every
 * answer carries (or may carry, where optional).
 */

const finite = z.number()

export const engineWarningSchema = z.looseObject({
  code: z.string().meta({ description: "What kind of warning, e.g. 'outsideValidity'" }),
  message: z.string(),
  path: z.string().optional().meta({ description: 'Input field concerned, e.g. tray.holeDiameter' }),
})

/** A pass / warn / fail verdict for one tray or column check. */
export const checkResultSchema = z.looseObject({
  key: z.string().meta({ description: "e.g. 'pressureDropPerTray', 'weeping', 'entrainment', 'downcomerBackup', 'flooding'" }),
  label: z.string(),
  status: z.enum(['pass', 'warn', 'fail']),
  value: finite,
  limit: finite,
  /** Whether the limit is a maximum or a minimum. */
  direction: z.enum(['max', 'min']).optional().meta({ description: "'max': the value must stay at or below the limit; 'min': at or above it" }),
  unit: z.string().meta({ description: "Unit of value and limit, e.g. 'Pa', 'm', 's', '-'" }),
  advice: z.string().optional(),
  source: z.string().optional().meta({ description: 'Method and reference key(s)' }),
})

/** The design summary: the first keys are the stable public interface; every value is a number. */
export const designSummarySchema = z
  .object({
    minimumSolventFlow: finite.meta({ description: 'kmol/h' }),
    solventFlow: finite.meta({ description: 'kmol/h' }),
    absorptionFactor: finite,
    theoreticalStages: finite.meta({ description: 'fractional' }),
    actualTrays: z.number().int(),
    outletGasSoluteMoleFraction: finite,
    richSolventSoluteMoleFraction: finite,
    gasDensity: finite.meta({ description: 'kg/m3 at the end with the largest vapour load' }),
    flowParameter: finite,
    capacityFactor: finite.meta({ description: 'm/s' }),
    floodingVelocity: finite.meta({ description: 'm/s' }),
    downcomerAreaFraction: finite,
    holeAreaFraction: finite.meta({ description: 'hole area / active area' }),
    traySpacing: finite.meta({ description: 'm' }),
    diameter: finite.meta({ description: 'm, as calculated' }),
    selectedDiameter: finite.meta({ description: 'm, rounded up to the standard step' }),
    pressureDropPerTray: finite.meta({ description: 'Pa' }),
    columnPressureDrop: finite.meta({ description: 'Pa' }),
    columnHeight: finite.meta({ description: 'm, tangent to tangent' }),
    recovery: finite.meta({ description: 'fraction of solute absorbed, 0..1' }),
    solventFactor: finite.meta({ description: 'L / Lmin' }),
    floodFraction: finite.meta({ description: 'design fraction of flood' }),
    gasFlow: finite.meta({ description: 'kmol/h, inlet' }),
    gasVolumetricFlow: finite.meta({ description: 'm3/s at column inlet conditions' }),
    solventMassFlow: finite.meta({ description: 'kg/h' }),
    solventVolumetricFlow: finite.meta({ description: 'm3/h' }),
    soluteInGas: finite.meta({ description: 'kg/h entering with the gas' }),
    soluteAbsorbed: finite.meta({ description: 'kg/h' }),
    soluteLost: finite.meta({ description: 'kg/h leaving with the cleaned gas' }),
    operatingPressure: finite.meta({ description: 'Pa abs' }),
    designPressure: finite.meta({ description: 'Pa gauge used for the shell' }),
    shellThickness: finite.meta({ description: 'm, including corrosion allowance' }),
    shellMass: finite.meta({ description: 'kg, shell and two heads' }),
    percentFlood: finite.meta({ description: '% of flood achieved at the selected diameter (worst end)' }),
    fractionOfFloodTarget: finite.optional().meta({ description: 'the design target fraction of flood the diameter was sized for' }),
    overallEfficiency: finite.optional(),
    achievedRecovery: finite.optional(),
  })
  .catchall(finite)

export const xyPointSchema = z.looseObject({ x: finite, y: finite })

export const stageProfilePointSchema = z.looseObject({
  stage: z.number().int().meta({ description: '1 = top' }),
  x: finite.meta({ description: 'liquid mole fraction leaving the stage' }),
  y: finite.meta({ description: 'gas mole fraction leaving the stage' }),
})

export const designResultSchema = z.looseObject({
  summary: designSummarySchema,
  checks: z.array(checkResultSchema),
  warnings: z.array(engineWarningSchema),
  cautions: z.array(z.string()).meta({ description: 'Always includes the preliminary-vessel caution' }),
  profile: z.looseObject({
    method: z.enum(['kremser', 'stageByStage']),
    methodNote: z.string().optional().meta({ description: 'which method ran and why, in words' }),
    theoreticalStages: finite.optional().meta({ description: 'ideal stages counted (fractional) = stages.length - 1 + lastStageFraction' }),
    lastStageFraction: finite.optional().meta({ description: 'fraction of the last stage in `stages` that is counted (0..1]' }),
    lastStageConvention: z.string().optional().meta({ description: 'the convention used for that fraction, with its reason' }),
    stages: z.array(stageProfilePointSchema),
    equilibriumCurve: z.array(xyPointSchema),
    operatingLine: z.array(xyPointSchema),
  }),
  detail: z.record(z.string(), z.unknown()),
})

export const capitalItemSchema = z.looseObject({
  key: z.string(),
  label: z.string(),
  size: finite,
  sizeUnit: z.string(),
  purchased: finite,
  installed: finite,
  annual: finite,
})

export const operatingItemSchema = z.looseObject({
  key: z.string(),
  label: z.string(),
  quantity: finite,
  quantityUnit: z.string(),
  annual: finite,
})

/** A design priced with a cost basis. */
export const costBreakdownSchema = z.looseObject({
  currency: z.string(),
  costIndex: finite,
  capitalRecoveryFactor: finite.meta({ description: '1/yr' }),
  purchasedCapital: finite,
  installedCapital: finite,
  annualisedCapital: finite.meta({ description: 'per year' }),
  operatingCost: finite.meta({ description: 'per year' }),
  totalAnnualCost: finite.meta({ description: 'per year' }),
  soluteRecoveredPerYear: finite.meta({ description: 'kg/yr' }),
  costPerKgRecovered: finite,
  annual: z.record(z.string(), finite),
  capital: z.array(capitalItemSchema),
  operating: z.array(operatingItemSchema),
  power: z.record(z.string(), finite).optional(),
  shell: z.looseObject({ thickness: finite, mass: finite, designPressure: finite }).optional(),
  warnings: z.array(engineWarningSchema),
})

/** The answer of POST /designs/evaluate and of a stored design run: the design, priced when a basis applied. */
export const pricedDesignSchema = designResultSchema.extend({
  totalAnnualCost: finite.optional(),
  costBreakdown: costBreakdownSchema.optional(),
})

export const curvePointSchema = z.looseObject({
  x: finite,
  feasible: z.boolean(),
  tac: finite.nullable(),
  breakdown: z.record(z.string(), finite).nullable(),
  actualTrays: z.number().int().nullable(),
  selectedDiameter: finite.nullable(),
  reason: z.string().optional(),
})

const sensitivitySideSchema = z.looseObject({
  value: finite,
  tac: finite.meta({ description: 're-optimised total annual cost at this value' }),
  repricedTac: finite.optional().meta({ description: "the base optimum's design priced at this value" }),
  recovery: finite,
  solventFactor: finite,
})

export const sensitivityEntrySchema = z.looseObject({
  item: z.string(),
  label: z.string(),
  unit: z.string(),
  baseValue: finite,
  lowValue: finite.optional().meta({ description: 'the value actually used for the low bar (after rounding or a cap)' }),
  highValue: finite.optional().meta({ description: 'the value actually used for the high bar' }),
  lowChange: finite.optional().meta({ description: 'relative change actually applied, e.g. -0.2' }),
  highChange: finite.optional().meta({ description: 'relative change actually applied, e.g. +0.043' }),
  lowLimited: z.boolean().optional(),
  highLimited: z.boolean().optional(),
  lowNote: z.string().optional().meta({ description: 'the value used in words, and why it was limited' }),
  highNote: z.string().optional(),
  low: sensitivitySideSchema,
  high: sensitivitySideSchema,
})

/** A variable of the optimum that sits on a bound of the search, with advice. */
export const boundHitSchema = z.looseObject({
  variable: z.enum(['recovery', 'solventFactor', 'floodFraction', 'traySpacing']),
  bound: z.enum(['lower', 'upper']),
  value: finite,
  advice: z.string().meta({ description: 'words; a quantity in them is a token {kind:SI value} (e.g. {smallLength:0.4572}), worded in the reader\'s units by shared/quantityText.ts' }),
})

export const optimumSchema = z.looseObject({
  recovery: finite,
  solventFactor: finite,
  traySpacing: finite,
  floodFraction: finite,
  actualTrays: z.number().int(),
  selectedDiameter: finite,
  totalAnnualCost: finite,
  breakdown: costBreakdownSchema,
  design: designResultSchema,
})

/** The answer of POST /designs/optimize and of a stored optimisation run. */
export const optimisationResultSchema = z.looseObject({
  optimum: optimumSchema,
  evaluations: z.number().int(),
  bounds: z.looseObject({
    recovery: z.tuple([finite, finite]),
    solventFactor: z.tuple([finite, finite]),
    floodFraction: z.tuple([finite, finite]),
    traySpacings: z.array(finite),
  }),
  curves: z.looseObject({ recovery: z.array(curvePointSchema), solventFactor: z.array(curvePointSchema) }),
  sensitivity: z.array(sensitivityEntrySchema),
  boundHits: z.array(boundHitSchema).optional().meta({ description: 'variables of the optimum on a search bound (empty when none)' }),
  stats: z.looseObject({
    searchEvaluations: z.number().int(),
    curveEvaluations: z.number().int(),
    sensitivityEvaluations: z.number().int(),
    feasibleFraction: finite,
    ms: z.record(z.string(), finite),
  }).optional(),
  cautions: z.array(z.string()),
  robust: robustResultSchema.optional().meta({ description: 'the robust optimum, when the request asked for one ({ robust: { confidence, uncertainty } })' }),
})

/** A stored run's result: a priced design or an optimisation. */
export const runResultSchema = z.union([optimisationResultSchema, pricedDesignSchema])

/** A stored run: its exact inputs, the cost-basis and engine versions, and the result as computed. */
export const storedRunSchema = z.looseObject({
  id: z.number().int(),
  studyId: z.number().int(),
  kind: z.enum(['design', 'optimize']),
  costBasisId: z.number().int().nullable(),
  costBasisVersion: z.number().int().nullable(),
  engineVersion: z.string(),
  totalAnnualCost: finite.nullable(),
  createdAt: z.string(),
  createdByName: z.string().nullable(),
  inputs: z.unknown(),
  search: z.unknown(),
  result: runResultSchema.nullable(),
})

/**
 * Every answer shape by name, for the OpenAPI document. Rating (an existing column checked at
 * given flows) and uncertainty answers join here when the engine returns them.
 */
export const answerSchemas = {
  EngineWarning: engineWarningSchema,
  CheckResult: checkResultSchema,
  DesignSummary: designSummarySchema,
  DesignResult: designResultSchema,
  CostBreakdown: costBreakdownSchema,
  PricedDesign: pricedDesignSchema,
  CurvePoint: curvePointSchema,
  SensitivityEntry: sensitivityEntrySchema,
  BoundHit: boundHitSchema,
  OptimisationResult: optimisationResultSchema,
  StoredRun: storedRunSchema,
  UncertaintyResult: uncertaintyResultSchema,
  RobustResult: robustResultSchema,
} as const

/**
 * An answer type without its open index signatures: the fields the schema names, all the way down.
 * An engine interface (which has no index signature) is checked against the contract with it.
 */
export type KnownFields<T> = T extends readonly (infer U)[]
  ? KnownFields<U>[]
  : T extends object
    ? { [K in keyof T as string extends K ? never : number extends K ? never : K]: KnownFields<T[K]> }
    : T

export type EngineWarning = z.infer<typeof engineWarningSchema>
export type CheckResult = z.infer<typeof checkResultSchema>
export type DesignSummary = z.infer<typeof designSummarySchema>
export type XY = z.infer<typeof xyPointSchema>
export type StageProfilePoint = z.infer<typeof stageProfilePointSchema>
export type DesignResult = z.infer<typeof designResultSchema>
export type CapitalItem = z.infer<typeof capitalItemSchema>
export type OperatingItem = z.infer<typeof operatingItemSchema>
export type CostBreakdown = z.infer<typeof costBreakdownSchema>
export type PricedDesign = z.infer<typeof pricedDesignSchema>
export type CurvePoint = z.infer<typeof curvePointSchema>
export type SensitivityEntry = z.infer<typeof sensitivityEntrySchema>
export type Optimum = z.infer<typeof optimumSchema>
export type OptimisationResult = z.infer<typeof optimisationResultSchema>
export type StoredRun = z.infer<typeof storedRunSchema>
export type BoundHit = z.infer<typeof boundHitSchema>
