import { z } from 'zod'
import { costBasisSchema } from './costBasis.ts'
import { designSummarySchema, storedRunSchema } from './results.ts'
import { monitoringSchema, standingColumnSchema } from './rating.ts'
import { studyPermissionsSchema } from './studies.ts'
import { studyStatusSchema } from './common.ts'
import { allocationResultSchema, savedAllocationSchema } from './allocation.ts'
import { fitResultSchema } from './uploads.ts'

/**
 * The answers of the API routes that are not engine answers (those are in results.ts): people,
 * sites, studies, cost-basis versions, review, operating log, uploads, allocation. Declared by
 * each route as `doc.response` (server/routes/*.ts), so the OpenAPI document describes them and
 * tests/server/answers.ts checks every answer the API tests receive against them.
 *
 * Loose objects: the fields listed are the ones every answer carries (or may carry, where
 * optional); a field the server adds is kept rather than refused.
 */

const id = z.number().int()
const when = z.string().meta({ description: 'ISO 8601 date-time' })
const obj = z.looseObject({})

export const healthAnswer = z.looseObject({ status: z.string(), service: z.string().optional(), database: z.string().optional() })

export const membershipAnswer = z.looseObject({ siteId: id, siteName: z.string(), siteCode: z.string(), role: z.string() })

export const personAnswer = z.looseObject({
  id,
  email: z.string(),
  name: z.string(),
  isAdmin: z.boolean(),
  unitSystem: z.string().optional(),
  memberships: z.array(membershipAnswer),
})

export const signInAnswer = z.looseObject({ user: personAnswer, token: z.string(), expiresAt: when })

export const siteAnswer = z.looseObject({ id, name: z.string(), code: z.string(), description: z.string().nullable().optional(), role: z.string().nullable().optional() })

export const memberAnswer = z.looseObject({ userId: id, name: z.string(), email: z.string(), role: z.string() })

/** A paged list: the items of one page and the total. */
export function pageOf<T extends z.ZodType>(item: T) {
  return z.looseObject({ items: z.array(item), total: z.number().int(), page: z.number().int(), pageSize: z.number().int() })
}

export const auditEntryAnswer = z.looseObject({ id, at: when, userId: id.nullable(), action: z.string(), entity: z.string(), before: z.unknown(), after: z.unknown() })

export const costPresetAnswer = z.looseObject({ key: z.string(), name: z.string(), currency: z.string().optional() })

export const costBasisVersionAnswer = z.looseObject({
  id,
  siteId: id,
  version: z.number().int(),
  status: z.string(),
  name: z.string(),
  effectiveDate: z.string().nullable(),
  publishedAt: z.string().nullable(),
  lockVersion: z.number().int(),
  inForce: z.boolean(),
  data: costBasisSchema.optional(),
})

export const runHeadAnswer = z.looseObject({ id, studyId: id, kind: z.string(), engineVersion: z.string(), totalAnnualCost: z.number().nullable(), createdAt: when })

export const optionAnswer = z.looseObject({ id, studyId: id, runId: id, name: z.string(), run: runHeadAnswer.optional(), summary: designSummarySchema.partial().nullable().optional() })

export const studyHeadAnswer = z.looseObject({ id, name: z.string(), status: z.string(), ownerId: id, revision: z.number().int(), lockVersion: z.number().int(), updatedAt: when })

/** A page of the site's studies, with the currency their optimum TACs are in (the cost basis in force; null without one). */
export const studyListAnswer = pageOf(studyHeadAnswer).extend({ currency: z.string().nullable() })

export const studyAnswer = studyHeadAnswer.extend({
  inputs: obj,
  runs: z.array(runHeadAnswer),
  options: z.array(optionAnswer),
  can: studyPermissionsSchema,
})

export const runComparisonAnswer = obj

export const commentAnswer = z.looseObject({ id, kind: z.string(), body: z.string(), userId: id.nullable(), createdAt: when })

/** What changed on a study since the person last opened it: review actions first, then new runs. */
export const notificationAnswer = z.object({
  studyId: id,
  name: z.string(),
  status: studyStatusSchema,
  lastSeenAt: when.nullable(),
  changes: z.array(z.object({ at: when, what: z.string().meta({ description: 'a sentence, e.g. "Ada Reyes submitted the study for review"' }), kind: z.enum(['comment', 'submit', 'approve', 'return', 'reopen', 'run']) })),
})
export type StudyNotification = z.infer<typeof notificationAnswer>
export type NotificationChange = StudyNotification['changes'][number]

/** Development outbox: mail captured by the local mail server and the delivery queue. */
export const outboxAnswer = z.object({
  captured: z.array(z.object({ id, receivedAt: when, from: z.string(), to: z.array(z.string()), subject: z.string(), text: z.string() })),
  queue: z.array(z.object({ id, to: z.string(), subject: z.string(), status: z.string(), attempts: z.number().int(), lastError: z.string().nullable(), createdAt: when, sentAt: when.nullable() })),
})
export type OutboxView = z.infer<typeof outboxAnswer>
export type CapturedMail = OutboxView['captured'][number]
export type QueuedMail = OutboxView['queue'][number]

export const operatingLogAnswer = z.looseObject({ entries: z.array(z.looseObject({ id, month: z.string(), gasFlow: z.number(), solventFlow: z.number() })), months: z.array(obj), monitoring: monitoringSchema.nullable().optional() })

export const operatingEntryAnswer = z.looseObject({ id, month: z.string(), gasFlow: z.number(), solventFlow: z.number(), lockVersion: z.number().int() })

export const standingColumnAnswer = standingColumnSchema

const csvIssue = z.looseObject({ line: z.number().int().nullable(), column: z.string().nullable(), message: z.string() })

export const equilibriumPreviewAnswer = z.looseObject({ fileName: z.string(), points: z.array(z.tuple([z.number(), z.number()])).meta({ description: '[x, y] pairs' }), errors: z.array(csvIssue), warnings: z.array(z.unknown()) })

export const equilibriumTableAnswer = z.looseObject({ id, name: z.string() })

export const quotesPreviewAnswer = z.looseObject({ fileName: z.string(), quotes: z.array(obj), errors: z.array(csvIssue), warnings: z.array(z.unknown()) })

export const quoteAnswer = z.looseObject({ id })

export const savedQuotesAnswer = obj

export const fitAnswer = fitResultSchema

export const allocationAnswer = allocationResultSchema.required({ currency: true })

export const savedAllocationAnswer = savedAllocationSchema

/** A case of a batch that was refused: its slot holds the reason, in the API's error words. */
export const refusedCaseAnswer = z.looseObject({
  error: z.looseObject({ code: z.string(), message: z.string(), issues: z.array(z.looseObject({ path: z.string(), message: z.string() })) }),
})

export const componentAnswer = z.looseObject({ name: z.string(), molarMass: z.number() })

/** The OpenAPI document itself (checked in full by tests/server/openapi.spec.ts with an OpenAPI validator). */
export const openApiAnswer = z.looseObject({ openapi: z.string(), paths: z.record(z.string(), obj) })

export { storedRunSchema }
