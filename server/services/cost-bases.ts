import type { Transaction } from 'sequelize'
import { sequelize } from '../db/sequelize.ts'
import { CostBasis } from '../db/models/index.ts'
import { AppError, ConflictError, NotFoundError, ValidationError, zodDetails } from '../errors.ts'
import { audit } from './audit.ts'
import { userNames } from './people.ts'
import { costBasisSchema, type CostBasisData } from '../../shared/schemas/costBasis.ts'
import type { CostBasisVersionView } from '../../shared/schemas/costBases.ts'
import { versionInForce, earlierDateImpact, isoDate } from '../../shared/costBasisInForce.ts'
import { loadPreset, hasPreset, listPresets, DEFAULT_PRESET } from '../engine/costing/index.ts'
import type { AuthUser } from '../types.d.ts'

function view(b: CostBasis, who: Map<number, string>, inForceId: number | null): CostBasisVersionView {
  return {
    id: b.id,
    siteId: b.siteId as number,
    version: b.version,
    status: b.status,
    name: b.name,
    notes: b.notes,
    effectiveDate: b.effectiveDate,
    publishedAt: b.publishedAt ? b.publishedAt.toISOString() : null,
    publishedByName: b.publishedBy ? (who.get(b.publishedBy) ?? null) : null,
    createdByName: b.createdBy ? (who.get(b.createdBy) ?? null) : null,
    basedOnId: b.basedOnId,
    lockVersion: b.lockVersion,
    updatedAt: b.updatedAt.toISOString(),
    inForce: b.id === inForceId,
  }
}

/** The published versions of a site, without their data (enough to decide which is in force). */
async function publishedVersions(siteId: number, transaction?: Transaction) {
  const rows = await CostBasis.findAll({
    where: { siteId, status: 'published' }, attributes: ['id', 'version', 'status', 'effectiveDate', 'publishedAt'], transaction,
  })
  return rows.map((r) => ({ id: r.id, version: r.version, status: r.status, effectiveDate: r.effectiveDate, publishedAt: r.publishedAt }))
}

export async function listVersions(siteId: number): Promise<CostBasisVersionView[]> {
  const rows = await CostBasis.findAll({ where: { siteId }, order: [['version', 'DESC']], attributes: { exclude: ['data'] } })
  const who = await userNames(rows.flatMap((r) => [r.createdBy, r.publishedBy]))
  const inForce = versionInForce(rows)
  return rows.map((r) => view(r, who, inForce?.id ?? null))
}

export async function getVersion(siteId: number, id: number): Promise<CostBasisVersionView & { data: CostBasisData }> {
  const b = await CostBasis.findOne({ where: { id, siteId } })
  if (!b) throw new NotFoundError('Cost basis')
  const who = await userNames([b.createdBy, b.publishedBy])
  const inForce = versionInForce(await publishedVersions(siteId))
  return { ...view(b, who, inForce?.id ?? null), data: b.data as CostBasisData }
}

/**
 * The published version in force on a date (default today), by the one rule in
 * shared/costBasisInForce.ts; null when none is in force yet.
 */
export async function basisInForce(siteId: number, on: string = isoDate(), transaction?: Transaction): Promise<CostBasis | null> {
  const chosen = versionInForce(await publishedVersions(siteId, transaction), on)
  return chosen ? CostBasis.findByPk(chosen.id, { transaction }) : null
}

export { listPresets }

/** One shipped preset in full (404 for an unknown key). */
export function presetByKey(key: string): CostBasisData {
  if (!hasPreset(key)) throw new NotFoundError('Preset')
  return loadPreset(key)
}

/** The version in force today, with its data (404 when none is). */
export async function currentVersion(siteId: number): Promise<CostBasisVersionView & { data: CostBasisData }> {
  const b = await basisInForce(siteId)
  if (!b) throw new NotFoundError('Published cost basis')
  return getVersion(siteId, b.id)
}

export async function createDraft(
  siteId: number,
  body: { name?: string; basedOnId?: number; preset?: string },
  actor: AuthUser,
  requestId: string,
): Promise<CostBasisVersionView & { data: CostBasisData }> {
  const created = await sequelize.transaction(async (transaction) => {
    const existing = await CostBasis.findOne({ where: { siteId, status: 'draft' }, transaction, lock: transaction.LOCK.UPDATE })
    if (existing) throw new ConflictError(`Version ${existing.version} is already a draft; edit or publish it first.`)
    let data: CostBasisData
    let basedOnId: number | null = null
    if (body.preset) {
      if (!hasPreset(body.preset)) throw new ValidationError('Unknown preset.', [{ path: 'body.preset', message: `no preset named '${body.preset}'` }])
      data = loadPreset(body.preset)
    } else if (body.basedOnId) {
      const base = await CostBasis.findOne({ where: { id: body.basedOnId, siteId }, transaction })
      if (!base) throw new ValidationError('Unknown base version.', [{ path: 'body.basedOnId', message: 'is not a version of this site' }])
      data = base.data as CostBasisData
      basedOnId = base.id
    } else {
      const latest = await CostBasis.findOne({ where: { siteId, status: 'published' }, order: [['version', 'DESC']], transaction })
      data = latest ? (latest.data as CostBasisData) : loadPreset(DEFAULT_PRESET)
      basedOnId = latest?.id ?? null
    }
    const max = (await CostBasis.max('version', { where: { siteId }, transaction })) as number | null
    const b = await CostBasis.create(
      {
        siteId, version: (max ?? 0) + 1, status: 'draft', name: body.name ?? data.name, data,
        effectiveDate: null, publishedAt: null, publishedBy: null, createdBy: actor.id, basedOnId,
      },
      { transaction },
    )
    await audit({ userId: actor.id, siteId, action: 'create_draft', entity: 'cost_basis', entityId: b.id, after: { version: b.version, basedOnId, preset: body.preset ?? null }, requestId }, transaction)
    return b.id
  })
  return getVersion(siteId, created)
}

export async function updateDraft(
  siteId: number,
  id: number,
  body: { name?: string; notes?: string; data?: unknown; lockVersion: number },
  actor: AuthUser,
  requestId: string,
): Promise<CostBasisVersionView & { data: CostBasisData }> {
  let data: CostBasisData | undefined
  if (body.data !== undefined) {
    const r = costBasisSchema.safeParse(body.data)
    if (!r.success) throw new ValidationError('The cost basis is not valid.', zodDetails(r.error, 'body.data'))
    data = r.data
  }
  await sequelize.transaction(async (transaction) => {
    const b = await CostBasis.findOne({ where: { id, siteId }, transaction, lock: transaction.LOCK.UPDATE })
    if (!b) throw new NotFoundError('Cost basis')
    if (b.status !== 'draft') throw new ConflictError(`Version ${b.version} is published and cannot change; create a new draft.`)
    if (b.lockVersion !== body.lockVersion) {
      throw new ConflictError('Someone else changed this draft since you opened it; reload to see their changes.', [
        { path: 'body.lockVersion', message: `is ${body.lockVersion}, current is ${b.lockVersion}` },
      ])
    }
    const before = { name: b.name, notes: b.notes, data: b.data }
    if (body.name !== undefined) b.name = body.name
    if (body.notes !== undefined) b.notes = body.notes
    if (data !== undefined) b.data = data
    b.lockVersion = b.lockVersion + 1
    await b.save({ transaction })
    await audit({ userId: actor.id, siteId, action: 'update_draft', entity: 'cost_basis', entityId: b.id, before, after: { name: b.name, notes: b.notes, data: b.data }, requestId }, transaction)
  })
  return getVersion(siteId, id)
}

export async function publish(
  siteId: number,
  id: number,
  body: { effectiveDate: string; lockVersion: number; confirmEarlierDate?: boolean },
  actor: AuthUser,
  requestId: string,
): Promise<CostBasisVersionView & { data: CostBasisData }> {
  await sequelize.transaction(async (transaction) => {
    const b = await CostBasis.findOne({ where: { id, siteId }, transaction, lock: transaction.LOCK.UPDATE })
    if (!b) throw new NotFoundError('Cost basis')
    if (b.status !== 'draft') throw new ConflictError(`Version ${b.version} is published already.`)
    if (b.lockVersion !== body.lockVersion) throw new ConflictError('Someone else changed this draft since you opened it; reload before publishing.')
    const impact = earlierDateImpact(await publishedVersions(siteId, transaction), b.version, body.effectiveDate)
    if (impact && !body.confirmEarlierDate) {
      throw new AppError(409, 'confirmation_needed', impact, [{ path: 'body.confirmEarlierDate', message: 'set to true to publish with this earlier date' }])
    }
    b.status = 'published'
    b.effectiveDate = body.effectiveDate
    b.publishedAt = new Date()
    b.publishedBy = actor.id
    b.lockVersion = b.lockVersion + 1
    await b.save({ transaction })
    await audit({ userId: actor.id, siteId, action: 'publish', entity: 'cost_basis', entityId: b.id, before: { status: 'draft' }, after: { status: 'published', version: b.version, effectiveDate: b.effectiveDate }, requestId }, transaction)
  })
  return getVersion(siteId, id)
}

/** Throw away a draft (published versions stay forever). */
export async function discardDraft(siteId: number, id: number, actor: AuthUser, requestId: string): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const b = await CostBasis.findOne({ where: { id, siteId }, transaction, lock: transaction.LOCK.UPDATE })
    if (!b) throw new NotFoundError('Cost basis')
    if (b.status !== 'draft') throw new ConflictError(`Version ${b.version} is published and cannot be removed.`)
    await b.destroy({ transaction })
    await audit({ userId: actor.id, siteId, action: 'discard_draft', entity: 'cost_basis', entityId: b.id, before: { version: b.version, name: b.name }, after: null, requestId }, transaction)
  })
}
