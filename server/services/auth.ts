import bcrypt from 'bcryptjs'
import jwt from 'jsonwebtoken'
import { config } from '../config.ts'
import { User, Membership, Site } from '../db/models/index.ts'
import { UnauthenticatedError, ValidationError } from '../errors.ts'
import { sequelize } from '../db/sequelize.ts'
import { passwordProblem } from '../../shared/schemas/password.ts'
import type { AuthUser } from '../types.d.ts'
import type { UserView, SessionView } from '../../shared/schemas/identity.ts'
import type { Role } from '../../shared/schemas/common.ts'
import { audit } from './audit.ts'
import { assertNotThrottled, recordFailure, clearAccount, type ThrottleLimits } from './sign-in-throttle.ts'

interface TokenClaims {
  sub: string
  tv: number
}

// A hash to compare against when the e-mail is unknown, so timing does not reveal who exists.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password', 10)

export async function signIn(email: string, password: string, requestId: string, client?: { address: string; limits: ThrottleLimits }): Promise<SessionView> {
  if (client) await assertNotThrottled(email, client.address, client.limits)
  const user = await User.findOne({ where: { email } })
  const ok = await bcrypt.compare(password, user?.passwordHash ?? DUMMY_HASH)
  if (!user || !ok) {
    if (client) await recordFailure(email, client.address)
    throw new UnauthenticatedError('E-mail or password is not right.')
  }
  if (client) await clearAccount(email)
  user.lastSeenAt = new Date()
  await user.save()
  await audit({ userId: user.id, siteId: null, action: 'sign_in', entity: 'user', entityId: user.id, requestId })
  return session(user)
}

/** A new session token for the person at their current token version. */
async function session(user: User): Promise<SessionView> {
  const expiresAt = new Date(Date.now() + config.TOKEN_TTL_MINUTES * 60_000)
  const token = jwt.sign({ tv: user.tokenVersion } satisfies Omit<TokenClaims, 'sub'>, config.JWT_SECRET, {
    subject: String(user.id),
    expiresIn: config.TOKEN_TTL_MINUTES * 60,
    algorithm: 'HS256',
  })
  return { user: await userView(user.id), token, expiresAt: expiresAt.toISOString() }
}

/**
 * Change one's own password. The current password is checked under the sign-in throttle (a wrong
 * one counts as a failed sign-in of the account and the address, in the database); the new one
 * follows the one password rule, the e-mail address included. Every other session of the person
 * ends; the answer is a fresh session for this one. A wrong current password is a 400 on the
 * field (not a 401: the person stays signed in).
 */
export async function changePassword(
  userId: number,
  body: { currentPassword: string; newPassword: string },
  requestId: string,
  client: { address: string; limits: ThrottleLimits },
): Promise<SessionView> {
  const user = await User.findByPk(userId)
  if (!user) throw new UnauthenticatedError()
  await assertNotThrottled(user.email, client.address, client.limits)
  if (!(await bcrypt.compare(body.currentPassword, user.passwordHash))) {
    await recordFailure(user.email, client.address)
    throw new ValidationError('The current password is not right.', [{ path: 'body.currentPassword', message: 'is not right' }])
  }
  const problem = passwordProblem(body.newPassword, user.email)
  if (problem) throw new ValidationError(`The new password ${problem}.`, [{ path: 'body.newPassword', message: problem }])
  const passwordHash = await bcrypt.hash(body.newPassword, 10)
  await sequelize.transaction(async (transaction) => {
    await User.update({ passwordHash, tokenVersion: user.tokenVersion + 1 }, { where: { id: user.id }, transaction })
    await audit({ userId: user.id, siteId: null, action: 'change_password', entity: 'user', entityId: user.id, requestId }, transaction)
  })
  await clearAccount(user.email)
  await user.reload()
  return session(user)
}

/** Verify a token and load the person with their site roles; throws 401 on anything wrong. */
export async function authenticate(token: string): Promise<AuthUser> {
  let claims: TokenClaims
  try {
    const decoded = jwt.verify(token, config.JWT_SECRET, { algorithms: ['HS256'] })
    if (typeof decoded === 'string' || typeof decoded.sub !== 'string' || typeof decoded.tv !== 'number') throw new Error('bad claims')
    claims = { sub: decoded.sub, tv: decoded.tv }
  } catch {
    throw new UnauthenticatedError('Your session has expired or is not valid; sign in again.')
  }
  const user = await User.findByPk(Number(claims.sub), { include: [{ model: Membership, as: 'memberships' }] })
  if (!user || user.tokenVersion !== claims.tv) throw new UnauthenticatedError('Your session has ended; sign in again.')
  const memberships = (user as unknown as { memberships: Membership[] }).memberships
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    isAdmin: user.isAdmin,
    unitSystem: user.unitSystem,
    roles: new Map(memberships.map((m) => [m.siteId as number, m.role])),
  }
}

/** Sign out everywhere: tokens issued before now stop working. */
export async function signOut(userId: number, requestId: string): Promise<void> {
  await User.increment('tokenVersion', { where: { id: userId } })
  await audit({ userId, siteId: null, action: 'sign_out', entity: 'user', entityId: userId, requestId })
}

export async function userView(userId: number): Promise<UserView> {
  const user = await User.findByPk(userId, {
    include: [{ model: Membership, as: 'memberships', include: [{ model: Site, as: 'site' }] }],
  })
  if (!user) throw new UnauthenticatedError()
  const ms = (user as unknown as { memberships: (Membership & { site: Site })[] }).memberships
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    isAdmin: user.isAdmin,
    unitSystem: user.unitSystem,
    memberships: ms
      .map((m) => ({ siteId: m.site.id, siteName: m.site.name, siteCode: m.site.code, role: m.role as Role }))
      .sort((a, b) => a.siteName.localeCompare(b.siteName)),
  }
}
