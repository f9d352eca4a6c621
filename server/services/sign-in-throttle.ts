import { Op } from 'sequelize'
import { SignInFailure } from '../db/models/index.ts'
import { TooManyRequestsError } from '../errors.ts'

/**
 * Sign-in throttle shared by every server process through the database: failed sign-ins are
 * counted per account (the e-mail address as typed, whether or not such an account exists) and
 * per client address over a sliding window. Successful sign-ins are not counted. Once either
 * count reaches its limit, sign-in answers 429 with the same message for known and unknown accounts.
 */
export const THROTTLE_WINDOW_MS = 15 * 60_000

export interface ThrottleLimits {
  perAccount: number
  perAddress: number
}

export const THROTTLED_MESSAGE = 'Too many failed sign-ins; wait a few minutes and try again.'

async function failuresSince(scope: 'account' | 'address', subject: string, since: Date): Promise<number> {
  return SignInFailure.count({ where: { scope, subject, failedAt: { [Op.gt]: since } } })
}

/** Throws 429 when the account or the address has used up its failures in the window. */
export async function assertNotThrottled(account: string, address: string, limits: ThrottleLimits): Promise<void> {
  const since = new Date(Date.now() - THROTTLE_WINDOW_MS)
  const [a, b] = await Promise.all([failuresSince('account', account, since), failuresSince('address', address, since)])
  if (a >= limits.perAccount || b >= limits.perAddress) throw new TooManyRequestsError(THROTTLED_MESSAGE)
}

/** Count one failed sign-in against both the account and the address; old rows are pruned on the way. */
export async function recordFailure(account: string, address: string): Promise<void> {
  const now = new Date()
  await SignInFailure.bulkCreate([
    { scope: 'account', subject: account.slice(0, 254), failedAt: now },
    { scope: 'address', subject: address.slice(0, 254), failedAt: now },
  ])
  if (Math.random() < 0.05) await SignInFailure.destroy({ where: { failedAt: { [Op.lt]: new Date(now.getTime() - THROTTLE_WINDOW_MS) } } })
}

/** A successful sign-in clears the account's failures (the address keeps its count). */
export async function clearAccount(account: string): Promise<void> {
  await SignInFailure.destroy({ where: { scope: 'account', subject: account.slice(0, 254) } })
}
