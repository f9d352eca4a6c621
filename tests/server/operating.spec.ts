import { describe, it, expect } from 'vitest'
import { readFileSync } from 'node:fs'
import { api, tokenFor, siteIds } from './helpers.ts'
import { OperatingEntry } from '../../server/db/models/index.ts'

const demo = JSON.parse(readFileSync('data/demo-studies.json', 'utf8')) as { studies: { inputs: Record<string, unknown> }[] }
const ethanolCase = demo.studies[0]!.inputs

async function approvedStudy(site: number) {
  const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
  const rev = { Authorization: `Bearer ${await tokenFor('reviewer')}` }
  const s = await api().post(`/api/v1/sites/${site}/studies`).set(eng).send({ name: `Tracked ${Date.now()}`, inputs: ethanolCase })
  const run = await api().post(`/api/v1/sites/${site}/studies/${s.body.id}/runs`).set(eng).send({ kind: 'design' })
  const opt = await api().post(`/api/v1/sites/${site}/studies/${s.body.id}/options`).set(eng).send({ runId: run.body.id, name: 'Base' })
  await api().post(`/api/v1/sites/${site}/studies/${s.body.id}/submit`).set(eng).send({ recommendedOptionId: opt.body.id })
  await api().post(`/api/v1/sites/${site}/studies/${s.body.id}/approve`).set(rev).send({})
  return { id: s.body.id as number, design: run.body.result.summary as { gasFlow: number; solventFlow: number; recovery: number } }
}

describe('operating log', () => {
  it('only an approved study takes entries', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const s = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Not approved', inputs: ethanolCase })
    const r = await api().post(`/api/v1/sites/${cobalt}/studies/${s.body.id}/operating-entries`).set(eng).send({ month: '2026-05', gasFlow: 400, solventFlow: 330 })
    expect(r.status).toBe(409)
  })

  it('prices months against the approved design; at design throughput and recovery the gap is only the power difference', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const { id, design } = await approvedStudy(cobalt)
    const atDesign = { month: '2026-03', gasFlow: design.gasFlow, solventFlow: design.solventFlow, recovery: design.recovery }
    const r = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/operating-entries`).set(eng).send(atDesign)
    expect(r.status).toBe(201)
    expect(r.body.months).toHaveLength(1)
    const m = r.body.months[0]
    expect(m.throughputRatio).toBeCloseTo(1, 12)
    // Same flows, same recovery, power from the design: actual equals design.
    expect(Math.abs(m.gap)).toBeLessThan(1e-6 * m.design.total)
    expect(m.flags).toEqual([])

    const dup = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/operating-entries`).set(eng).send(atDesign)
    expect(dup.status).toBe(409)
    // the error names the month
    expect(dup.body.error.message).toBe('2026-03 is logged already; edit that month instead.')
    expect(dup.body.error.details).toEqual([{ path: 'body.month', message: '2026-03 is logged already' }])

    const worse = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/operating-entries`).set(eng)
      .send({ month: '2026-04', gasFlow: design.gasFlow * 1.3, solventFlow: design.solventFlow, outletMoleFraction: 0.002 })
    const april = worse.body.months.find((x: { month: string }) => x.month === '2026-04')
    expect(april.gap).toBeGreaterThan(0)
    expect(april.flags.map((f: { code: string }) => f.code)).toEqual(expect.arrayContaining(['recoveryBelowTarget', 'gasAboveDesign', 'solventBelowDesign']))
    expect(worse.body.toDate.gap).toBeCloseTo(april.gap + m.gap, 6)
  })

  it('corrects a logged month under optimistic locking; a month taken already is named', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const { id, design } = await approvedStudy(cobalt)
    const base = `/api/v1/sites/${cobalt}/studies/${id}/operating-entries`
    await api().post(base).set(eng).send({ month: '2026-05', gasFlow: design.gasFlow, solventFlow: design.solventFlow, recovery: 0.97 })
    const r = await api().post(base).set(eng).send({ month: '2026-06', gasFlow: design.gasFlow, solventFlow: design.solventFlow * 0.8, recovery: 0.9 })
    const june = r.body.entries.find((e: { month: string }) => e.month === '2026-06')
    expect(r.body.months.find((m: { month: string }) => m.month === '2026-06').flags.map((f: { code: string }) => f.code)).toContain('solventBelowDesign')
    const entry = { month: '2026-06', gasFlow: design.gasFlow, solventFlow: design.solventFlow, inletMoleFraction: 0.014, recovery: 0.96, notes: 'flow meter recalibrated' }
    const ok = await api().put(`${base}/${june.id}`).set(eng).send({ entry, lockVersion: june.lockVersion })
    expect(ok.status).toBe(200)
    const after = ok.body.entries.find((e: { id: number }) => e.id === june.id)
    expect(after).toMatchObject({ solventFlow: design.solventFlow, inletMoleFraction: 0.014, recovery: 0.96, notes: 'flow meter recalibrated', lockVersion: june.lockVersion + 1 })
    expect(ok.body.months.find((m: { month: string }) => m.month === '2026-06').flags.map((f: { code: string }) => f.code)).not.toContain('solventBelowDesign')
    // a second writer with the old version is refused, nothing changes
    const stale = await api().put(`${base}/${june.id}`).set(eng).send({ entry: { ...entry, notes: 'late writer' }, lockVersion: june.lockVersion })
    expect(stale.status).toBe(409)
    expect(stale.body.error.details[0].path).toBe('body.lockVersion')
    // moving it onto a month logged already names that month
    const onto = await api().put(`${base}/${june.id}`).set(eng).send({ entry: { ...entry, month: '2026-05' }, lockVersion: june.lockVersion + 1 })
    expect(onto.status).toBe(409)
    expect(onto.body.error.message).toContain('2026-05 is logged already')
    // a CSV holding months logged already names them all; nothing is logged
    const csv = 'month,gasFlow,solventFlow\n2026-05,400,330\n2026-06,400,330\n2026-07,400,330\n'
    const imp = await api().post(`${base}/import`).set(eng).attach('file', Buffer.from(csv), 'log.csv')
    expect(imp.status).toBe(409)
    expect(imp.body.error.message).toBe('2026-05 and 2026-06 are logged already; edit those months instead.')
    expect(await OperatingEntry.count({ where: { studyId: id } })).toBe(2)
  })

  it('imports a CSV: all rows or none, with line numbers', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const { id } = await approvedStudy(cobalt)
    const bad = 'month,gasFlow,solventFlow,recovery\r\n2026-01,400,330,0.98\r\n2026-02,abc,330,0.98\r\n2026-13,400,330,0.98\r\n'
    const r = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/operating-entries/import`).set(eng).attach('file', Buffer.from(bad), 'log.csv')
    expect(r.status).toBe(400)
    expect(r.body.error.details.map((d: { path: string }) => d.path)).toEqual(['file:line 3', 'file:line 4'])
    expect(await OperatingEntry.count({ where: { studyId: id } })).toBe(0)

    const good = '\uFEFFmonth,gasFlow,solventFlow,outletMoleFraction,powerKw,notes\n2026-01,400,330,0.0003,14,"cold month, fine"\n2026-02,410,335,,15,\n\n'
    const ok = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/operating-entries/import`).set(eng).attach('file', Buffer.from(good), 'log.csv')
    expect(ok.status).toBe(201)
    expect(ok.body.entries.map((e: { month: string }) => e.month)).toEqual(['2026-01', '2026-02'])
    expect(ok.body.entries[0].notes).toBe('cold month, fine')

    // A row with more fields than the header is refused with its line, never silently cut.
    const extra = 'month,gasFlow,solventFlow\n2031-01,400,300,EXTRA\n'
    const ex = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/operating-entries/import`).set(eng).attach('file', Buffer.from(extra), 'log.csv')
    expect(ex.status).toBe(400)
    expect(ex.body.error.details.map((d: { path: string }) => d.path)).toEqual(['file:line 2'])
    expect(ex.body.error.details[0].message).toContain('1 field beyond the header')

    // The same number rule as the other uploads: no thousands separators, no hex, no blanks inside.
    const oddNumbers = 'month,gasFlow,solventFlow\n2031-02,0x190,300\n2031-03,1e3,300\n'
    const odd = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/operating-entries/import`).set(eng).attach('file', Buffer.from(oddNumbers), 'log.csv')
    expect(odd.status).toBe(400)
    expect(odd.body.error.details.map((d: { path: string }) => d.path)).toEqual(['file:line 2'])

    const wrongType = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/operating-entries/import`).set(eng).attach('file', Buffer.from('x'), 'log.pdf')
    expect(wrongType.status).toBe(400)
    const rev = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/operating-entries/import`).set('Authorization', `Bearer ${await tokenFor('reviewer')}`).attach('file', Buffer.from(good), 'log.csv')
    expect(rev.status).toBe(403)
  })
})

describe('operating log: messages in the person\'s units and words', () => {
  type Detail = { path: string; message: string }
  const byPath = (details: Detail[]) => Object.fromEntries(details.map((d) => [d.path, d.message]))

  it('a month with nonsense names each value as the person sees it (percent, kmol/h or lbmol/h), never a bare bound', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const { id } = await approvedStudy(cobalt)
    const url = `/api/v1/sites/${cobalt}/studies/${id}/operating-entries`
    const nonsense = { month: '2026-08', gasFlow: -300, solventFlow: 0, inletMoleFraction: 1.2, recovery: 1.2, powerKw: -5 }
    const si = await api().post(url).set(eng).send(nonsense)
    expect(si.status).toBe(400)
    const m = byPath(si.body.error.details)
    expect(m['body.gasFlow']).toBe('-300 kmol/h: the gas flow must be positive')
    expect(m['body.solventFlow']).toBe('0 kmol/h: the solvent flow must be positive')
    expect(m['body.inletMoleFraction']).toBe('120 mol %: the inlet solute must be below 100 mol %')
    expect(m['body.recovery']).toBe('120 %: recovery must be below 100 %')
    expect(m['body.powerKw']).toBe('-5 kW: the power must not be negative')
    for (const d of si.body.error.details as Detail[]) expect(d.message).not.toMatch(/expected|<1|>0|too (small|big)/i)

    // 300 kmol/h = 661.4 lbmol/h (1 lb = 0.45359237 kg exactly, NIST SP 811 B.8)
    const us = await api().post(url).set(eng).set('X-Unit-System', 'US').send({ ...nonsense, gasFlow: -300, solventFlow: 'lots' })
    expect(us.status).toBe(400)
    const u = byPath(us.body.error.details)
    expect(u['body.gasFlow']).toBe('-661.4 lbmol/h: the gas flow must be positive')
    expect(u['body.solventFlow']).toBe('not a number: enter the solvent flow')
    const missing = await api().post(url).set(eng).send({ month: '2026-08' })
    expect(byPath(missing.body.error.details)['body.gasFlow']).toBe('required: enter the gas flow')
  })

  it('CSV rows with values out of range are named by line in the person\'s units', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const { id } = await approvedStudy(cobalt)
    const csv = 'month,gasFlow,solventFlow,recovery\n2026-01,400,330,1.2\n2026-02,-300,330,0.98\n'
    const r = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/operating-entries/import`).set(eng).set('X-Unit-System', 'US').attach('file', Buffer.from(csv), 'log.csv')
    expect(r.status).toBe(400)
    expect(r.body.error.details).toEqual([
      { path: 'file:line 2', message: expect.stringMatching(/^recovery: 120 %: recovery must be below 100 %$/) },
      { path: 'file:line 3', message: expect.stringMatching(/^gasFlow: -661\.4 lbmol\/h: the gas flow must be positive$/) },
    ])
  })
})

describe('operating log: the standing column watched month by month', () => {
  it('rates each month with the as-built column, back-calculates the efficiency, warns of drift and splits the cost gap', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const { id, design } = await approvedStudy(cobalt)
    const col = await api().get(`/api/v1/sites/${cobalt}/studies/${id}/standing-column`).set(eng)
    expect(col.status).toBe(200)
    expect(col.body.rating.window.inside).toBe(true)
    expect(col.body.ratingCase.column.actualTrays).toBeGreaterThan(1)
    const expected = col.body.rating.summary.recovery as number
    const months = [
      { month: '2026-01', gasFlow: design.gasFlow, solventFlow: design.solventFlow, recovery: expected },
      { month: '2026-02', gasFlow: design.gasFlow, solventFlow: design.solventFlow * 1.3, recovery: 0.95, inletMoleFraction: 0.014 },
      { month: '2026-03', gasFlow: design.gasFlow, solventFlow: design.solventFlow, recovery: 0.95 },
      { month: '2026-04', gasFlow: design.gasFlow * 1.6, solventFlow: design.solventFlow * 1.6, recovery: 0.95 },
    ]
    let r
    for (const m of months) r = await api().post(`/api/v1/sites/${cobalt}/studies/${id}/operating-entries`).set(eng).send(m)
    expect(r!.status).toBe(201)
    const mon = r!.body.monitoring
    expect(mon.months).toHaveLength(4)
    expect(mon.months[0].achievedEfficiency).toBeCloseTo(mon.designPoint.overallEfficiency, 5)
    expect(mon.months[1].inletMoleFraction).toBe(0.014)
    expect(r!.body.entries[1].inletMoleFraction).toBe(0.014)
    expect(mon.drift.warning).toBe(true)
    expect(mon.drift.since).toBe('2026-02')
    expect(mon.months[3].insideWindow).toBe(false)
    for (const m of mon.months) {
      const g = m.costGap
      expect(g.prices + g.throughput + g.excessSolvent + g.efficiencyLoss + g.other).toBeCloseTo(g.gap, 6)
    }
    expect(mon.months[1].costGap.excessSolvent).toBeGreaterThan(0)
    expect(mon.months[2].costGap.efficiencyLoss).toBeGreaterThan(0)
    expect(mon.window.boundaries).toHaveLength(4)
  })

  it('the standing column needs an approved study', async () => {
    const { cobalt } = await siteIds()
    const eng = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const s = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Draft column', inputs: ethanolCase })
    const r = await api().get(`/api/v1/sites/${cobalt}/studies/${s.body.id}/standing-column`).set(eng)
    expect(r.status).toBe(422)
  })
})
