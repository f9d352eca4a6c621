import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import fc from 'fast-check'
import { readFileSync } from 'node:fs'
import { api, tokenFor, siteIds, type Person } from '../helpers.ts'

/**
 * Generated bad input against the write routes: JSON bodies (a valid body with one field replaced
 * by something hostile, or anything at all), CSV files and raw multipart bodies, and paths with
 * odd segments. Every answer must be a 2xx, or a 4xx in the documented error shape; never a 5xx;
 * a design answer carries no null where a number belongs. Counts are printed at the end.
 */
const demo = JSON.parse(readFileSync('data/demo-studies.json', 'utf8')) as { studies: { inputs: Record<string, unknown> }[] }
const ethanolCase = demo.studies[0]!.inputs

const RUNS = { bodies: 2400, files: 1300, paths: 1300 }
const tally = { requests: 0, s2xx: 0, s4xx: 0, s5xx: 0, other: 0 }
const failures: string[] = []

let cobalt = 0
let studyId = 0
let approvedId = 0
let draftBasisId = 0
const tokens = new Map<Person, string>()

beforeAll(async () => {
  cobalt = (await siteIds()).cobalt
  for (const p of ['engineer', 'economist', 'reviewer', 'admin'] as Person[]) tokens.set(p, await tokenFor(p))
  const eng = { Authorization: `Bearer ${tokens.get('engineer')}` }
  const s = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Fuzz target', inputs: ethanolCase })
  studyId = s.body.id
  // An approved study for the operating log.
  const a = await api().post(`/api/v1/sites/${cobalt}/studies`).set(eng).send({ name: 'Fuzz approved', inputs: ethanolCase })
  const run = await api().post(`/api/v1/sites/${cobalt}/studies/${a.body.id}/runs`).set(eng).send({ kind: 'design' })
  const opt = await api().post(`/api/v1/sites/${cobalt}/studies/${a.body.id}/options`).set(eng).send({ runId: run.body.id, name: 'Base' })
  await api().post(`/api/v1/sites/${cobalt}/studies/${a.body.id}/submit`).set(eng).send({ recommendedOptionId: opt.body.id })
  await api().post(`/api/v1/sites/${cobalt}/studies/${a.body.id}/approve`).set({ Authorization: `Bearer ${tokens.get('reviewer')}` }).send({})
  approvedId = a.body.id
  const econ = { Authorization: `Bearer ${tokens.get('economist')}` }
  const d = await api().post(`/api/v1/sites/${cobalt}/cost-bases`).set(econ).send({ name: 'Fuzz draft' })
  draftBasisId = d.body.id ?? (await api().get(`/api/v1/sites/${cobalt}/cost-bases`).set(econ)).body.find((b: { status: string }) => b.status === 'draft')?.id ?? 0
}, 60_000)

afterAll(() => {
  console.log(`fuzz: ${tally.requests} requests, ${tally.s2xx} 2xx, ${tally.s4xx} 4xx, ${tally.s5xx} 5xx${tally.other ? `, ${tally.other} other` : ''}`)
})

function hasNull(v: unknown): boolean {
  if (v === null) return true
  if (Array.isArray(v)) return v.some(hasNull)
  if (typeof v === 'object' && v !== null) return Object.values(v).some(hasNull)
  return false
}

/** In a design answer (or a stored run, or a batch), the summary numbers and the TAC are all numbers. */
function designNumbersOk(body: unknown): boolean {
  const items = Array.isArray(body) ? body : [body]
  return items.every((item) => {
    const d = ((item as { result?: unknown })?.result ?? item) as { summary?: unknown; totalAnnualCost?: unknown }
    if (!d || typeof d !== 'object' || !('summary' in d)) return false
    if (hasNull(d.summary)) return false
    return d.totalAnnualCost === undefined || (typeof d.totalAnnualCost === 'number' && Number.isFinite(d.totalAnnualCost))
  })
}

function check(label: string, res: { status: number; body: unknown; headers: Record<string, string> }, designAnswer = false): boolean {
  tally.requests++
  const s = res.status
  if (s >= 500) tally.s5xx++
  else if (s >= 400) tally.s4xx++
  else if (s >= 200 && s < 300) tally.s2xx++
  else tally.other++
  let ok = s < 500 && (s < 300 || s >= 400)
  if (s >= 400 && s < 500) {
    const e = (res.body as { error?: { code?: unknown; message?: unknown; details?: unknown; requestId?: unknown } } | null)?.error
    ok = ok && !!e && typeof e.code === 'string' && typeof e.message === 'string' && Array.isArray(e.details) && typeof e.requestId === 'string'
  }
  if (s >= 200 && s < 300 && designAnswer) ok = ok && designNumbersOk(res.body)
  if (!ok && failures.length < 5) failures.push(`${label} -> ${s} ${JSON.stringify(res.body).slice(0, 300)}`)
  return ok
}

// Hostile values for one field.
const nasty: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom(1e9, 1e308, -1e308, 1.7976931348623157e308, 5e-324, -1, 0, -0, 1e-300, '', 'NaN', 'Infinity', '1e999', null, [], {}, true, false, '0x10', ' 42 '),
  fc.double(),
  fc.integer(),
  fc.string({ maxLength: 40 }),
  fc.jsonValue({ maxDepth: 3 }),
  fc.integer({ min: 50, max: 400 }).map((n) => {
    let v: unknown = 1
    for (let i = 0; i < n; i++) v = [v]
    return v
  }),
)

function paths(o: unknown, prefix: string[] = []): string[][] {
  if (o && typeof o === 'object') {
    const out: string[][] = [prefix]
    for (const [k, v] of Object.entries(o)) out.push(...paths(v, [...prefix, k]))
    return out
  }
  return [prefix]
}

function replaced(o: unknown, path: string[], value: unknown): unknown {
  if (!path.length) return value
  const [head, ...rest] = path
  const copy: Record<string, unknown> = Array.isArray(o) ? ([...o] as unknown as Record<string, unknown>) : { ...(o as Record<string, unknown>) }
  copy[head!] = replaced(copy[head!], rest, value)
  return copy
}

/** A valid template with one field (or the whole body) replaced by a hostile value. */
function mutate(template: Record<string, unknown>): fc.Arbitrary<unknown> {
  const all = paths(template)
  return fc.oneof(
    { weight: 6, arbitrary: fc.tuple(fc.constantFrom(...all), nasty).map(([p, v]) => replaced(template, p, v)) },
    { weight: 1, arbitrary: fc.tuple(fc.constantFrom(...all), nasty, fc.constantFrom(...all), nasty).map(([p, v, q, w]) => replaced(replaced(template, p, v), q, w)) },
    { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 4 }) },
  )
}

interface Target {
  method: 'post' | 'put' | 'patch'
  path: () => string
  who: Person
  template: () => Record<string, unknown>
  design?: boolean
}

const targets: Target[] = [
  { method: 'post', path: () => '/api/v1/designs/evaluate', who: 'engineer', template: () => ({ case: ethanolCase, siteId: cobalt }), design: true },
  { method: 'post', path: () => `/api/v1/sites/${cobalt}/studies`, who: 'engineer', template: () => ({ name: 'Fuzzed', description: '', inputs: ethanolCase, search: { curvePoints: 5, sensitivity: false } }) },
  { method: 'put', path: () => `/api/v1/sites/${cobalt}/studies/${studyId}`, who: 'engineer', template: () => ({ name: 'Fuzz target', inputs: ethanolCase, search: { curvePoints: 5 }, lockVersion: 0 }) },
  { method: 'post', path: () => `/api/v1/sites/${cobalt}/studies/${studyId}/comments`, who: 'reviewer', template: () => ({ body: 'A comment' }) },
  { method: 'post', path: () => `/api/v1/sites/${cobalt}/studies/${approvedId}/operating-entries`, who: 'engineer', template: () => ({ month: '2030-01', gasFlow: 400, solventFlow: 300, recovery: 0.95, powerKw: 20, notes: '' }) },
  { method: 'post', path: () => `/api/v1/sites/${cobalt}/allocations/solve`, who: 'engineer', template: () => ({ supplyLimit: 50, units: [{ studyId: approvedId, minFlow: 1, maxFlow: 40 }] }) },
  { method: 'put', path: () => `/api/v1/sites/${cobalt}/cost-bases/${draftBasisId}`, who: 'economist', template: () => ({ notes: 'n', lockVersion: 0 }) },
  { method: 'post', path: () => `/api/v1/sites/${cobalt}/quotes/fit`, who: 'economist', template: () => ({ equipmentType: 'tray', sizeBasis: 'diameter' }) },
  { method: 'patch', path: () => '/api/v1/auth/me', who: 'reviewer', template: () => ({ unitSystem: 'SI' }) },
  { method: 'post', path: () => `/api/v1/sites/${cobalt}/studies/${studyId}/runs`, who: 'engineer', template: () => ({ kind: 'design' }), design: true },
]

describe('fuzzing the write routes', () => {
  it(`${RUNS.bodies} generated JSON bodies: 2xx or a documented 4xx, never a 5xx`, async () => {
    const arb = fc.integer({ min: 0, max: targets.length - 1 }).chain((i) => mutate(targets[i]!.template()).map((body) => ({ i, body })))
    await fc.assert(
      fc.asyncProperty(arb, async ({ i, body }) => {
        const t = targets[i]!
        const res = await api()[t.method](t.path()).set('Authorization', `Bearer ${tokens.get(t.who)}`).set('Content-Type', 'application/json').send(JSON.stringify(body) ?? 'null')
        return check(`${t.method} ${t.path()} ${JSON.stringify(body).slice(0, 200)}`, res, t.design === true)
      }),
      { numRuns: RUNS.bodies },
    )
    expect(failures).toEqual([])
  }, 600_000)

  it(`${RUNS.files} generated files and multipart bodies on the upload routes`, async () => {
    const uploads: { path: () => string; who: Person }[] = [
      { path: () => `/api/v1/sites/${cobalt}/uploads/equilibrium/preview`, who: 'engineer' },
      { path: () => `/api/v1/sites/${cobalt}/uploads/equilibrium`, who: 'engineer' },
      { path: () => `/api/v1/sites/${cobalt}/uploads/quotes/preview`, who: 'economist' },
      { path: () => `/api/v1/sites/${cobalt}/uploads/quotes`, who: 'economist' },
      { path: () => `/api/v1/sites/${cobalt}/studies/${approvedId}/operating-entries/import`, who: 'engineer' },
    ]
    const cell = fc.oneof(
      fc.double({ noNaN: false }).map(String),
      fc.integer().map(String),
      fc.constantFrom('', ' ', '"', '""', '"a,b"', 'NaN', '1e999', '-0', '2031-01', '2031-13', 'x', 'tray', 'diameter', '=1+1', '\t', '0.5'),
      fc.string({ maxLength: 12 }),
    )
    const headers = fc.constantFrom('x,y', 'x,y,temperature', 'month,gasFlow,solventFlow', 'month,gasFlow,solventFlow,recovery,powerKw,notes', 'equipmentType,size,cost,year', '', 'a;b;c')
    const csv = fc.tuple(headers, fc.array(fc.array(cell, { minLength: 0, maxLength: 6 }), { maxLength: 12 }), fc.constantFrom('\n', '\r\n', '\r'), fc.boolean())
      .map(([h, rows, eol, bom]) => (bom ? '\uFEFF' : '') + [h, ...rows.map((r) => r.join(','))].join(eol))
    const filename = fc.oneof(fc.constantFrom('data.csv', 'd.CSV', 'x.txt', 'a.exe', 'da\r\nta.csv', 'q"uote.csv', '../../etc/passwd.csv', 'ü.csv', ''), fc.string({ maxLength: 20 }).map((s) => `${s}.csv`))
    const kind = fc.constantFrom('attach', 'cut', 'boundary', 'noBoundary', 'json')
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 0, max: uploads.length - 1 }), csv, filename, kind, fc.nat(400), async (u, text, name, k, cutAt) => {
        const target = uploads[u]!
        const req = api().post(target.path()).set('Authorization', `Bearer ${tokens.get(target.who)}`)
        let res
        if (k === 'attach' && !/[\r\n"]/.test(name)) {
          res = await req.attach('file', Buffer.from(text, 'utf8'), { filename: name || 'blank', contentType: 'text/csv' })
        } else if (k === 'json') {
          res = await req.send({ file: text })
        } else {
          const b = 'fuzzBoundary42'
          const whole = `--${b}\r\nContent-Disposition: form-data; name="file"; filename="${name}"\r\nContent-Type: text/csv\r\n\r\n${text}\r\n--${b}--\r\n`
          const body = k === 'cut' ? whole.slice(0, Math.min(cutAt, whole.length)) : whole
          const ct = k === 'boundary' ? 'multipart/form-data; boundary=another' : k === 'noBoundary' ? 'multipart/form-data' : `multipart/form-data; boundary=${b}`
          res = await req.set('Content-Type', ct).send(body)
        }
        return check(`upload ${k} ${target.path()} ${JSON.stringify(name)} ${JSON.stringify(text).slice(0, 120)}`, res)
      }),
      { numRuns: RUNS.files },
    )
    expect(failures).toEqual([])
  }, 600_000)

  it(`${RUNS.paths} generated paths, signed in and not`, async () => {
    const segment = fc.oneof(
      fc.constantFrom('%', '%E0%A4%A', '%ZZ', '%00', '%2F', '..', '.', '-1', '0', '1e3', '99999999999999999999', 'NaN', ' ', '%20', '%C0%AF', '%FF'),
      fc.integer().map(String),
      fc.string({ maxLength: 10 }).map((s) => encodeURIComponent(s)),
      fc.constant('ID'),
    )
    const shapes = [
      (a: string, b: string) => `/api/v1/sites/${a}/studies/${b}`,
      (a: string, b: string) => `/api/v1/sites/${a}/studies/${b}/runs`,
      (a: string, b: string) => `/api/v1/sites/${a}/members/${b}`,
      (a: string, b: string) => `/api/v1/sites/${a}/cost-bases/${b}`,
      (a: string, b: string) => `/api/v1/sites/${a}/studies/${b}/operating-entries/${a}`,
      (a: string, b: string) => `/api/v1/sites/${a}/quotes/${b}`,
      (a: string, b: string) => `/api/v1/${a}/${b}`,
    ]
    await fc.assert(
      fc.asyncProperty(
        fc.integer({ min: 0, max: shapes.length - 1 }), segment, segment, fc.constantFrom('get', 'put', 'post', 'delete'), fc.boolean(),
        async (shape, s1, s2, method, signedIn) => {
          const a = s1 === 'ID' ? String(cobalt) : s1
          const b = s2 === 'ID' ? String(studyId) : s2
          const p = shapes[shape]!(a, b)
          let req = api()[method as 'get'](p)
          if (signedIn) req = req.set('Authorization', `Bearer ${tokens.get('reviewer')}`)
          const res = method === 'get' ? await req : await req.send({})
          return check(`${method} ${p}`, res)
        },
      ),
      { numRuns: RUNS.paths },
    )
    expect(failures).toEqual([])
  }, 600_000)
})
