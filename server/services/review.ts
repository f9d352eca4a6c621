import { Op } from 'sequelize'
import { sequelize } from '../db/sequelize.ts'
import { Study, StudyOption, ReviewEvent, User, Membership, Site, StudyView, Run } from '../db/models/index.ts'
import { ConflictError, NotFoundError } from '../errors.ts'
import { audit } from './audit.ts'
import { enqueue, deliverSoon, linkTo, type Mail } from './mail.ts'
import { getStudy } from './studies.ts'
import { TRANSITIONS, type ReviewEventView, type ReviewKind } from '../../shared/schemas/review.ts'
import type { AuthUser } from '../types.d.ts'
import type { StudyStatus } from '../../shared/schemas/common.ts'
import type { NotificationChange, StudyNotification } from '../../shared/schemas/answers.ts'

export async function thread(siteId: number, studyId: number): Promise<ReviewEventView[]> {
  const s = await Study.findOne({ where: { id: studyId, siteId }, attributes: ['id'] })
  if (!s) throw new NotFoundError('Study')
  const events = await ReviewEvent.findAll({ where: { studyId }, order: [['id', 'ASC']], include: [{ model: User, as: 'user', attributes: ['id', 'name'] }] })
  return events.map((e) => ({
    id: e.id,
    kind: e.kind,
    body: e.body,
    userId: e.userId,
    userName: (e as ReviewEvent & { user: User }).user.name,
    createdAt: e.createdAt.toISOString(),
  }))
}

/** The people concerned by a study: its owner, the site's reviewers and everyone in its thread. */
async function concerned(study: Study, opts: { reviewers: boolean }): Promise<User[]> {
  const ids = new Set<number>([study.ownerId as number])
  const participants = await ReviewEvent.findAll({ where: { studyId: study.id }, attributes: ['userId'] })
  for (const p of participants) ids.add(p.userId)
  if (opts.reviewers) {
    const rs = await Membership.findAll({ where: { siteId: study.siteId as number, role: 'reviewer' }, attributes: ['userId'] })
    for (const r of rs) ids.add(r.userId as number)
  }
  return User.findAll({ where: { id: [...ids] } })
}

const VERB: Record<ReviewKind, string> = {
  submit: 'submitted for review',
  approve: 'approved',
  return: 'returned with comments',
  comment: 'commented on',
  reopen: 'reopened',
}

/** What someone did to a study, as a sentence after their name (notifications). */
const DID: Record<ReviewKind, string> = {
  submit: 'submitted the study for review',
  approve: 'approved the study',
  return: 'returned the study with comments',
  comment: 'commented on the study',
  reopen: 'reopened the study',
}

async function mailsFor(study: Study, actor: AuthUser, kind: ReviewKind, body: string): Promise<Mail[]> {
  const site = await Site.findByPk(study.siteId as number)
  const people = await concerned(study, { reviewers: kind === 'submit' || kind === 'comment' })
  const link = linkTo(`/sites/${study.siteId}/studies/${study.id}`)
  return people
    .filter((p) => p.id !== actor.id)
    .map((p) => ({
      to: p.email,
      subject: `[Scrubwright] ${study.name} ${VERB[kind]}`,
      body: [
        `Hello ${p.name},`,
        '',
        `${actor.name} ${VERB[kind]} the study "${study.name}" at ${site?.name ?? 'your site'}.`,
        body ? `\n${kind === 'comment' ? 'Comment' : 'Note'}:\n${body}\n` : '',
        `Open it: ${link}`,
        '',
        '-- Scrubwright',
      ].join('\n'),
    }))
}

async function transition(
  siteId: number,
  studyId: number,
  action: keyof typeof TRANSITIONS,
  actor: AuthUser,
  requestId: string,
  body: string,
  extra?: (s: Study, t: import('sequelize').Transaction) => Promise<void>,
) {
  const rule = TRANSITIONS[action]
  await sequelize.transaction(async (transaction) => {
    const s = await Study.findOne({ where: { id: studyId, siteId }, transaction, lock: transaction.LOCK.UPDATE })
    if (!s) throw new NotFoundError('Study')
    if (!(rule.from as readonly StudyStatus[]).includes(s.status)) {
      throw new ConflictError(`A study that is ${s.status.replace('_', ' ')} cannot be ${VERB[action]}.`, [
        { path: 'status', message: `is ${s.status}; allowed from ${rule.from.join(' or ')}` },
      ])
    }
    if (extra) await extra(s, transaction)
    const before = s.status
    s.status = rule.to
    s.lockVersion += 1
    await s.save({ transaction })
    await ReviewEvent.create({ studyId, userId: actor.id, kind: action, body }, { transaction })
    await audit({ userId: actor.id, siteId, action, entity: 'study', entityId: studyId, before: { status: before }, after: { status: s.status, recommendedOptionId: s.recommendedOptionId }, requestId }, transaction)
    await enqueue(await mailsFor(s, actor, action, body), transaction)
  })
  deliverSoon()
  return getStudy(siteId, studyId, actor)
}

export function submit(siteId: number, studyId: number, body: { recommendedOptionId: number; comment: string }, actor: AuthUser, requestId: string) {
  return transition(siteId, studyId, 'submit', actor, requestId, body.comment, async (s, transaction) => {
    const opt = await StudyOption.findOne({ where: { id: body.recommendedOptionId, studyId }, transaction })
    if (!opt) throw new ConflictError('Recommend one of the study\'s pinned options.', [{ path: 'body.recommendedOptionId', message: 'is not an option of this study' }])
    s.recommendedOptionId = opt.id
  })
}

export function approve(siteId: number, studyId: number, body: { comment: string }, actor: AuthUser, requestId: string) {
  return transition(siteId, studyId, 'approve', actor, requestId, body.comment)
}

export function returnStudy(siteId: number, studyId: number, body: { comment: string }, actor: AuthUser, requestId: string) {
  return transition(siteId, studyId, 'return', actor, requestId, body.comment)
}

export async function comment(siteId: number, studyId: number, text: string, actor: AuthUser, requestId: string): Promise<ReviewEventView[]> {
  await sequelize.transaction(async (transaction) => {
    const s = await Study.findOne({ where: { id: studyId, siteId }, transaction })
    if (!s) throw new NotFoundError('Study')
    await ReviewEvent.create({ studyId, userId: actor.id, kind: 'comment', body: text }, { transaction })
    await audit({ userId: actor.id, siteId, action: 'comment', entity: 'study', entityId: studyId, after: { body: text }, requestId }, transaction)
    await enqueue(await mailsFor(s, actor, 'comment', text), transaction)
  })
  deliverSoon()
  return thread(siteId, studyId)
}

/**
 * An approved study stays frozen; a change starts a revision: a new draft study with the same
 * inputs and search, revision + 1, pointing back at the approved one.
 */
export async function revise(siteId: number, studyId: number, actor: AuthUser, requestId: string) {
  const id = await sequelize.transaction(async (transaction) => {
    const s = await Study.findOne({ where: { id: studyId, siteId }, transaction, lock: transaction.LOCK.UPDATE })
    if (!s) throw new NotFoundError('Study')
    if (s.status !== 'approved') throw new ConflictError('Only an approved study is revised; edit drafts directly.')
    const copy = await Study.create(
      {
        siteId, ownerId: actor.id, name: s.name, description: s.description, inputs: s.inputs, search: s.search,
        revision: s.revision + 1, parentStudyId: s.id, recommendedOptionId: null, optimumTac: null,
        targetRecovery: s.targetRecovery, lastRunAt: null,
      },
      { transaction },
    )
    await audit({ userId: actor.id, siteId, action: 'revise', entity: 'study', entityId: copy.id, after: { from: s.id, revision: copy.revision }, requestId }, transaction)
    return copy.id
  })
  return getStudy(siteId, id, actor)
}

/** Studies at the site that changed (by someone else) since the person last looked. */
export async function notifications(siteId: number, user: AuthUser) {
  const studies = await Study.findAll({ where: { siteId, status: { [Op.ne]: 'archived' } }, attributes: ['id', 'name', 'status', 'updatedAt'] })
  if (!studies.length) return []
  const ids = studies.map((s) => s.id)
  const views = new Map((await StudyView.findAll({ where: { userId: user.id, studyId: ids } })).map((v) => [v.studyId, v.seenAt]))
  const events = await ReviewEvent.findAll({
    where: { studyId: ids, userId: { [Op.ne]: user.id } },
    order: [['id', 'ASC']],
    include: [{ model: User, as: 'user', attributes: ['name'] }],
  })
  const runs = await Run.findAll({ where: { studyId: ids, createdBy: { [Op.ne]: user.id } }, attributes: ['studyId', 'kind', 'createdAt', 'createdBy'] })
  const runners = new Map(
    (await User.findAll({ where: { id: [...new Set(runs.map((r) => r.createdBy).filter((x): x is number => x !== null))] }, attributes: ['id', 'name'] })).map((u) => [u.id, u.name]),
  )
  const newestFirst = (a: { at: string }, b: { at: string }) => b.at.localeCompare(a.at)
  type Change = NotificationChange
  const out: StudyNotification[] = []
  for (const s of studies) {
    const seen = views.get(s.id) ?? null
    const newer = (d: Date) => seen === null || d > seen
    const ev = events.filter((e) => e.studyId === s.id && newer(e.createdAt))
    const rn = runs.filter((r) => r.studyId === s.id && newer(r.createdAt))
    if (!ev.length && !rn.length) continue
    // Review actions first (newest first), then new runs (newest first).
    const actions = ev
      .map((e) => ({ at: e.createdAt.toISOString(), what: `${(e as ReviewEvent & { user: User }).user.name} ${DID[e.kind]}`, kind: e.kind as ReviewKind | 'run' }))
      .sort(newestFirst)
    const newRuns = rn
      .map((r) => {
        const what = r.kind === 'optimize' ? 'an optimisation' : 'a design'
        const who = r.createdBy !== null ? runners.get(r.createdBy) : undefined
        return { at: r.createdAt.toISOString(), what: who ? `${who} ran ${what}` : `Someone ran ${what}`, kind: 'run' as const }
      })
      .sort(newestFirst)
    out.push({ studyId: s.id, name: s.name, status: s.status, lastSeenAt: seen ? seen.toISOString() : null, changes: [...actions, ...newRuns] })
  }
  // Studies with a review action come first, then the most recent change first.
  const hasAction = (n: { changes: Change[] }) => (n.changes[0]?.kind !== 'run' ? 1 : 0)
  out.sort((a, b) => hasAction(b) - hasAction(a) || (b.changes[0]?.at ?? '').localeCompare(a.changes[0]?.at ?? ''))
  return out
}
