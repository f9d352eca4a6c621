/**
 * Search specification for the lowest-cost optimiser: bounds on the design variables, the discrete
 * tray spacings, the limits that make a design acceptable, and how finely to draw the cost curves.
 * SI: m for lengths, kg/h for the emission limit. Every field has a default.
 */
import { z } from 'zod'

const range = (min: number, max: number, lo: number, hi: number) =>
  z
    .object({ min: z.number().gte(lo).lte(hi).default(min), max: z.number().gte(lo).lte(hi).default(max) })
    .refine((r) => r.min <= r.max, { message: 'min must not exceed max' })

export const searchSpecSchema = z.object({
  /** Fraction of the entering solute absorbed. */
  recovery: range(0.8, 0.999, 0.01, 0.99999).default({ min: 0.8, max: 0.999 }),
  /** Largest release allowed, kg/h of solute in the cleaned gas; raises the recovery floor to 1 − limit / solute in. */
  emissionLimit: z.number().nonnegative().optional(),
  /** Solvent factor L / Lmin. */
  solventFactor: range(1.1, 3.0, 1.0001, 20).default({ min: 1.1, max: 3.0 }),
  /** Design fraction of flood. */
  floodFraction: range(0.5, 0.85, 0.2, 0.95).default({ min: 0.5, max: 0.85 }),
  /** Tray spacings to try, m. */
  traySpacings: z.array(z.number().gt(0.1).lt(2)).min(1).max(12).default([0.45, 0.5, 0.6, 0.75, 0.9]),
  /** Largest column diameter accepted, m. */
  maxDiameter: z.number().positive().default(6),
  /** Largest column height (tangent to tangent) accepted, m. About 53 m (175 ft) is a common upper limit. */
  maxHeight: z.number().positive().default(53),
  /** Accept designs whose tray checks give 'warn' (a 'fail' is always infeasible). */
  allowWarnings: z.boolean().default(true),
  /** Number of points on each cost curve. */
  curvePoints: z.number().int().min(3).max(201).default(25),
  /** Compute the ±fraction sensitivity of the optimum to each cost-basis item. */
  sensitivity: z.boolean().default(true),
  sensitivityFraction: z.number().gt(0).lt(1).default(0.2),
})

export type SearchSpec = z.infer<typeof searchSpecSchema>
export type SearchSpecInput = z.input<typeof searchSpecSchema>

export const searchSpecFieldMeta: Record<string, { label: string; unit: string; help: string }> = {
  'recovery.min': { label: 'Recovery, lowest', unit: '-', help: 'Lower bound on the fraction of solute absorbed.' },
  'recovery.max': { label: 'Recovery, highest', unit: '-', help: 'Upper bound on the fraction of solute absorbed.' },
  emissionLimit: { label: 'Emission limit', unit: 'kg/h', help: 'Largest solute release in the cleaned gas; sets a recovery floor.' },
  'solventFactor.min': { label: 'Solvent factor, lowest', unit: 'L/Lmin', help: '' },
  'solventFactor.max': { label: 'Solvent factor, highest', unit: 'L/Lmin', help: '' },
  'floodFraction.min': { label: 'Fraction of flood, lowest', unit: '-', help: '' },
  'floodFraction.max': { label: 'Fraction of flood, highest', unit: '-', help: '' },
  traySpacings: { label: 'Tray spacings', unit: 'm', help: 'Discrete spacings the optimiser may choose.' },
  maxDiameter: { label: 'Largest diameter', unit: 'm', help: '' },
  maxHeight: { label: 'Largest height', unit: 'm', help: 'Tangent to tangent.' },
  allowWarnings: { label: "Accept 'warn' tray checks", unit: '-', help: "A 'fail' is always rejected." },
  curvePoints: { label: 'Points per cost curve', unit: '-', help: '' },
  sensitivity: { label: 'Compute sensitivity', unit: '-', help: 'Tornado of the optimum TAC to each cost-basis item.' },
  sensitivityFraction: { label: 'Sensitivity step', unit: '-', help: 'Relative change of each item, e.g. 0.2 for ±20 %.' },
}

/**
 * The limits offered when none are set, per unit system, in m: the schema's defaults in SI, and
 * round values of US practice in US customary units: spacings of 18, 20, 24, 30 and 36 in, a
 * largest diameter of 20 ft and a largest height of 175 ft (common practice, no source).
 */
const IN = 0.0254
const FT = 0.3048
export const systemSearchDefaults = {
  SI: { traySpacings: [0.45, 0.5, 0.6, 0.75, 0.9], maxDiameter: 6, maxHeight: 53 },
  US: { traySpacings: [18, 20, 24, 30, 36].map((i) => Number((i * IN).toFixed(6))), maxDiameter: Number((20 * FT).toFixed(6)), maxHeight: Number((175 * FT).toFixed(6)) },
} as const
