import bcrypt from 'bcryptjs'
import jwt from 'jsonwebtoken'
import { config } from '../config.ts'
import { User, Membership, Site } from '../db/models/index.ts'
import { UnauthenticatedError } from '../errors.ts'
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
  const expiresAt = new Date(Date.now() + config.TOKEN_TTL_MINUTES * 60_000)
  const token = jwt.sign({ tv: user.tokenVersion } satisfies Omit<TokenClaims, 'sub'>, config.JWT_SECRET, {
    subject: String(user.id),
    expiresIn: config.TOKEN_TTL_MINUTES * 60,
    algorithm: 'HS256',
  })
  return { user: await userView(user.id), token, expiresAt: expiresAt.toISOString() }
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
