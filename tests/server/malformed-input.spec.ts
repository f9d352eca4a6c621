import { describe, it, expect, beforeAll } from 'vitest'
import { readFileSync } from 'node:fs'
import { api, tokenFor, siteIds, type Person } from './helpers.ts'
import { StudyView } from '../../server/db/models/index.ts'

/**
 * Malformed input never reaches a 500: each case answers a 4xx in the documented error shape
 * { error: { code, message, details, requestId } }.
 */
const demo = JSON.parse(readFileSync('data/demo-studies.json', 'utf8')) as { studies: { inputs: Record<string, unknown> }[] }
const ethanolCase = demo.studies[0]!.inputs

let cobalt = 0
beforeAll(async () => {
  cobalt = (await siteIds()).cobalt
})
const auth = async (who: Person) => ({ Authorization: `Bearer ${await tokenFor(who)}` })

function expectErrorShape(res: { status: number; body: unknown }, status: number | [number, number]) {
  if (Array.isArray(status)) {
    expect(res.status).toBeGreaterThanOrEqual(status[0])
    expect(res.status).toBeLessThanOrEqual(status[1])
  } else expect(res.status).toBe(status)
  const e = (res.body as { error: { code: unknown; message: unknown; details: unknown; requestId: unknown } }).error
  expect(typeof e.code).toBe('string')
  expect(typeof e.message).toBe('string')
  expect(Array.isArray(e.details)).toBe(true)
  expect(typeof e.requestId).toBe('string')
}

async function approvedStudy(): Promise<number> {
  const eng = await auth('engineer')
  const rev = await auth('reviewer')
  const s = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: `Malformed ${Date.now()}`, inputs: ethanolCase })
  const run = await api().post(`/api/v1/sites/${cobalt}/studies/${s.body.id}/runs`).set(eng).send({ kind: 'design' })
  const opt = await api().post(`/api/v1/sites/${cobalt}/studies/${s.body.id}/options`).set(eng).send({ runId: run.body.id, name: 'Base' })
  await api().post(`/api/v1/sites/${cobalt}/studies/${s.body.id}/submit`).set(eng).send({ recommendedOptionId: opt.body.id })
  await api().post(`/api/v1/sites/${cobalt}/studies/${s.body.id}/approve`).set(rev).send({})
  return s.body.id as number
}

const BOUNDARY = 'swboundary1234'
function multipart(filename: string, content: string): string {
  return `--${BOUNDARY}\r\nContent-Disposition: form-data; name="file"; filename="${filename}"\r\nContent-Type: text/csv\r\n\r\n${content}\r\n--${BOUNDARY}--\r\n`
}

describe('malformed multipart bodies on every upload route', () => {
  let studyId = 0
  beforeAll(async () => {
    studyId = await approvedStudy()
  })
  const routes = (): { path: string; who: Person }[] => [
    { path: `/api/v1/sites/${cobalt}/uploads/equilibrium/preview`, who: 'engineer' },
    { path: `/api/v1/sites/${cobalt}/uploads/equilibrium`, who: 'engineer' },
    { path: `/api/v1/sites/${cobalt}/uploads/quotes/preview`, who: 'economist' },
    { path: `/api/v1/sites/${cobalt}/uploads/quotes`, who: 'economist' },
    { path: `/api/v1/sites/${cobalt}/studies/${studyId}/operating-entries/import`, who: 'engineer' },
  ]

  it('a body cut short answers 400', async () => {
    for (const r of routes()) {
      const body = multipart('data.csv', 'x,y\n0,0\n0.01,0.006\n').slice(0, 120)
      const res = await api().post(r.path).set(await auth(r.who)).set('Content-Type', `multipart/form-data; boundary=${BOUNDARY}`).send(body)
      expectErrorShape(res, 400)
    }
  })

  it('a body with another boundary than the header names answers 400', async () => {
    for (const r of routes()) {
      const body = multipart('data.csv', 'x,y\n0,0\n')
      const res = await api().post(r.path).set(await auth(r.who)).set('Content-Type', 'multipart/form-data; boundary=notTheOneUsed').send(body)
      expectErrorShape(res, 400)
    }
  })

  it('a CR LF inside the file name answers 4xx', async () => {
    for (const r of routes()) {
      const body = multipart('da\r\nta.csv', 'x,y\n0,0\n')
      const res = await api().post(r.path).set(await auth(r.who)).set('Content-Type', `multipart/form-data; boundary=${BOUNDARY}`).send(body)
      expectErrorShape(res, [400, 499])
    }
  })

  it('an operating-log row with more columns than the header answers 400 with its line number', async () => {
    const res = await api()
      .post(`/api/v1/sites/${cobalt}/studies/${studyId}/operating-entries/import`)
      .set(await auth('engineer'))
      .attach('file', Buffer.from('month,gasFlow,solventFlow\n2031-01,400,300,EXTRA\n', 'utf8'), { filename: 'log.csv', contentType: 'text/csv' })
    expectErrorShape(res, 400)
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain('file:line 2')
  })
})

describe('designs whose numbers overflow', () => {
  const huge = { ...ethanolCase, gas: { ...(ethanolCase.gas as Record<string, unknown>), flow: 1e9 } }

  it('a stateless design priced with the site cost basis answers 422 with the reason', async () => {
    const res = await api().post('/api/v1/designs/evaluate').set(await auth('engineer')).send({ case: huge, siteId: cobalt })
    expectErrorShape(res, 422)
    expect(res.body.error.details.length).toBeGreaterThan(0)
  })

  it('a stored run of such a study answers 422 with the reason, and nothing is stored', async () => {
    const eng = await auth('engineer')
    const s = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: `Overflow ${Date.now()}`, inputs: huge })
    expect(s.status).toBe(201)
    const res = await api().post(`/api/v1/sites/${cobalt}/studies/${s.body.id}/runs`).set(eng).send({ kind: 'design' })
    expectErrorShape(res, 422)
    const runs = await api().get(`/api/v1/sites/${cobalt}/studies/${s.body.id}/runs`).set(eng)
    expect(runs.body).toHaveLength(0)
  })
})

describe('study search settings are checked on write', () => {
  it('deeply nested arrays answer 400 with the field path', async () => {
    let nested: unknown = 0.5
    for (let i = 0; i < 3000; i++) nested = [nested]
    const res = await api()
      .post(`/api/v1/sites/${cobalt}/studies`)
      .set(await auth('engineer'))
      .send({ name: 'Nested', inputs: ethanolCase, search: { traySpacings: nested } })
    expectErrorShape(res, 400)
    expect(res.body.error.details[0].path).toMatch(/^body\.search\.traySpacings/)
  })

  it('settings outside the optimiser schema answer 400 on create and on edit', async () => {
    const eng = await auth('engineer')
    const bad = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Bad search', inputs: ethanolCase, search: { curvePoints: 1e6 } })
    expectErrorShape(bad, 400)
    expect(bad.body.error.details[0].path).toBe('body.search.curvePoints')
    const ok = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Good search', inputs: ethanolCase, search: { curvePoints: 11 } })
    expect(ok.status).toBe(201)
    const edit = await api().put(`/api/v1/sites/${cobalt}/studies/${ok.body.id}`).set(eng).send({ search: { recovery: { min: 0.99, max: 0.5 } }, lockVersion: ok.body.lockVersion })
    expectErrorShape(edit, 400)
  })
})

describe('paths', () => {
  it('a malformed percent-encoding answers 400, signed in or not', async () => {
    const path = `/api/v1/sites/${cobalt}/studies/%E0%A4%A`
    expectErrorShape(await api().get(path), 400)
    expectErrorShape(await api().get(path).set(await auth('engineer')), 400)
    expectErrorShape(await api().put(path).set(await auth('engineer')).send({}), 400)
  })
})

describe('solvent allocation', () => {
  it('non-physical magnitudes answer 400 naming the field', async () => {
    const eng = await auth('engineer')
    const studies = await api().get(`/api/v1/sites/${cobalt}/studies`).set(eng)
    const studyId = studies.body.items[0].id as number
    const res = await api()
      .post(`/api/v1/sites/${cobalt}/allocations/solve`)
      .set(eng)
      .send({ supplyLimit: 50, units: [{ studyId, maxFlow: 1.7976931348623157e308 }] })
    expectErrorShape(res, 400)
    expect(res.body.error.details[0].path).toBe('body.units.0.maxFlow')
    const low = await api()
      .post(`/api/v1/sites/${cobalt}/allocations/solve`)
      .set(eng)
      .send({ supplyLimit: 50, units: [{ studyId, minFlow: 1e300 }] })
    expectErrorShape(low, 400)
    expect(low.body.error.details[0].path).toBe('body.units.0.minFlow')
  })
})

describe('first opens of a study at the same moment', () => {
  it('20 simultaneous first opens by one person all answer 200 and leave one view record', async () => {
    const eng = await auth('engineer')
    const s = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: `Opened at once ${Date.now()}`, inputs: ethanolCase })
    const rev = await auth('reviewer')
    const answers = await Promise.all(Array.from({ length: 20 }, () => api().get(`/api/v1/sites/${cobalt}/studies/${s.body.id}`).set(rev)))
    expect(answers.map((a) => a.status)).toEqual(Array.from({ length: 20 }, () => 200))
    const me = await api().get('/api/v1/auth/me').set(rev)
    expect(await StudyView.count({ where: { studyId: s.body.id, userId: me.body.id } })).toBe(1)
  })
})
