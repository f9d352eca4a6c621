import { z } from 'zod'

/** Split a limited solvent supply between absorbers of a site. Flows in m³/h. */
export const allocationBody = z
  .object({
    name: z.string().trim().max(160).default(''),
    supplyLimit: z.number().positive('must be above zero').max(1e5),
    objective: z.enum(['minCost', 'maxRecovered']).default('minCost'),
    units: z
      .array(
        z.object({
          studyId: z.number().int().positive(),
          minFlow: z.number().min(0).max(1e5, 'must be at most 100,000 m³/h').optional(),
          maxFlow: z.number().positive('must be above zero').max(1e5, 'must be at most 100,000 m³/h').optional(),
        }),
      )
      .min(1, 'choose at least one absorber')
      .max(20),
    save: z.boolean().default(false),
    /** Save also a result with no feasible split (off: an infeasible result is only shown). */
    saveInfeasible: z.boolean().default(false),
  })
  .superRefine((b, ctx) => {
    const seen = new Set<number>()
    b.units.forEach((u, i) => {
      if (seen.has(u.studyId)) ctx.addIssue({ code: 'custom', message: 'appears twice', path: ['units', i, 'studyId'] })
      seen.add(u.studyId)
      if (u.minFlow !== undefined && u.maxFlow !== undefined && u.minFlow >= u.maxFlow) {
        ctx.addIssue({ code: 'custom', message: 'must be below maxFlow', path: ['units', i, 'minFlow'] })
      }
    })
  })
export type AllocationBody = z.infer<typeof allocationBody>

/** An absorber the allocation can include: a study of the site with the design solvent flow it stands for. */
export const allocationAbsorberSchema = z.object({
  studyId: z.number().int(),
  name: z.string(),
  status: z.string(),
  /** Design solvent flow, m³/h; null when the study has no run yet. */
  designFlow: z.number().nullable(),
})
export type AllocationAbsorber = z.infer<typeof allocationAbsorberSchema>

export const ALLOCATION_OBJECTIVES = ['minCost', 'maxRecovered'] as const
export type AllocationObjective = (typeof ALLOCATION_OBJECTIVES)[number]

/** One absorber's share of the supply (flows in m³/h, cost per year in the basis currency, recovered in kg/yr). */
export const allocationUnitResultSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  flow: z.number(),
  recovery: z.number(),
  cost: z.number(),
  recovered: z.number(),
  minFlow: z.number(),
  maxFlow: z.number(),
  designFlow: z.number(),
})
export type AllocationUnitResult = z.infer<typeof allocationUnitResultSchema>

/** The engine's split of a limited supply (server/engine/allocation). */
export const allocationSplitSchema = z.object({
  feasible: z.boolean(),
  objective: z.enum(ALLOCATION_OBJECTIVES),
  supplyLimit: z.number(),
  used: z.number(),
  units: z.array(allocationUnitResultSchema),
  totalCost: z.number(),
  totalRecovered: z.number(),
  /** Value of one more m³/h of solvent supply, per year (0 when the limit does not bind). */
  shadowPrice: z.number(),
  curves: z.array(z.object({ id: z.number().int(), points: z.array(z.object({ flow: z.number(), cost: z.number(), recovery: z.number() })) })),
  warnings: z.array(z.string()),
})
export type AllocationSplit = z.infer<typeof allocationSplitSchema>

/** The answer of a solve: the split, priced with the basis in force, and whether it was saved. */
export const allocationResultSchema = allocationSplitSchema.extend({
  id: z.number().int().nullable().optional(),
  /** Whether this answer was saved (an infeasible one is not, unless asked). */
  saved: z.boolean().optional(),
  currency: z.string().optional(),
  costBasisVersion: z.number().int().optional(),
})
export type AllocationResult = z.infer<typeof allocationResultSchema>

/** A saved allocation: its request and its answer. */
export const savedAllocationSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  createdAt: z.string(),
  inputs: z.looseObject({}),
  result: allocationResultSchema,
})
