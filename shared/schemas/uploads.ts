/**
 * CSV uploads (equilibrium tables, vendor quotes) and cost-curve fits: request fields, bodies and
 * the views the API returns. Shared by the server and the client.
 */
import { z } from 'zod'
import { shortText } from './common.ts'
import { costCurveSchema } from './costBasis.ts'

/** Equipment types a vendor quote may be for: the capital-cost correlation keys of the cost basis. */
export const EQUIPMENT_TYPES = ['shell', 'platforms', 'trays', 'pump', 'motor', 'blower'] as const
export type EquipmentType = (typeof EQUIPMENT_TYPES)[number]
/** The types whose correlation is a one-size cost curve (platforms depend on diameter and height). */
export const FITTABLE_TYPES = ['shell', 'trays', 'pump', 'motor', 'blower'] as const
export type FittableType = (typeof FITTABLE_TYPES)[number]

export const FIT_FORMS = ['power', 'quadraticLog'] as const

/** Most data rows one CSV upload may hold. */
export const MAX_CSV_ROWS = 500
/** Fewest points of an equilibrium table. */
export const MIN_EQUILIBRIUM_POINTS = 3

/** Form fields sent with an equilibrium CSV (multipart). Temperature in degC. */
export const equilibriumUploadFields = z.object({
  name: shortText(160).optional(),
  solute: shortText(80).optional(),
  temperature: z.coerce.number().gt(-273.15, 'must be above absolute zero (degC)').lt(1000).optional(),
})

export const quoteListQuery = z.object({
  equipmentType: z.enum(EQUIPMENT_TYPES).optional(),
})

export const fitBody = z.object({
  equipmentType: z.enum(FITTABLE_TYPES),
  /** Escalate the quotes to this cost index; default: the cost basis's target index. */
  targetIndex: z.number().positive().optional(),
  /** Default: the form of the cost basis's curve (three or more coefficients -> quadraticLog). */
  form: z.enum(FIT_FORMS).optional(),
  /** Compare with this cost-basis version; default: the version in force today (or the default preset). */
  costBasisId: z.number().int().positive().optional(),
})

/**
 * Adopt fitted coefficients into a draft: the `adopt` object of a fit answer plus the draft's
 * lockVersion. Left out: logBase, size range and base index stay as in the draft's curve
 * (base index: the basis's target index), source says "Fit to vendor quotes".
 */
export const adoptFitBody = z.object({
  equipmentType: z.enum(FITTABLE_TYPES),
  coefficients: z.array(z.number()).min(1).max(5),
  logBase: z.enum(['e', '10']).optional(),
  sizeMin: z.number().nonnegative().optional(),
  sizeMax: z.number().positive().optional(),
  baseIndex: z.number().positive().optional(),
  baseYear: shortText(80).optional(),
  source: shortText(300).optional(),
  lockVersion: z.number().int().min(0),
}).refine((b) => b.sizeMax === undefined || b.sizeMin === undefined || b.sizeMax >= b.sizeMin, { message: 'must not be below sizeMin', path: ['sizeMax'] })

/** A problem in an uploaded file, with the line as in the file (header = line 1). */
export interface CsvIssue {
  line: number | null
  column: string | null
  message: string
}

export interface EquilibriumPreview {
  fileName: string
  points: [number, number][]
  temperature: number | null
  errors: CsvIssue[]
  warnings: CsvIssue[]
}

export interface QuoteRowInput {
  line: number
  equipmentType: EquipmentType
  size: number
  sizeUnit: string
  cost: number
  currency: string
  quoteDate: string | null
  costIndex: number | null
  vendor: string
}

export interface QuotesPreview {
  fileName: string
  quotes: QuoteRowInput[]
  errors: CsvIssue[]
  warnings: CsvIssue[]
}

export interface EquilibriumTableView {
  id: number
  siteId: number
  name: string
  solute: string | null
  temperature: number | null
  points: [number, number][]
  /** Ready to paste into a case: { model: 'table', points }. */
  equilibrium: { model: 'table'; points: [number, number][] }
  source: string
  createdByName: string | null
  createdAt: string
}

export interface QuoteView {
  id: number
  siteId: number
  equipmentType: string
  size: number
  sizeUnit: string
  cost: number
  currency: string
  quoteDate: string | null
  costIndex: number | null
  vendor: string
  uploadRef: string | null
  createdByName: string | null
  createdAt: string
}

/** One vendor quote in a fit: as quoted, escalated to the target index, and the fitted and basis costs at its size. */
export const fitPointSchema = z.object({
  quoteId: z.number().int(),
  size: z.number(),
  cost: z.number(),
  costIndex: z.number().nullable(),
  escalatedCost: z.number(),
  fitted: z.number(),
  logResidual: z.number(),
  relativeError: z.number(),
  basisCost: z.number(),
})
export type FitPoint = z.infer<typeof fitPointSchema>

/** What adopting a fit writes into a draft cost basis. */
export const fitAdoptSchema = z.object({
  equipmentType: z.enum(FITTABLE_TYPES),
  logBase: z.enum(['e', '10']),
  coefficients: z.array(z.number()),
  sizeMin: z.number(),
  sizeMax: z.number(),
  baseIndex: z.number(),
  baseYear: z.string(),
  source: z.string(),
})
export type FitAdopt = z.infer<typeof fitAdoptSchema>

/** A cost-curve fit to a site's vendor quotes, beside the basis curve it would replace. */
export const fitResultSchema = z.object({
  equipmentType: z.enum(FITTABLE_TYPES),
  form: z.enum(FIT_FORMS),
  currency: z.string(),
  targetIndex: z.number(),
  sizeUnit: z.string(),
  logBase: z.enum(['e', '10']),
  coefficients: z.array(z.number()),
  r2: z.number(),
  rmsLogResidual: z.number(),
  n: z.number().int(),
  dof: z.number().int(),
  /** The basis curve as it would read after adopting the fit. */
  curve: costCurveSchema,
  adopt: fitAdoptSchema,
  points: z.array(fitPointSchema),
  line: z.array(z.object({ size: z.number(), fitted: z.number(), basis: z.number() })),
  basis: z.object({ costBasisId: z.number().int().nullable(), version: z.number().int().nullable(), preset: z.string().nullable(), curve: costCurveSchema }),
  warnings: z.array(z.string()),
})
export type FitResult = z.infer<typeof fitResultSchema>
