import { z } from 'zod'
import { shortText, studyStatusSchema, STUDY_STATUSES } from './common.ts'
import { caseSchema } from './case.ts'
import { searchSpecSchema } from './search.ts'

export const STUDY_SORTS = ['name', 'status', 'updatedAt', 'lastRunAt', 'optimumTac', 'targetRecovery'] as const

export const studyListQuery = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
  status: z
    .string()
    .optional()
    .transform((s) => (s ? s.split(',').filter(Boolean) : []))
    .pipe(z.array(z.enum(STUDY_STATUSES))),
  q: z.string().max(100).optional(),
  sort: z
    .string()
    .regex(new RegExp(`^-?(${STUDY_SORTS.join('|')})$`), `must be one of ${STUDY_SORTS.join(', ')}, optionally with a leading -`)
    .default('-updatedAt'),
  includeArchived: z.enum(['true', 'false']).optional(),
})

export const createStudyBody = z.object({
  name: shortText(160),
  description: z.string().max(5000).default(''),
  inputs: caseSchema,
  /** Optimiser settings, checked with the optimiser's own schema. */
  search: searchSpecSchema.optional(),
})

export const updateStudyBody = z.object({
  name: shortText(160).optional(),
  description: z.string().max(5000).optional(),
  inputs: caseSchema.optional(),
  search: searchSpecSchema.nullable().optional(),
  lockVersion: z.number().int().min(0),
})

export const createRunBody = z.object({
  kind: z.enum(['design', 'optimize']),
})

export const createOptionBody = z.object({
  runId: z.number().int().positive(),
  name: shortText(160),
  notes: z.string().max(2000).default(''),
})

/** What the caller may do with a study, for the client to show or hide controls. */
export const studyPermissionsSchema = z.object({
  edit: z.boolean(),
  run: z.boolean(),
  pin: z.boolean(),
  submit: z.boolean(),
  review: z.boolean(),
  comment: z.boolean(),
  archive: z.boolean(),
  logOperation: z.boolean(),
})
export type StudyPermissions = z.infer<typeof studyPermissionsSchema>

export interface StudyRow {
  id: number
  name: string
  description: string
  status: z.infer<typeof studyStatusSchema>
  ownerId: number
  ownerName: string
  targetRecovery: number | null
  optimumTac: number | null
  lastRunAt: string | null
  updatedAt: string
  revision: number
  lockVersion: number
}

export interface RunRow {
  id: number
  studyId: number
  kind: 'design' | 'optimize'
  costBasisId: number | null
  costBasisVersion: number | null
  engineVersion: string
  totalAnnualCost: number | null
  createdAt: string
  createdByName: string | null
}

export interface OptionRow {
  id: number
  studyId: number
  runId: number
  name: string
  notes: string
  createdAt: string
  run: RunRow
  /** The run's headline numbers, for lists and comparison. */
  summary: Record<string, number> | null
}
