import { z } from 'zod'
import { roleSchema, shortText, UNIT_SYSTEMS } from './common.ts'
import { passwordSchema, refinePassword } from './password.ts'

export const loginBody = z.object({
  email: z.string().trim().toLowerCase().email('must be an e-mail address').max(254),
  password: z.string().min(1, 'is required').max(200, 'must be at most 200 characters'),
})
export type LoginBody = z.infer<typeof loginBody>

export const membershipSchema = z.object({
  siteId: z.number().int(),
  siteName: z.string(),
  siteCode: z.string(),
  role: roleSchema,
})
export type MembershipView = z.infer<typeof membershipSchema>

export const userViewSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  isAdmin: z.boolean(),
  unitSystem: z.enum(UNIT_SYSTEMS),
  memberships: z.array(membershipSchema),
})
export type UserView = z.infer<typeof userViewSchema>

export const sessionSchema = z.object({
  user: userViewSchema,
  token: z.string(),
  expiresAt: z.string(),
})
export type SessionView = z.infer<typeof sessionSchema>

export const siteViewSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  code: z.string(),
  description: z.string(),
  role: roleSchema.nullable(),
})
export type SiteView = z.infer<typeof siteViewSchema>

export { passwordSchema, passwordProblem, refinePassword } from './password.ts'

export const createUserBody = z
  .object({
    email: z.string().trim().toLowerCase().email('must be an e-mail address').max(254),
    name: shortText(120),
    password: passwordSchema,
    isAdmin: z.boolean().default(false),
  })
  .superRefine(refinePassword())
export type CreateUserBody = z.infer<typeof createUserBody>

export const updateMeBody = z.object({
  unitSystem: z.enum(UNIT_SYSTEMS).optional(),
  name: shortText(120).optional(),
})

/** Change one's own password: the current one, and a new one under the one password rule. */
export const changePasswordBody = z
  .object({
    currentPassword: z.string().min(1, 'is required').max(200, 'must be at most 200 characters'),
    newPassword: passwordSchema,
  })
  .superRefine((v, ctx) => {
    if (v.newPassword === v.currentPassword) ctx.addIssue({ code: 'custom', message: 'must differ from the current password', path: ['newPassword'] })
  })
export type ChangePasswordBody = z.infer<typeof changePasswordBody>

export const createSiteBody = z.object({
  name: shortText(160),
  code: z.string().trim().regex(/^[a-z0-9-]{2,40}$/, 'use 2-40 lower-case letters, digits or hyphens'),
  description: z.string().max(2000).default(''),
})

export const setMembershipBody = z.object({ role: roleSchema })

export const memberRowSchema = z.object({
  userId: z.number().int(),
  name: z.string(),
  email: z.string(),
  role: roleSchema,
})
export type MemberRow = z.infer<typeof memberRowSchema>

export const adminUserRowSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  isAdmin: z.boolean(),
  memberships: z.array(membershipSchema),
})
export type AdminUserRow = z.infer<typeof adminUserRowSchema>
