import { describe, it, expect } from 'vitest'
import { api, tokenFor } from './helpers.ts'
import demo from '../../data/demo-studies.json' with { type: 'json' }

const ethanolCase = demo.studies[0]!.inputs

/**
 * The rule of the product (no outside source: it is how the site's economists date their prices):
 * the version in force on a date is the published version with the latest effective date on or
 * before that date; two with the same effective date -> the one published later.
 */
describe('the cost-basis version in force', () => {
  it('page, runs and publishing agree on one rule; an earlier date needs confirmation', async () => {
    const auth = { Authorization: `Bearer ${await tokenFor('admin')}` }
    const code = `in-force-${Date.now().toString(36)}`
    const site = await api().post('/api/v1/sites').set(auth).send({ name: 'Cobalt Ridge annex', code })
    expect(site.status).toBe(201)
    const base = `/api/v1/sites/${site.body.id}/cost-bases`

    async function publishDraft(effectiveDate: string, extra: Record<string, unknown> = {}) {
      const d = await api().post(base).set(auth).send({ preset: 'halvard-cobalt-ridge' })
      expect(d.status).toBe(201)
      const r = await api().post(`${base}/${d.body.id}/publish`).set(auth).send({ effectiveDate, lockVersion: d.body.lockVersion, ...extra })
      return { draft: d.body as { id: number; version: number; lockVersion: number }, res: r }
    }

    const v1 = await publishDraft('2025-03-01')
    expect(v1.res.status).toBe(200)

    // A draft dated before the version in force: refused until the publisher confirms, and told what it changes.
    const v2 = await publishDraft('2025-01-01')
    expect(v2.res.status).toBe(409)
    expect(v2.res.body.error.code).toBe('confirmation_needed')
    expect(v2.res.body.error.message).toContain('version 1')
    expect(v2.res.body.error.message).toContain('2025-03-01')
    const confirmed = await api().post(`${base}/${v2.draft.id}/publish`).set(auth)
      .send({ effectiveDate: '2025-01-01', lockVersion: v2.draft.lockVersion, confirmEarlierDate: true })
    expect(confirmed.status).toBe(200)
    expect(confirmed.body.version).toBe(2)

    // Today version 1 is still in force (latest effective date), not the newest version number.
    const current = await api().get(`${base}/current`).set(auth)
    expect(current.body.version).toBe(1)
    const list = await api().get(base).set(auth)
    const flagged = (list.body as { version: number; inForce: boolean }[]).filter((v) => v.inForce).map((v) => v.version)
    expect(flagged).toEqual([1])

    // The next run is priced with the same version the page names.
    const study = await api().post(`/api/v1/sites/${site.body.id}/studies`).set(auth).send({ name: 'Vent scrubber', inputs: ethanolCase })
    expect(study.status).toBe(201)
    const run = await api().post(`/api/v1/sites/${site.body.id}/studies/${study.body.id}/runs`).set(auth).send({ kind: 'design' })
    expect(run.status).toBe(201)
    expect(run.body.costBasisVersion).toBe(1)

    // Same effective date as the version in force: the later publication wins; no confirmation needed.
    const v3 = await publishDraft('2025-03-01')
    expect(v3.res.status).toBe(200)
    expect((await api().get(`${base}/current`).set(auth)).body.version).toBe(3)
    const run2 = await api().post(`/api/v1/sites/${site.body.id}/studies/${study.body.id}/runs`).set(auth).send({ kind: 'design' })
    expect(run2.body.costBasisVersion).toBe(3)
  })
})
