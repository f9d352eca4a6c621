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
