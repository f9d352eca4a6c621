import bcrypt from 'bcryptjs'
import { UniqueConstraintError } from 'sequelize'
import { sequelize } from '../db/sequelize.ts'
import { User, Site, Membership } from '../db/models/index.ts'
import { ConflictError, NotFoundError } from '../errors.ts'
import { audit } from './audit.ts'
import { userView } from './auth.ts'
import type { AuthUser } from '../types.d.ts'
import type { Role } from '../../shared/schemas/common.ts'
import type { AdminUserRow, CreateUserBody, MemberRow, SiteView, UserView } from '../../shared/schemas/identity.ts'

/** Names of people by id (for 'created by' columns); unknown and null ids are left out. */
export async function userNames(ids: (number | null)[]): Promise<Map<number, string>> {
  const list = [...new Set(ids.filter((x): x is number => x !== null))]
  if (!list.length) return new Map()
  const users = await User.findAll({ where: { id: list }, attributes: ['id', 'name'] })
  return new Map(users.map((u) => [u.id, u.name]))
}

export async function listMySites(user: AuthUser): Promise<SiteView[]> {
  const sites = user.isAdmin ? await Site.findAll() : await Site.findAll({ where: { id: [...user.roles.keys()] } })
  return sites
    .map((s) => ({ id: s.id, name: s.name, code: s.code, description: s.description, role: user.roles.get(s.id) ?? null }))
    .sort((a, b) => a.name.localeCompare(b.name))
}

export async function getSite(siteId: number, user: AuthUser): Promise<SiteView> {
  const s = await Site.findByPk(siteId)
  if (!s) throw new NotFoundError('Site')
  return { id: s.id, name: s.name, code: s.code, description: s.description, role: user.roles.get(s.id) ?? null }
}

export async function createSite(body: { name: string; code: string; description: string }, actor: AuthUser, requestId: string) {
  try {
    return await sequelize.transaction(async (transaction) => {
      const site = await Site.create(body, { transaction })
      await audit({ userId: actor.id, siteId: site.id, action: 'create', entity: 'site', entityId: site.id, after: body, requestId }, transaction)
      return { id: site.id, name: site.name, code: site.code, description: site.description, role: null }
    })
  } catch (e) {
    if (e instanceof UniqueConstraintError) throw new ConflictError('A site with this code exists already.', [{ path: 'body.code', message: 'is taken' }])
    throw e
  }
}

export async function listMembers(siteId: number): Promise<MemberRow[]> {
  const ms = await Membership.findAll({ where: { siteId }, include: [{ model: User, as: 'user' }] })
  return (ms as (Membership & { user: User })[])
    .map((m) => ({ userId: m.user.id, name: m.user.name, email: m.user.email, role: m.role }))
    .sort((a, b) => a.name.localeCompare(b.name))
}

export async function setMembership(siteId: number, userId: number, role: Role, actor: AuthUser, requestId: string): Promise<MemberRow> {
  return sequelize.transaction(async (transaction) => {
    const site = await Site.findByPk(siteId, { transaction })
    const user = await User.findByPk(userId, { transaction })
    if (!site) throw new NotFoundError('Site')
    if (!user) throw new NotFoundError('Person')
    // A site administrator works with the people of their own sites only: anyone else is answered
    // exactly like an unknown id, so names and e-mail addresses are not learned by trying ids.
    if (!actor.isAdmin) {
      const adminSites = [...actor.roles].filter(([, r]) => r === 'admin').map(([id]) => id)
      const shared = await Membership.count({ where: { userId, siteId: adminSites }, transaction })
      if (shared === 0) throw new NotFoundError('Person')
    }
    const existing = await Membership.findOne({ where: { siteId, userId }, transaction, lock: transaction.LOCK.UPDATE })
    const before = existing ? { role: existing.role } : null
    if (existing) {
      existing.role = role
      await existing.save({ transaction })
    } else {
      await Membership.create({ siteId, userId, role }, { transaction })
    }
    await audit({ userId: actor.id, siteId, action: 'set_role', entity: 'membership', entityId: `${siteId}:${userId}`, before, after: { role }, requestId }, transaction)
    return { userId, name: user.name, email: user.email, role }
  })
}

export async function removeMembership(siteId: number, userId: number, actor: AuthUser, requestId: string): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const m = await Membership.findOne({ where: { siteId, userId }, transaction })
    if (!m) throw new NotFoundError('Membership')
    if (userId === actor.id && m.role === 'admin' && !actor.isAdmin) {
      throw new ConflictError('You cannot remove your own administrator role.')
    }
    await m.destroy({ transaction })
    await audit({ userId: actor.id, siteId, action: 'remove_role', entity: 'membership', entityId: `${siteId}:${userId}`, before: { role: m.role }, after: null, requestId }, transaction)
  })
}

export async function listPeople(): Promise<AdminUserRow[]> {
  const users = await User.findAll({
    include: [{ model: Membership, as: 'memberships', include: [{ model: Site, as: 'site' }] }],
    order: [['name', 'ASC']],
  })
  return users.map((u) => ({
    id: u.id,
    email: u.email,
    name: u.name,
    isAdmin: u.isAdmin,
    memberships: (u as unknown as { memberships: (Membership & { site: Site })[] }).memberships.map((m) => ({
      siteId: m.site.id,
      siteName: m.site.name,
      siteCode: m.site.code,
      role: m.role,
    })),
  }))
}

export async function createPerson(body: CreateUserBody, actor: AuthUser, requestId: string): Promise<AdminUserRow> {
  const passwordHash = await bcrypt.hash(body.password, 10)
  try {
    return await sequelize.transaction(async (transaction) => {
      const u = await User.create({ email: body.email, name: body.name, passwordHash, isAdmin: body.isAdmin, lastSeenAt: null }, { transaction })
      await audit({ userId: actor.id, siteId: null, action: 'create', entity: 'user', entityId: u.id, after: { email: u.email, name: u.name, isAdmin: u.isAdmin }, requestId }, transaction)
      return { id: u.id, email: u.email, name: u.name, isAdmin: u.isAdmin, memberships: [] }
    })
  } catch (e) {
    if (e instanceof UniqueConstraintError) throw new ConflictError('Someone with this e-mail exists already.', [{ path: 'body.email', message: 'is taken' }])
    throw e
  }
}

/** Change one's own name or unit system; answers the person as signed in. */
export async function updateMe(userId: number, patch: { unitSystem?: 'SI' | 'US'; name?: string }): Promise<UserView> {
  await User.update(patch, { where: { id: userId } })
  return userView(userId)
}
