import { z } from 'zod'

/** Roles are held per site membership. */
import { ROLES, ROLE_LABELS, type Role } from '../roles.ts'
export { ROLES, ROLE_LABELS, type Role }
export const roleSchema = z.enum(ROLES)

export const STUDY_STATUSES = ['draft', 'in_review', 'approved', 'returned', 'archived'] as const
export type StudyStatus = (typeof STUDY_STATUSES)[number]
export const studyStatusSchema = z.enum(STUDY_STATUSES)

export const UNIT_SYSTEMS = ['SI', 'US'] as const
export type UnitSystem = (typeof UNIT_SYSTEMS)[number]

export const idParam = z.coerce.number().int().positive()

/** Bounded strings: no request can make the server store megabytes in a name. */
export const shortText = (max = 200) => z.string().trim().min(1, 'is required').max(max, `must be at most ${max} characters`)

export const pagingQuery = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
})

/** The one error shape every API error uses. */
export const errorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.array(z.object({ path: z.string(), message: z.string(), code: z.string().optional() })),
    requestId: z.string().optional(),
  }),
})
export type ErrorBody = z.infer<typeof errorBodySchema>
