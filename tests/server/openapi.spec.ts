import { describe, it, expect } from 'vitest'
import { Validator } from '@seriousme/openapi-schema-validator'
import { ZodType } from 'zod'
import { api, siteIds, tokenFor } from './helpers.ts'
import { routeTable } from '../../server/routes/define.ts'
import { openApiPath } from '../../server/openapi.ts'

type Doc = { openapi: string; paths: Record<string, Record<string, { responses: Record<string, unknown>; security?: unknown[] }>>; components: { schemas: Record<string, unknown> } }

describe('the OpenAPI description', () => {
  it('is served without signing in and is a valid OpenAPI 3.1 document (checked by an OpenAPI schema validator)', async () => {
    const r = await api().get('/api/v1/openapi.json')
    expect(r.status).toBe(200)
    const doc = r.body as Doc
    expect(doc.openapi).toBe('3.1.0')
    const result = await new Validator().validate(doc as unknown as Record<string, unknown>)
    expect(result.errors ?? []).toEqual([])
    expect(result.valid).toBe(true)
  })

  it('lists every declared route, with its method, and nothing else', async () => {
    const doc = (await api().get('/api/v1/openapi.json')).body as Doc
    const declared = new Set(routeTable.map((rt) => `${rt.method} ${openApiPath(rt.path)}`))
    const documented = new Set(Object.entries(doc.paths).flatMap(([p, ops]) => Object.keys(ops).map((m) => `${m} ${p}`)))
    expect([...declared].filter((k) => !documented.has(k))).toEqual([])
    expect([...documented].filter((k) => !declared.has(k))).toEqual([])
    expect(declared.size).toBeGreaterThan(50)
  })

  it('every route in the route table documents its answer: a zod schema, a file, or no body (204)', () => {
    const undocumented = routeTable
      .filter((rt) => !(rt.status === 204 || rt.method === 'delete' || rt.doc?.response instanceof ZodType || rt.doc?.response === 'pdf' || rt.doc?.response === 'xlsx'))
      .map((rt) => `${rt.method} ${rt.path}`)
    expect(undocumented).toEqual([])
  })

  it('every JSON answer in the document points at a schema, and real answers validate against the same zod schemas', async () => {
    const doc = (await api().get('/api/v1/openapi.json')).body as Doc
    const empty = Object.entries(doc.paths).flatMap(([p, ops]) =>
      Object.entries(ops).flatMap(([m, op]) =>
        Object.entries(op.responses)
          .filter(([code, r]) => code.startsWith('2') && code !== '204' && JSON.stringify((r as { content?: unknown }).content ?? {}).includes('"schema":{}'))
          .map(([code]) => `${m} ${p} ${code}`),
      ),
    )
    expect(empty).toEqual([])
    // a few real answers, each parsed with the zod schema its route documents (tests/server/answers.ts
    // does the same for every answer of every API test file)
    const auth = { Authorization: `Bearer ${await tokenFor('admin')}` }
    const { cobalt } = await siteIds()
    for (const [path, route] of [
      [`/api/v1/sites/${cobalt}/studies`, '/sites/:siteId/studies'],
      [`/api/v1/sites/${cobalt}/cost-bases`, '/sites/:siteId/cost-bases'],
      ['/api/v1/auth/me', '/auth/me'],
      [`/api/v1/sites/${cobalt}/members`, '/sites/:siteId/members'],
    ] as const) {
      const r = await api().get(path).set(auth)
      expect(r.status, path).toBe(200)
      const schema = routeTable.find((rt) => rt.method === 'get' && rt.path === route)!.doc!.response as ZodType
      const parsed = schema.safeParse(r.body)
      expect(parsed.success, `${route}: ${parsed.error?.message ?? ''}`).toBe(true)
    }
    // and a wrong answer is refused, so the check can fail
    const studies = routeTable.find((rt) => rt.method === 'get' && rt.path === '/sites/:siteId/studies')!.doc!.response as ZodType
    expect(studies.safeParse({ items: [{ id: 'one' }], total: 1 }).success).toBe(false)
  })

  it('describes the design and optimisation answers with the shared schemas', async () => {
    const doc = (await api().get('/api/v1/openapi.json')).body as Doc
    for (const name of ['PricedDesign', 'OptimisationResult', 'DesignSummary', 'CheckResult', 'StoredRun', 'ErrorBody']) {
      expect(doc.components.schemas[name], name).toBeDefined()
    }
    expect(JSON.stringify(doc.paths['/designs/optimize']!.post!.responses['200'])).toContain('#/components/schemas/OptimisationResult')
    expect(doc.paths['/auth/login']!.post!.security).toEqual([])
  })

  it('the answer of a design matches what the document promises', async () => {
    const auth = { Authorization: `Bearer ${await tokenFor('engineer')}` }
    const demo = (await import('../../data/demo-studies.json', { with: { type: 'json' } })).default
    const r = await api().post('/api/v1/designs/evaluate').set(auth).send({ case: demo.studies[0]!.inputs, costBasis: { preset: 'halvard-cobalt-ridge' } })
    expect(r.status).toBe(200)
    const { pricedDesignSchema } = await import('../../shared/schemas/results.ts')
    expect(pricedDesignSchema.safeParse(r.body).success).toBe(true)
  })

  it('the API reference page and its assets are served locally', async () => {
    const redirect = await api().get('/api/v1/docs')
    expect(redirect.status).toBe(301)
    const page = await api().get('/api/v1/docs/')
    expect(page.status).toBe(200)
    expect(page.text).toContain('Scrubwright API reference')
    expect(page.text).not.toMatch(/https?:\/\//)
    const js = await api().get('/api/v1/docs/swagger-ui-bundle.js')
    expect(js.status).toBe(200)
    expect(js.headers['content-type']).toContain('javascript')
    expect((await api().get('/api/v1/docs/reference-init.js')).text).toContain('../openapi.json')
  })
})
