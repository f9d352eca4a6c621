import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import { readFileSync } from 'node:fs'
import { api, tokenFor, siteIds, PEOPLE } from './helpers.ts'
import { startFakeSmtp, capturedMail, clearCapturedMail } from '../../server/mail/fake-smtp.ts'
import { setSmtpPort, kick } from '../../server/services/mail.ts'
import { AuditEntry, MailMessage } from '../../server/db/models/index.ts'

const demo = JSON.parse(readFileSync('data/demo-studies.json', 'utf8')) as { studies: { inputs: Record<string, unknown> }[] }
const ethanolCase = demo.studies[0]!.inputs

let smtp: { port: number; close: () => Promise<void> }
beforeAll(async () => {
  smtp = await startFakeSmtp(0)
  setSmtpPort(smtp.port)
})
afterAll(async () => {
  await smtp.close()
})

async function as(who: 'engineer' | 'reviewer' | 'economist' | 'admin') {
  return { Authorization: `Bearer ${await tokenFor(who)}` }
}

async function studyWithOption(site: number, name: string) {
  const eng = await as('engineer')
  const s = await api().post(`/api/v1/sites/${site}/studies`).set(eng).send({ name, inputs: ethanolCase })
  const run = await api().post(`/api/v1/sites/${site}/studies/${s.body.id}/runs`).set(eng).send({ kind: 'design' })
  const opt = await api().post(`/api/v1/sites/${site}/studies/${s.body.id}/options`).set(eng).send({ runId: run.body.id, name: 'Base' })
  return { id: s.body.id as number, optionId: opt.body.id as number }
}

describe('review and sign-off', () => {
  it('submit -> return -> resubmit -> approve, with mail to the people concerned and every change audited', async () => {
    const { cobalt } = await siteIds()
    const { id, optionId } = await studyWithOption(cobalt, 'Review flow')
    clearCapturedMail()

    const sub = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/submit`).set(await as('engineer')).send({ recommendedOptionId: optionId, comment: 'Please look at the tray spacing.' })
    expect(sub.status).toBe(200)
    expect(sub.body.status).toBe('in_review')
    expect(sub.body.recommendedOptionId).toBe(optionId)
    // Frozen while in review.
    expect((await api().put(`/api/v1/sites/${cobalt}/studies/${id}`).set(await as('engineer')).send({ name: 'x', lockVersion: sub.body.lockVersion })).status).toBe(409)
    expect((await api().post(`/api/v1/sites/${cobalt}/studies/${id}/runs`).set(await as('engineer')).send({ kind: 'design' })).status).toBe(409)

    await kick()
    // Mail queued by other tests may arrive too; look at this study's only.
    const mine = capturedMail().filter((m) => m.subject.includes('Review flow'))
    const toReviewer = mine.filter((m) => m.to.includes(PEOPLE.reviewer))
    expect(toReviewer.length).toBe(1)
    expect(toReviewer[0]!.subject).toContain('Review flow submitted for review')
    expect(toReviewer[0]!.text).toContain('Please look at the tray spacing.')
    expect(mine.some((m) => m.to.includes(PEOPLE.engineer))).toBe(false) // not to the actor

    const noComment = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/return`).set(await as('reviewer')).send({})
    expect(noComment.status).toBe(400)
    expect(noComment.body.error.details[0].path).toBe('body.comment')
    const ret = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/return`).set(await as('reviewer')).send({ comment: 'Use 0.5 m spacing.' })
    expect(ret.body.status).toBe('returned')
    await kick()
    expect(capturedMail().some((m) => m.to.includes(PEOPLE.engineer) && m.subject.includes('Review flow returned'))).toBe(true)

    const re = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/submit`).set(await as('engineer')).send({ recommendedOptionId: optionId })
    expect(re.body.status).toBe('in_review')
    const ok = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/approve`).set(await as('reviewer')).send({ comment: 'Agreed.' })
    expect(ok.status).toBe(200)
    expect(ok.body.status).toBe('approved')
    expect(ok.body.can.edit).toBe(false)

    const thread = await api().get(`/api/v1/sites/${cobalt}/studies/${id}/comments`).set(await as('economist'))
    expect(thread.body.map((e: { kind: string }) => e.kind)).toEqual(['submit', 'return', 'submit', 'approve'])
    const log = await AuditEntry.findAll({ where: { entity: 'study', entityId: String(id) }, order: [['id', 'ASC']] })
    expect(log.map((l) => l.action)).toEqual(expect.arrayContaining(['create', 'run_design', 'pin_option', 'submit', 'return', 'approve']))
  })

  it('only the allowed transitions exist', async () => {
    const { cobalt } = await siteIds()
    const { id, optionId } = await studyWithOption(cobalt, 'Transitions')
    const eng = await as('engineer')
    const rev = await as('reviewer')
    // Draft cannot be approved or returned.
    expect((await api().post(`/api/v1/sites/${cobalt}/studies/${id}/approve`).set(rev).send({})).status).toBe(409)
    expect((await api().post(`/api/v1/sites/${cobalt}/studies/${id}/return`).set(rev).send({ comment: 'x' })).status).toBe(409)
    // Engineers cannot approve; reviewers cannot submit.
    await api().post(`/api/v1/sites/${cobalt}/studies/${id}/submit`).set(eng).send({ recommendedOptionId: optionId })
    expect((await api().post(`/api/v1/sites/${cobalt}/studies/${id}/approve`).set(eng).send({})).status).toBe(403)
    expect((await api().post(`/api/v1/sites/${cobalt}/studies/${id}/submit`).set(rev).send({ recommendedOptionId: optionId })).status).toBe(403)
    // In review cannot be submitted again; approved cannot be returned.
    expect((await api().post(`/api/v1/sites/${cobalt}/studies/${id}/submit`).set(eng).send({ recommendedOptionId: optionId })).status).toBe(409)
    await api().post(`/api/v1/sites/${cobalt}/studies/${id}/approve`).set(rev).send({})
    expect((await api().post(`/api/v1/sites/${cobalt}/studies/${id}/return`).set(rev).send({ comment: 'late' })).status).toBe(409)
    // A change to an approved study starts a revision; the approved one stays frozen.
    const rv = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/revise`).set(eng).send({})
    expect(rv.status).toBe(201)
    expect(rv.body.revision).toBe(2)
    expect(rv.body.status).toBe('draft')
    expect(rv.body.parentStudyId).toBe(id)
    const original = await api().get(`/api/v1/sites/${cobalt}/studies/${id}`).set(eng)
    expect(original.body.status).toBe('approved')
    expect((await api().delete(`/api/v1/sites/${cobalt}/studies/${id}/options/${optionId}`).set(eng)).status).toBe(409)
  })

  it('submit needs a recommended option of the same study', async () => {
    const { cobalt } = await siteIds()
    const a = await studyWithOption(cobalt, 'Rec A')
    const b = await studyWithOption(cobalt, 'Rec B')
    const r = await api().post(`/api/v1/sites/${cobalt}/studies/${a.id}/submit`).set(await as('engineer')).send({ recommendedOptionId: b.optionId })
    expect(r.status).toBe(409)
    expect(r.body.error.details[0].path).toBe('body.recommendedOptionId')
  })

  it('comments form a thread, mail the people concerned and show as notifications', async () => {
    const { cobalt } = await siteIds()
    const { id } = await studyWithOption(cobalt, 'Comment thread')
    await api().get(`/api/v1/sites/${cobalt}/studies/${id}`).set(await as('reviewer')) // reviewer looks once
    clearCapturedMail()
    const c = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/comments`).set(await as('economist')).send({ body: 'Solvent price changes next quarter.' })
    expect(c.status).toBe(201)
    expect(c.body.at(-1)).toMatchObject({ kind: 'comment', body: 'Solvent price changes next quarter.' })
    await kick()
    const to = capturedMail().filter((m) => m.subject.includes('Comment thread')).flatMap((m) => m.to)
    expect(to).toEqual(expect.arrayContaining([PEOPLE.engineer, PEOPLE.reviewer]))
    expect(to).not.toContain(PEOPLE.economist)
    const n = await api().get(`/api/v1/sites/${cobalt}/notifications`).set(await as('reviewer'))
    const item = n.body.find((x: { studyId: number }) => x.studyId === id)
    expect(item.changes.some((ch: { kind: string }) => ch.kind === 'comment')).toBe(true)
    // Looking at the study clears it.
    await api().get(`/api/v1/sites/${cobalt}/studies/${id}`).set(await as('reviewer'))
    const n2 = await api().get(`/api/v1/sites/${cobalt}/notifications`).set(await as('reviewer'))
    expect(n2.body.find((x: { studyId: number }) => x.studyId === id)).toBeUndefined()
  })

  it('notifications read as sentences, review actions before new runs', async () => {
    const { cobalt } = await siteIds()
    // the reviewer looks at the study, then the engineer runs it again and submits it
    const eng = await as('engineer')
    const s = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Sentence check', inputs: ethanolCase })
    await api().get(`/api/v1/sites/${cobalt}/studies/${s.body.id}`).set(await as('reviewer'))
    const run = await api().post(`/api/v1/sites/${cobalt}/studies/${s.body.id}/runs`).set(eng).send({ kind: 'design' })
    const opt = await api().post(`/api/v1/sites/${cobalt}/studies/${s.body.id}/options`).set(eng).send({ runId: run.body.id, name: 'Base' })
    const sub = await api().post(`/api/v1/sites/${cobalt}/studies/${s.body.id}/submit`).set(eng).send({ recommendedOptionId: opt.body.id, comment: '' })
    expect(sub.status).toBe(200)
    const me = await api().get('/api/v1/auth/me').set(eng)
    const n = await api().get(`/api/v1/sites/${cobalt}/notifications`).set(await as('reviewer'))
    const item = n.body.find((x: { studyId: number }) => x.studyId === s.body.id)
    const what = item.changes.map((c: { what: string }) => c.what)
    // the review action comes first, although the run is older
    expect(what).toEqual([`${me.body.name} submitted the study for review`, `${me.body.name} ran a design`])
    expect(what.join(' ')).not.toMatch(/ it$| it /)
    // studies with a review action are listed before studies with only new runs
    const kinds = (n.body as { changes: { kind: string }[] }[]).map((x) => (x.changes[0]!.kind === 'run' ? 'run' : 'action'))
    expect(kinds.indexOf('run') === -1 || kinds.lastIndexOf('action') < kinds.indexOf('run')).toBe(true)
  })

  it('a mail server that is down never breaks the action; the message stays queued for retry', async () => {
    const { cobalt } = await siteIds()
    const { id } = await studyWithOption(cobalt, 'Mail down')
    setSmtpPort(1) // nothing listens there
    const c = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/comments`).set(await as('reviewer')).send({ body: 'Checked.' })
    expect(c.status).toBe(201)
    await kick()
    const queued = await MailMessage.findAll({ where: { status: 'pending' } })
    expect(queued.some((m) => m.attempts >= 1 && m.lastError)).toBe(true)
    setSmtpPort(smtp.port)
  })

  it('the outbox is for system administrators', async () => {
    expect((await api().get('/api/v1/outbox').set(await as('engineer'))).status).toBe(403)
    const r = await api().get('/api/v1/outbox').set(await as('admin'))
    expect(r.status).toBe(200)
    expect(Array.isArray(r.body.captured)).toBe(true)
  })
})
