import { describe, it, expect, beforeAll } from 'vitest'
import { readFileSync } from 'node:fs'
import { api, tokenFor, siteIds, type Person } from './helpers.ts'
import { VendorQuote, SiteComponent, AuditEntry } from '../../server/db/models/index.ts'
import { config } from '../../server/config.ts'

const demo = JSON.parse(readFileSync('data/demo-studies.json', 'utf8')) as { studies: { inputs: Record<string, unknown> }[] }
const ethanolCase = demo.studies[0]!.inputs

let cobalt = 0
beforeAll(async () => {
  cobalt = (await siteIds()).cobalt
})

const auth = async (who: Person) => ({ Authorization: `Bearer ${await tokenFor(who)}` })

interface Issue { line: number | null; column: string | null; message: string }

async function preview(kind: 'equilibrium' | 'quotes', text: string | Buffer, who: Person = kind === 'quotes' ? 'economist' : 'engineer', filename = 'data.csv') {
  return api()
    .post(`/api/v1/sites/${cobalt}/uploads/${kind}/preview`)
    .set(await auth(who))
    .attach('file', Buffer.isBuffer(text) ? text : Buffer.from(text, 'utf8'), { filename, contentType: 'text/csv' })
}

function issuesAt(list: Issue[], line: number): Issue[] {
  return list.filter((e) => e.line === line)
}

describe('equilibrium CSV preview: line-numbered checks', () => {
  it('reads a clean file with a byte-order mark, CRLF line ends, quoted fields and a blank trailing line', async () => {
    const text = '\uFEFFx,y,temperature\r\n0,0,30\r\n"0.01","0.0062",30\r\n0.02,0.0121,30\r\n0.04,0.0235,30\r\n\r\n'
    const r = await preview('equilibrium', text)
    expect(r.status).toBe(200)
    expect(r.body.errors).toEqual([])
    expect(r.body.points).toEqual([[0, 0], [0.01, 0.0062], [0.02, 0.0121], [0.04, 0.0235]])
    expect(r.body.temperature).toBe(30)
  })

  it('ignores extra columns with a warning', async () => {
    const r = await preview('equilibrium', 'x,y,source\n0,0,lab\n0.01,0.006,lab\n0.02,0.012,lab\n')
    expect(r.body.errors).toEqual([])
    expect(r.body.points).toHaveLength(3)
    expect(r.body.warnings[0].line).toBe(1)
    expect(r.body.warnings[0].message).toMatch(/Extra columns ignored: 'source'/)
  })

  it('reports a missing header on line 1', async () => {
    const r = await preview('equilibrium', '0,0\n0.01,0.006\n0.02,0.012\n')
    expect(r.status).toBe(200)
    expect(r.body.errors).toHaveLength(1)
    expect(r.body.errors[0].line).toBe(1)
    expect(r.body.errors[0].message).toMatch(/header line is missing/)
  })

  it('names the line and column of non-numeric, out-of-range, unsorted and duplicated points', async () => {
    const text = [
      'x,y', // 1
      '0,0', // 2
      '0.01,abc', // 3 non-numeric y
      '1.2,0.5', // 4 x out of range
      '0.02,0.012', // 5 fine
      '0.015,0.01', // 6 unsorted
      '0.02,0.012', // 7 duplicate of line 5
      '0.03,-0.1', // 8 y out of range
      '0.04,0.02', // 9 fine
    ].join('\n')
    const r = await preview('equilibrium', text)
    const errors = r.body.errors as Issue[]
    expect(issuesAt(errors, 3)).toEqual([expect.objectContaining({ column: 'y', message: expect.stringMatching(/not a number/) })])
    expect(issuesAt(errors, 4)).toEqual([expect.objectContaining({ column: 'x', message: expect.stringMatching(/outside \[0, 1\)/) })])
    expect(issuesAt(errors, 6)).toEqual([expect.objectContaining({ column: 'x', message: expect.stringMatching(/must increase strictly/) })])
    expect(issuesAt(errors, 7)).toEqual([expect.objectContaining({ message: expect.stringMatching(/duplicates the point on line 5/) })])
    expect(issuesAt(errors, 8)).toEqual([expect.objectContaining({ column: 'y', message: expect.stringMatching(/outside \[0, 1\)/) })])
    expect(issuesAt(errors, 2)).toEqual([])
    expect(issuesAt(errors, 5)).toEqual([])
    expect(issuesAt(errors, 9)).toEqual([])
    expect(errors.map((e) => e.line)).toEqual([3, 4, 6, 7, 8])
  })

  it('counts lines in the file, also when a quoted field spans two lines', async () => {
    // Line 3 holds a quoted field with a line break, so the next record starts on line 5.
    const text = 'x,y,note\n0,0,a\n0.01,0.006,"two\nlines"\n0.005,0.003,b\n'
    const r = await preview('equilibrium', text)
    expect(r.body.errors).toEqual([expect.objectContaining({ line: 5, column: 'x' })])
  })

  it('refuses too few points and y that does not rise with x', async () => {
    const few = await preview('equilibrium', 'x,y\n0,0\n0.01,0.006\n')
    expect(few.body.errors).toEqual([expect.objectContaining({ line: null, message: expect.stringMatching(/at least 3 points; the file has 2/) })])
    const flat = await preview('equilibrium', 'x,y\n0,0\n0.01,0.006\n0.02,0.006\n')
    expect(flat.body.errors).toEqual([expect.objectContaining({ line: 4, column: 'y' })])
  })

  it('refuses more than 500 data rows', async () => {
    const rows = Array.from({ length: 501 }, (_, i) => `${(i / 1000).toFixed(3)},${(i / 2000).toFixed(4)}`)
    const r = await preview('equilibrium', `x,y\n${rows.join('\n')}\n`)
    expect(r.body.errors.some((e: Issue) => /more than 500 data rows/.test(e.message))).toBe(true)
  })
})

describe('equilibrium upload: save, list and use in a design', () => {
  it('a file with one bad line saves nothing and answers 400 with file:line details', async () => {
    const before = await SiteComponent.count({ where: { siteId: cobalt, kind: 'equilibriumTable' } })
    const r = await api()
      .post(`/api/v1/sites/${cobalt}/uploads/equilibrium`)
      .set(await auth('engineer'))
      .attach('file', Buffer.from('x,y\n0,0\n0.01,0.006\n0.02,x\n0.03,0.018\n'), { filename: 'bad.csv', contentType: 'text/csv' })
    expect(r.status).toBe(400)
    expect(r.body.error.code).toBe('validation_failed')
    expect(r.body.error.details).toEqual([{ path: 'file:line 4', message: "y: 'x' is not a number" }])
    expect(typeof r.body.error.requestId).toBe('string')
    expect(await SiteComponent.count({ where: { siteId: cobalt, kind: 'equilibriumTable' } })).toBe(before)
  })

  it('saves a table with an audit entry, lists it, and the design engine accepts it as a table model', async () => {
    const file = readFileSync('data/examples/cobalt-ridge-ethanol-water-30C.csv')
    const r = await api()
      .post(`/api/v1/sites/${cobalt}/uploads/equilibrium`)
      .set(await auth('engineer'))
      .field('name', 'Ethanol-water, 30 degC (lab)')
      .field('solute', 'ethanol')
      .attach('file', file, { filename: 'cobalt-ridge-ethanol-water-30C.csv', contentType: 'text/csv' })
    expect(r.status).toBe(201)
    expect(r.body.name).toBe('Ethanol-water, 30 degC (lab)')
    expect(r.body.solute).toBe('ethanol')
    expect(r.body.temperature).toBe(30)
    expect(r.body.points).toHaveLength(10)
    expect(r.body.points[3]).toEqual([0.01, 0.006017])
    expect(r.body.source).toMatch(/cobalt-ridge-ethanol-water-30C\.csv, uploaded by /)
    const a = await AuditEntry.findOne({ where: { action: 'upload_equilibrium', entityId: String(r.body.id) } })
    expect(a).not.toBeNull()

    const list = await api().get(`/api/v1/sites/${cobalt}/equilibrium-tables`).set(await auth('reviewer'))
    expect(list.status).toBe(200)
    const mine = list.body.find((t: { id: number }) => t.id === r.body.id)
    expect(mine.equilibrium).toEqual({ model: 'table', points: r.body.points })

    const d = await api().post('/api/v1/designs/evaluate').set(await auth('engineer')).send({ case: { ...ethanolCase, equilibrium: mine.equilibrium } })
    expect(d.status).toBe(200)
    expect(d.body.summary.actualTrays).toBeGreaterThan(0)
  })

  it('a straight-line table gives the same minimum solvent as constant K with the same slope', async () => {
    // Consistency of two equilibrium models: y = K x tabulated must behave as y = K x (K = 0.62).
    const lines = ['x,y', ...[0, 0.005, 0.01, 0.02, 0.03, 0.04, 0.06].map((x) => `${x},${(0.62 * x).toFixed(6)}`)]
    const p = await preview('equilibrium', lines.join('\n'))
    expect(p.body.errors).toEqual([])
    const base = { ...ethanolCase, method: 'stageByStage' }
    const table = await api().post('/api/v1/designs/evaluate').set(await auth('engineer')).send({ case: { ...base, equilibrium: { model: 'table', points: p.body.points } } })
    const constK = await api().post('/api/v1/designs/evaluate').set(await auth('engineer')).send({ case: { ...base, equilibrium: { model: 'constantK', K: 0.62 } } })
    expect(table.status).toBe(200)
    expect(constK.status).toBe(200)
    expect(table.body.summary.minimumSolventFlow).toBeCloseTo(constK.body.summary.minimumSolventFlow, 3)
    expect(table.body.summary.theoreticalStages).toBeCloseTo(constK.body.summary.theoreticalStages, 2)
  })
})

describe('upload limits and roles', () => {
  it('answers 413 with the error shape for a file over the upload limit', async () => {
    const big = Buffer.alloc(config.UPLOAD_LIMIT_BYTES + 10, 'a')
    const r = await preview('equilibrium', big)
    expect(r.status).toBe(413)
    expect(r.body.error.code).toBe('payload_too_large')
    expect(r.body.error.message).toMatch(/upload limit/)
    expect(r.body.error.details[0].path).toBe('file')
  })

  it('answers 400 for a file that is not CSV, and for no file at all', async () => {
    const wrong = await api()
      .post(`/api/v1/sites/${cobalt}/uploads/equilibrium/preview`)
      .set(await auth('engineer'))
      .attach('file', Buffer.from('PK\u0003\u0004'), { filename: 'data.xlsx', contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet' })
    expect(wrong.status).toBe(400)
    expect(wrong.body.error.code).toBe('unsupported_file_type')
    const none = await api().post(`/api/v1/sites/${cobalt}/uploads/equilibrium/preview`).set(await auth('engineer')).field('name', 'x')
    expect(none.status).toBe(400)
    expect(none.body.error.details[0].path).toBe('file')
  })

  it('reviewers and non-members cannot upload; economists may check but not save an equilibrium table', async () => {
    const ok = 'x,y\n0,0\n0.01,0.006\n0.02,0.012\n'
    expect((await preview('equilibrium', ok, 'reviewer')).status).toBe(403)
    expect((await preview('equilibrium', ok, 'bayEngineer')).status).toBe(403)
    expect((await preview('quotes', ok, 'reviewer')).status).toBe(403)
    expect((await preview('quotes', ok, 'engineer')).status).toBe(403)
    expect((await preview('equilibrium', ok, 'economist')).status).toBe(200)
    const save = await api()
      .post(`/api/v1/sites/${cobalt}/uploads/equilibrium`)
      .set(await auth('economist'))
      .attach('file', Buffer.from(ok), { filename: 'eq.csv', contentType: 'text/csv' })
    expect(save.status).toBe(403)
  })
})

describe('vendor quotes', () => {
  const HEADER = 'equipmentType,size,sizeUnit,cost,currency,date,costIndex,vendor'

  it('names the line and column of each bad quote', async () => {
    const text = [
      HEADER, // 1
      'compressor,10,hp,9000,USD,2023-01-10,797.9,A', // 2 unknown type
      'blower,-5,hp,9000,USD,2023-01-10,797.9,A', // 3 non-positive size
      'blower,10,hp,9000,US$,2023-01-10,797.9,A', // 4 bad currency
      'blower,10,hp,9000,USD,2023-02-30,,A', // 5 impossible date
      'blower,10,hp,0,USD,,,A', // 6 zero cost, neither date nor index
      'blower,12,hp,11000,usd,2023-05-02,,B', // 7 fine (currency upper-cased)
    ].join('\n')
    const r = await preview('quotes', text)
    expect(r.status).toBe(200)
    const errors = r.body.errors as Issue[]
    expect(issuesAt(errors, 2)).toEqual([expect.objectContaining({ column: 'equipmentType', message: expect.stringMatching(/not an equipment type/) })])
    expect(issuesAt(errors, 3)).toEqual([expect.objectContaining({ column: 'size', message: expect.stringMatching(/must be positive/) })])
    expect(issuesAt(errors, 4)).toEqual([expect.objectContaining({ column: 'currency' })])
    expect(issuesAt(errors, 5)).toEqual([expect.objectContaining({ column: 'date' })])
    expect(issuesAt(errors, 6).map((e) => e.column)).toEqual(['cost', 'costIndex'])
    expect(issuesAt(errors, 7)).toEqual([])
    expect(r.body.quotes).toEqual([expect.objectContaining({ line: 7, equipmentType: 'blower', currency: 'USD', quoteDate: '2023-05-02', costIndex: null })])
  })

  it('needs the header columns', async () => {
    const r = await preview('quotes', 'equipmentType,size,cost\nblower,10,9000\n')
    expect(r.body.errors).toEqual([expect.objectContaining({ line: 1, message: expect.stringMatching(/lacks the columns sizeUnit, currency/) })])
    const noDate = await preview('quotes', 'equipmentType,size,sizeUnit,cost,currency\nblower,10,hp,9000,USD\n')
    expect(noDate.body.errors[0].message).toMatch(/date \(YYYY-MM-DD\) or a costIndex/)
  })

  it('saves all quotes or none', async () => {
    const before = await VendorQuote.count({ where: { siteId: cobalt } })
    const bad = await api()
      .post(`/api/v1/sites/${cobalt}/uploads/quotes`)
      .set(await auth('economist'))
      .attach('file', Buffer.from(`${HEADER}\nblower,10,hp,9000,USD,2023-01-10,797.9,A\nblower,20,hp,abc,USD,2023-01-10,797.9,A\n`), { filename: 'q.csv', contentType: 'text/csv' })
    expect(bad.status).toBe(400)
    expect(bad.body.error.details).toEqual([{ path: 'file:line 3', message: expect.stringMatching(/^cost: 'abc' is not a number/) }])
    expect(await VendorQuote.count({ where: { siteId: cobalt } })).toBe(before)
  })

  it('saves, lists, fits and adopts the fit into a draft cost basis', async () => {
    const econ = await auth('economist')
    const file = readFileSync('data/examples/cobalt-ridge-blower-quotes.csv')
    const saved = await api().post(`/api/v1/sites/${cobalt}/uploads/quotes`).set(econ).attach('file', file, { filename: 'cobalt-ridge-blower-quotes.csv', contentType: 'text/csv' })
    expect(saved.status).toBe(201)
    expect(saved.body.count).toBe(8)
    const ref = saved.body.uploadRef as string
    expect(await VendorQuote.count({ where: { uploadRef: ref } })).toBe(8)
    expect(await AuditEntry.count({ where: { action: 'upload_quotes', entityId: ref } })).toBe(1)

    const list = await api().get(`/api/v1/sites/${cobalt}/quotes?equipmentType=blower`).set(await auth('reviewer'))
    expect(list.status).toBe(200)
    expect(list.body.every((q: { equipmentType: string }) => q.equipmentType === 'blower')).toBe(true)
    expect(list.body.filter((q: { uploadRef: string }) => q.uploadRef === ref)).toHaveLength(8)

    const current = await api().get(`/api/v1/sites/${cobalt}/cost-bases/current`).set(econ)
    const targetIndex = current.body.data.general.targetIndex as number
    const fit = await api().post(`/api/v1/sites/${cobalt}/quotes/fit`).set(econ).send({ equipmentType: 'blower', form: 'power' })
    expect(fit.status).toBe(200)
    expect(fit.body.targetIndex).toBe(targetIndex)

    // Independent check: ordinary least squares of a straight line in closed form,
    // slope = Σ(X−X̄)(Y−Ȳ) / Σ(X−X̄)², with X = ln S, Y = ln(C · I_target / I_quote) over every blower quote in hp/USD.
    const quotes = (list.body as { size: number; sizeUnit: string; currency: string; cost: number; costIndex: number | null }[]).filter((q) => q.sizeUnit === 'hp' && q.currency === 'USD')
    const X = quotes.map((q) => Math.log(q.size))
    const Y = quotes.map((q) => Math.log(q.costIndex ? (q.cost * targetIndex) / q.costIndex : q.cost))
    const mx = X.reduce((s, v) => s + v, 0) / X.length
    const my = Y.reduce((s, v) => s + v, 0) / Y.length
    const slope = X.reduce((s, x, i) => s + (x - mx) * (Y[i]! - my), 0) / X.reduce((s, x) => s + (x - mx) ** 2, 0)
    expect(fit.body.n).toBe(quotes.length)
    expect(fit.body.coefficients[1]).toBeCloseTo(slope, 9)
    expect(fit.body.coefficients[0]).toBeCloseTo(my - slope * mx, 9)
    expect(fit.body.r2).toBeGreaterThan(0.9)
    expect(fit.body.r2).toBeLessThanOrEqual(1)
    expect(fit.body.points).toHaveLength(quotes.length)
    expect(fit.body.line.length).toBeGreaterThan(10)
    // The basis curve at the same size, escalated to the same index, is there for comparison.
    expect(fit.body.points[0].basisCost).toBeGreaterThan(0)
    expect(fit.body.curve).toMatchObject({ logBase: current.body.data.correlations.blower.curve.logBase, multiplier: 1, linearCoefficient: 0, sizeUnit: 'hp', baseIndex: targetIndex })

    // Adopt into a fresh draft.
    for (const v of (await api().get(`/api/v1/sites/${cobalt}/cost-bases`).set(econ)).body.filter((x: { status: string }) => x.status === 'draft')) {
      await api().delete(`/api/v1/sites/${cobalt}/cost-bases/${v.id}`).set(econ)
    }
    const draft = await api().post(`/api/v1/sites/${cobalt}/cost-bases`).set(econ).send({})
    expect(draft.status).toBe(201)
    const adopt = await api().post(`/api/v1/sites/${cobalt}/cost-bases/${draft.body.id}/adopt-fit`).set(econ).send({ ...fit.body.adopt, lockVersion: draft.body.lockVersion })
    expect(adopt.status).toBe(200)
    expect(adopt.body.lockVersion).toBe(draft.body.lockVersion + 1)
    expect(adopt.body.data.correlations.blower.curve).toEqual(fit.body.curve)
    expect(await AuditEntry.count({ where: { action: 'adopt_fit', entityId: String(draft.body.id) } })).toBe(1)
    const stale = await api().post(`/api/v1/sites/${cobalt}/cost-bases/${draft.body.id}/adopt-fit`).set(econ).send({ ...fit.body.adopt, lockVersion: draft.body.lockVersion })
    expect(stale.status).toBe(409)
    // The short form: coefficients only; the rest stays as in the draft's curve.
    const short = await api().post(`/api/v1/sites/${cobalt}/cost-bases/${draft.body.id}/adopt-fit`).set(econ).send({ equipmentType: 'blower', coefficients: [7, 0.8], lockVersion: adopt.body.lockVersion })
    expect(short.status).toBe(200)
    expect(short.body.data.correlations.blower.curve).toMatchObject({ coefficients: [7, 0.8], multiplier: 1, linearCoefficient: 0, sizeUnit: 'hp', sizeMin: fit.body.curve.sizeMin, logBase: fit.body.curve.logBase })
    const published = await api().post(`/api/v1/sites/${cobalt}/cost-bases/${current.body.id}/adopt-fit`).set(econ).send({ ...fit.body.adopt, lockVersion: current.body.lockVersion })
    expect(published.status).toBe(409)
    await api().delete(`/api/v1/sites/${cobalt}/cost-bases/${draft.body.id}`).set(econ)
  })

  it('refuses a fit with fewer than 3 quotes or no size spread (422 with a reason)', async () => {
    const econ = await auth('economist')
    await VendorQuote.destroy({ where: { siteId: cobalt, equipmentType: 'motor' } })
    const none = await api().post(`/api/v1/sites/${cobalt}/quotes/fit`).set(econ).send({ equipmentType: 'motor' })
    expect(none.status).toBe(422)
    expect(none.body.error.code).toBe('fit_not_possible')
    expect(none.body.error.message).toMatch(/at least 3 quotes/)
    const same = ['equipmentType,size,sizeUnit,cost,currency,costIndex', 'motor,10,hp,1200,USD,797.9', 'motor,10,hp,1300,USD,797.9', 'motor,10,hp,1250,USD,797.9'].join('\n')
    const saved = await api().post(`/api/v1/sites/${cobalt}/uploads/quotes`).set(econ).attach('file', Buffer.from(same), { filename: 'm.csv', contentType: 'text/csv' })
    expect(saved.status).toBe(201)
    const flat = await api().post(`/api/v1/sites/${cobalt}/quotes/fit`).set(econ).send({ equipmentType: 'motor' })
    expect(flat.status).toBe(422)
    expect(flat.body.error.details[0].code).toBe('noSizeSpread')
    const platforms = await api().post(`/api/v1/sites/${cobalt}/quotes/fit`).set(econ).send({ equipmentType: 'platforms' })
    expect(platforms.status).toBe(400)
  })

  it('deletes a quote (economist) and refuses reviewers', async () => {
    const econ = await auth('economist')
    const list = await api().get(`/api/v1/sites/${cobalt}/quotes?equipmentType=motor`).set(econ)
    const id = list.body[0].id as number
    expect((await api().delete(`/api/v1/sites/${cobalt}/quotes/${id}`).set(await auth('reviewer'))).status).toBe(403)
    expect((await api().delete(`/api/v1/sites/${cobalt}/quotes/${id}`).set(econ)).status).toBe(204)
    expect((await api().delete(`/api/v1/sites/${cobalt}/quotes/${id}`).set(econ)).status).toBe(404)
    expect(await AuditEntry.count({ where: { action: 'delete_quote', entityId: String(id) } })).toBe(1)
  })
})
