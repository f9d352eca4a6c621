import { Op, type WhereOptions, type Order } from 'sequelize'
import { sequelize } from '../db/sequelize.ts'
import { Study, User, Run, StudyOption, StudyView } from '../db/models/index.ts'
import { ConflictError, NotFoundError } from '../errors.ts'
import { audit } from './audit.ts'
import { userNames } from './people.ts'
import { basisInForce } from './cost-bases.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import type { AuthUser } from '../types.d.ts'
import type { Role, StudyStatus } from '../../shared/schemas/common.ts'
import type { StudyRow, RunRow, OptionRow, StudyPermissions } from '../../shared/schemas/studies.ts'
import type { DesignSummary } from '../../shared/schemas/results.ts'


export const EDITABLE: readonly StudyStatus[] = ['draft', 'returned']

export function permissionsFor(role: Role | null, isAdmin: boolean, status: StudyStatus): StudyPermissions {
  const engineer = role === 'engineer'
  const reviewer = role === 'reviewer' || (isAdmin && role === null)
  const editable = EDITABLE.includes(status)
  return {
    edit: engineer && editable,
    run: engineer && editable,
    pin: engineer && editable,
    submit: engineer && editable,
    review: reviewer && status === 'in_review',
    comment: role !== null || isAdmin,
    archive: engineer && status !== 'archived' && status !== 'in_review',
    logOperation: engineer && status === 'approved',
  }
}

function row(s: Study & { owner?: User }): StudyRow {
  return {
    id: s.id,
    name: s.name,
    description: s.description,
    status: s.status,
    ownerId: s.ownerId as number,
    ownerName: s.owner?.name ?? '',
    targetRecovery: s.targetRecovery,
    optimumTac: s.optimumTac,
    lastRunAt: s.lastRunAt ? s.lastRunAt.toISOString() : null,
    updatedAt: s.updatedAt.toISOString(),
    revision: s.revision,
    lockVersion: s.lockVersion,
  }
}

export function runRow(r: Run, who?: Map<number, string>): RunRow {
  return {
    id: r.id,
    studyId: r.studyId as number,
    kind: r.kind,
    costBasisId: r.costBasisId,
    costBasisVersion: r.costBasisVersion,
    engineVersion: r.engineVersion,
    totalAnnualCost: r.totalAnnualCost,
    createdAt: r.createdAt.toISOString(),
    createdByName: r.createdBy ? (who?.get(r.createdBy) ?? null) : null,
  }
}

function recoveryOf(inputs: unknown): number | null {
  const r = (inputs as { recovery?: unknown } | null)?.recovery
  return typeof r === 'number' ? r : null
}

export async function listStudies(
  siteId: number,
  q: { page: number; pageSize: number; status: StudyStatus[]; q?: string; sort: string; includeArchived?: 'true' | 'false' },
) {
  const where: WhereOptions = { siteId }
  if (q.status.length) Object.assign(where, { status: q.status })
  else if (q.includeArchived !== 'true') Object.assign(where, { status: { [Op.ne]: 'archived' } })
  if (q.q) Object.assign(where, { name: { [Op.like]: `%${q.q.replace(/[%_\\]/g, (c) => `\\${c}`)}%` } })
  const desc = q.sort.startsWith('-')
  const key = q.sort.replace(/^-/, '')
  const order: Order = [[key, desc ? 'DESC' : 'ASC'], ['id', 'DESC']]
  const { rows, count } = await Study.findAndCountAll({
    where,
    order,
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
    include: [{ model: User, as: 'owner', attributes: ['id', 'name'] }],
    attributes: { exclude: ['inputs', 'search'] },
  })
  // optimum TACs are priced with the site's cost basis, so its currency in force heads the column
  const basis = await basisInForce(siteId)
  const currency = basis ? (basis.data as CostBasisData).general.currency : null
  return { items: rows.map((s) => row(s as Study & { owner: User })), total: count, page: q.page, pageSize: q.pageSize, currency }
}

export async function findStudy(siteId: number, studyId: number): Promise<Study> {
  const s = await Study.findOne({ where: { id: studyId, siteId }, include: [{ model: User, as: 'owner', attributes: ['id', 'name'] }] })
  if (!s) throw new NotFoundError('Study')
  return s
}

export async function getStudy(siteId: number, studyId: number, user: AuthUser) {
  const s = await findStudy(siteId, studyId)
  const runs = await Run.findAll({ where: { studyId }, order: [['id', 'DESC']], limit: 50, attributes: { exclude: ['result', 'inputs', 'search'] } })
  const who = await userNames(runs.map((r) => r.createdBy))
  // Remember that this person looked (for "changed since you last looked").
  const seen = await StudyView.findOne({ where: { userId: user.id, studyId } })
  const lastSeenAt = seen?.seenAt ?? null
  // One statement that inserts or updates: opens of the same study at the same moment cannot clash.
  await StudyView.upsert({ userId: user.id, studyId, seenAt: new Date() })
  return {
    ...row(s as Study & { owner: User }),
    inputs: s.inputs,
    search: s.search,
    parentStudyId: s.parentStudyId,
    recommendedOptionId: s.recommendedOptionId,
    runs: runs.map((r) => runRow(r, who)),
    options: await listOptions(studyId),
    lastSeenAt: lastSeenAt ? lastSeenAt.toISOString() : null,
    can: permissionsFor(user.roles.get(siteId) ?? null, user.isAdmin, s.status),
  }
}

export async function createStudy(
  siteId: number,
  body: { name: string; description: string; inputs: unknown; search?: Record<string, unknown> },
  actor: AuthUser,
  requestId: string,
) {
  const id = await sequelize.transaction(async (transaction) => {
    const s = await Study.create(
      {
        siteId, ownerId: actor.id, name: body.name, description: body.description, inputs: body.inputs,
        search: body.search ?? null, parentStudyId: null, recommendedOptionId: null, optimumTac: null,
        targetRecovery: recoveryOf(body.inputs), lastRunAt: null,
      },
      { transaction },
    )
    await audit({ userId: actor.id, siteId, action: 'create', entity: 'study', entityId: s.id, after: { name: s.name }, requestId }, transaction)
    return s.id
  })
  return getStudy(siteId, id, actor)
}

export async function updateStudy(
  siteId: number,
  studyId: number,
  body: { name?: string; description?: string; inputs?: unknown; search?: Record<string, unknown> | null; lockVersion: number },
  actor: AuthUser,
  requestId: string,
) {
  await sequelize.transaction(async (transaction) => {
    const s = await Study.findOne({ where: { id: studyId, siteId }, transaction, lock: transaction.LOCK.UPDATE })
    if (!s) throw new NotFoundError('Study')
    if (!EDITABLE.includes(s.status)) {
      throw new ConflictError(
        s.status === 'approved'
          ? 'This study is approved and frozen; start a revision to change it.'
          : `A study that is ${s.status.replace('_', ' ')} cannot be edited.`,
      )
    }
    if (s.lockVersion !== body.lockVersion) {
      throw new ConflictError('Someone else changed this study since you opened it; reload to see their changes.', [
        { path: 'body.lockVersion', message: `is ${body.lockVersion}, current is ${s.lockVersion}` },
      ])
    }
    const before = { name: s.name, description: s.description, inputs: s.inputs, search: s.search }
    if (body.name !== undefined) s.name = body.name
    if (body.description !== undefined) s.description = body.description
    if (body.inputs !== undefined) {
      s.inputs = body.inputs
      s.targetRecovery = recoveryOf(body.inputs)
    }
    if (body.search !== undefined) s.search = body.search
    s.lockVersion = s.lockVersion + 1
    await s.save({ transaction })
    await audit({ userId: actor.id, siteId, action: 'update', entity: 'study', entityId: s.id, before, after: { name: s.name, description: s.description, inputs: s.inputs, search: s.search }, requestId }, transaction)
  })
  return getStudy(siteId, studyId, actor)
}

export async function archiveStudy(siteId: number, studyId: number, actor: AuthUser, requestId: string) {
  await sequelize.transaction(async (transaction) => {
    const s = await Study.findOne({ where: { id: studyId, siteId }, transaction, lock: transaction.LOCK.UPDATE })
    if (!s) throw new NotFoundError('Study')
    if (s.status === 'archived') throw new ConflictError('This study is archived already.')
    if (s.status === 'in_review') throw new ConflictError('A study in review cannot be archived; ask the reviewer to return it first.')
    const before = s.status
    s.status = 'archived'
    s.lockVersion += 1
    await s.save({ transaction })
    await audit({ userId: actor.id, siteId, action: 'archive', entity: 'study', entityId: s.id, before: { status: before }, after: { status: 'archived' }, requestId }, transaction)
  })
  return getStudy(siteId, studyId, actor)
}

/** The pinned options of a study of the site (404 when the study is not the site's). */
export async function studyOptions(siteId: number, studyId: number): Promise<OptionRow[]> {
  await findStudy(siteId, studyId)
  return listOptions(studyId)
}

export async function listOptions(studyId: number): Promise<OptionRow[]> {
  const opts = await StudyOption.findAll({ where: { studyId }, order: [['id', 'ASC']], include: [{ model: Run, as: 'run' }] })
  const who = await userNames(opts.map((o) => (o as StudyOption & { run: Run }).run.createdBy))
  return opts.map((o) => {
    const run = (o as StudyOption & { run: Run }).run
    return {
      id: o.id,
      studyId,
      runId: o.runId,
      name: o.name,
      notes: o.notes,
      createdAt: o.createdAt.toISOString(),
      run: runRow(run, who),
      summary: headline(run.result),
    }
  })
}

/** The design summary of a stored result: a design run's own, or an optimisation's optimum. */
export function designSummaryOf(result: unknown): DesignSummary | null {
  const r = result as { summary?: DesignSummary; optimum?: { design?: { summary?: DesignSummary } } } | null
  return r?.summary ?? r?.optimum?.design?.summary ?? null
}

/** The run behind a study's recommended option, if it has one. */
export async function recommendedRun(s: Study): Promise<Run | null> {
  if (!s.recommendedOptionId) return null
  const o = await StudyOption.findByPk(s.recommendedOptionId)
  return o ? Run.findByPk(o.runId) : null
}

/** The headline numbers of a stored result (design or optimum). */
export function headline(result: unknown): Record<string, number> | null {
  const summary = designSummaryOf(result)
  if (!summary) return null
  const r = result as { optimum?: { totalAnnualCost?: number }; totalAnnualCost?: number }
  const out: Record<string, number> = {}
  for (const [k, v] of Object.entries(summary)) if (typeof v === 'number' && Number.isFinite(v)) out[k] = v
  const tac = r.totalAnnualCost ?? r.optimum?.totalAnnualCost
  if (typeof tac === 'number') out.totalAnnualCost = tac
  return out
}

export async function pinOption(siteId: number, studyId: number, body: { runId: number; name: string; notes: string }, actor: AuthUser, requestId: string) {
  const id = await sequelize.transaction(async (transaction) => {
    const s = await Study.findOne({ where: { id: studyId, siteId }, transaction, lock: transaction.LOCK.UPDATE })
    if (!s) throw new NotFoundError('Study')
    if (!EDITABLE.includes(s.status)) throw new ConflictError('Options can only be pinned while the study is a draft or returned.')
    const run = await Run.findOne({ where: { id: body.runId, studyId }, transaction })
    if (!run) throw new ConflictError('That run does not belong to this study.', [{ path: 'body.runId', message: 'is not a run of this study' }])
    const o = await StudyOption.create({ studyId, runId: run.id, name: body.name, notes: body.notes, createdBy: actor.id }, { transaction })
    await audit({ userId: actor.id, siteId, action: 'pin_option', entity: 'study', entityId: studyId, after: { optionId: o.id, runId: run.id, name: o.name }, requestId }, transaction)
    return o.id
  })
  const all = await listOptions(studyId)
  return all.find((o) => o.id === id)!
}

export async function removeOption(siteId: number, studyId: number, optionId: number, actor: AuthUser, requestId: string) {
  await sequelize.transaction(async (transaction) => {
    const s = await Study.findOne({ where: { id: studyId, siteId }, transaction, lock: transaction.LOCK.UPDATE })
    if (!s) throw new NotFoundError('Study')
    if (!EDITABLE.includes(s.status)) throw new ConflictError('Options can only be removed while the study is a draft or returned.')
    const o = await StudyOption.findOne({ where: { id: optionId, studyId }, transaction })
    if (!o) throw new NotFoundError('Option')
    if (s.recommendedOptionId === o.id) {
      s.recommendedOptionId = null
      await s.save({ transaction })
    }
    await o.destroy({ transaction })
    await audit({ userId: actor.id, siteId, action: 'remove_option', entity: 'study', entityId: studyId, before: { optionId, name: o.name }, requestId }, transaction)
  })
}
