/**
 * The one password rule for every path that sets a password (creating a person, changing one's
 * own password, any later reset): at least 12 characters, at most 200, not one of the common
 * passwords shipped with @zxcvbn-ts/language-common (about 49,000 leaked passwords, checked
 * offline, ignoring case), and not the person's e-mail address or the part before the @.
 *
 *   passwordProblem('correct horse battery', 'ann@site.example')  -> null (acceptable)
 *   passwordProblem('password1234', 'ann@site.example')           -> 'is one of the most common passwords; choose another'
 *
 * Use `passwordSchema` for a field on its own and `refinePassword` (or `passwordProblem`) where the
 * e-mail address is known, so the address itself is refused too.
 */
import { z } from 'zod'
import { dictionary } from '@zxcvbn-ts/language-common'

export const PASSWORD_MIN_LENGTH = 12
export const PASSWORD_MAX_LENGTH = 200

const COMMON = new Set((dictionary['passwords-common'] as string[]).map((p) => p.toLowerCase()))

/** Why a new password is refused, in words for the person, or null when it is acceptable. */
export function passwordProblem(password: string, email?: string | null): string | null {
  if (password.length < PASSWORD_MIN_LENGTH) return `must be at least ${PASSWORD_MIN_LENGTH} characters`
  if (password.length > PASSWORD_MAX_LENGTH) return `must be at most ${PASSWORD_MAX_LENGTH} characters`
  const lower = password.trim().toLowerCase()
  if (COMMON.has(lower)) return 'is one of the most common passwords; choose another'
  if (email) {
    const e = email.trim().toLowerCase()
    const local = e.split('@')[0] ?? ''
    if (lower === e || (local.length > 0 && lower === local)) return 'must not be your e-mail address'
  }
  return null
}

/** A new password on its own (length and the common-password list). */
export const passwordSchema = z.string().superRefine((p, ctx) => {
  const problem = passwordProblem(p)
  if (problem) ctx.addIssue({ code: 'custom', message: problem })
})

/**
 * For an object schema holding both: adds the issue on `passwordKey` when the password breaks the
 * rule, the e-mail address included. Example: `z.object({ email, password: z.string() }).superRefine(refinePassword())`.
 */
export function refinePassword<K extends string = 'password', E extends string = 'email'>(passwordKey = 'password' as K, emailKey = 'email' as E) {
  return (value: Record<K | E, unknown>, ctx: z.RefinementCtx): void => {
    const p = value[passwordKey]
    const e = value[emailKey]
    if (typeof p !== 'string') return
    const problem = passwordProblem(p, typeof e === 'string' ? e : null)
    if (problem) ctx.addIssue({ code: 'custom', message: problem, path: [passwordKey] })
  }
}
