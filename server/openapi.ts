import { z, type ZodType } from 'zod'
import { routeTable, successStatus, type Access, type RouteSpec } from './routes/define.ts'
import { answerSchemas } from '../shared/schemas/results.ts'
import { errorBodySchema } from '../shared/schemas/common.ts'
import pkg from '../package.json' with { type: 'json' }

/**
 * The OpenAPI 3.1 description of /api/v1, generated from the route table (every route declared
 * with defineRoutes: method, path, access, summary, status and the schemas it takes and answers)
 * and the shared zod schemas (zod's own JSON Schema output, draft 2020-12, which OpenAPI 3.1 uses).
 */

type JsonSchema = Record<string, unknown>

const REF = (name: string) => ({ $ref: `#/components/schemas/${name}` })

/** The shared answer schemas as named components; nested known answers become $refs. */
function componentSchemas(): Record<string, JsonSchema> {
  const registry = z.registry<{ id: string }>()
  for (const [id, schema] of Object.entries(answerSchemas)) registry.add(schema, { id })
  registry.add(errorBodySchema, { id: 'ErrorBody' })
  const out = z.toJSONSchema(registry, {
    target: 'draft-2020-12',
    unrepresentable: 'any',
    uri: (id) => `#/components/schemas/${id}`,
  }) as { schemas: Record<string, JsonSchema> }
  for (const s of Object.values(out.schemas)) {
    delete s.$schema
    delete s.$id
  }
  return out.schemas
}

/** A schema of a request or an answer: a $ref when it is a named answer, inline otherwise. */
function schemaOf(schema: ZodType, io: 'input' | 'output'): JsonSchema {
  for (const [id, s] of Object.entries(answerSchemas)) if (s === schema) return REF(id)
  const json = z.toJSONSchema(schema, { target: 'draft-2020-12', unrepresentable: 'any', io }) as JsonSchema
  delete json.$schema
  return json
}

/** Express path -> OpenAPI path: /sites/:siteId -> /sites/{siteId}. */
export function openApiPath(path: string): string {
  return path.replace(/:(\w+)/g, '{$1}')
}

function who(a: Access): string {
  if (a.kind === 'public') return 'Anyone.'
  if (a.kind === 'signedIn') return 'Any signed-in person.'
  if (a.kind === 'systemAdmin') return 'System administrators.'
  return `Members of the site with the role: ${a.roles.join(', ')} (system administrators too).`
}

function queryParameters(schema: ZodType): JsonSchema[] {
  const json = z.toJSONSchema(schema, { target: 'draft-2020-12', unrepresentable: 'any', io: 'input' }) as {
    properties?: Record<string, JsonSchema>
    required?: string[]
  }
  return Object.entries(json.properties ?? {}).map(([name, s]) => ({
    name, in: 'query', required: (json.required ?? []).includes(name), schema: s,
  }))
}

const ERRORS: Record<string, string> = {
  '400': 'Invalid input, with field paths',
  '401': 'Not signed in',
  '403': 'Not allowed',
  '404': 'Not found',
  '409': 'Conflict (stale lockVersion, published version, confirmation needed)',
  '422': 'Infeasible design, with structured reasons',
}

/** Group by resource: /sites/:siteId/studies/... -> studies; the service's own routes together. */
function tagOf(path: string): string {
  const first = path.split('/')[path.startsWith('/sites/:siteId/') ? 3 : 1] ?? 'api'
  return first === 'health' || first === 'openapi.json' ? 'service' : first
}

function operation(r: RouteSpec): JsonSchema {
  const params = [...r.path.matchAll(/:(\w+)/g)].map((m) => ({
    name: m[1], in: 'path', required: true,
    schema: /id$/i.test(m[1]!) ? { type: 'integer', minimum: 1 } : { type: 'string' },
  }))
  if (r.doc?.query) params.push(...(queryParameters(r.doc.query) as typeof params))
  const status = String(successStatus(r))
  const responses: Record<string, JsonSchema> = {}
  const res = r.doc?.response
  if (r.status === 204 || r.method === 'delete') {
    responses['204'] = { description: 'Done; no body' }
  } else if (res === 'pdf') {
    responses[status] = { description: 'A PDF file', content: { 'application/pdf': { schema: { type: 'string', contentMediaType: 'application/pdf' } } } }
  } else if (res === 'xlsx') {
    const type = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet'
    responses[status] = { description: 'A workbook', content: { [type]: { schema: { type: 'string', contentMediaType: type } } } }
  } else {
    responses[status] = { description: r.summary, content: { 'application/json': { schema: res ? schemaOf(res, 'output') : {} } } }
  }
  const errorCodes = ['400', '404', '409', '422']
  if (r.access.kind !== 'public') errorCodes.push('401', '403')
  for (const code of errorCodes.sort()) {
    responses[code] = { description: ERRORS[code], content: { 'application/json': { schema: REF('ErrorBody') } } }
  }
  const op: JsonSchema = {
    operationId: `${r.method}${openApiPath(r.path).replace(/[{}]/g, '').split(/[/.-]/).filter(Boolean).map((w) => w[0]!.toUpperCase() + w.slice(1)).join('')}`,
    summary: r.summary,
    description: `Who: ${who(r.access)}`,
    tags: [tagOf(r.path)],
    parameters: params,
    responses,
  }
  if (r.access.kind === 'public') op.security = []
  const body = r.doc?.body
  if (body === 'csvUpload') {
    op.requestBody = {
      required: true,
      content: { 'multipart/form-data': { schema: { type: 'object', required: ['file'], properties: { file: { type: 'string', contentMediaType: 'text/csv' } } } } },
    }
  } else if (body) {
    op.requestBody = { required: true, content: { 'application/json': { schema: schemaOf(body, 'input') } } }
  }
  return op
}

let cached: { count: number; doc: JsonSchema } | null = null

/** The document for every route declared so far (each method and path once); built once per route set. */
export function openApiDocument(routes: readonly RouteSpec[] = routeTable): JsonSchema {
  if (routes === routeTable && cached?.count === routes.length) return cached.doc
  const doc = buildDocument(routes)
  if (routes === routeTable) cached = { count: routes.length, doc }
  return doc
}

function buildDocument(routes: readonly RouteSpec[]): JsonSchema {
  const paths: Record<string, Record<string, JsonSchema>> = {}
  for (const r of routes) {
    const p = (paths[openApiPath(r.path)] ??= {})
    if (!p[r.method]) p[r.method] = operation(r)
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Scrubwright API',
      version: pkg.version,
      description:
        'Design, costing and optimisation of tray gas absorbers. Every error has the shape ErrorBody. ' +
        'Sign in with POST /auth/login; browsers use the sw_session cookie, scripts the bearer token.',
    },
    servers: [{ url: '/api/v1' }],
    security: [{ bearer: [] }, { cookie: [] }],
    paths,
    components: {
      schemas: componentSchemas(),
      securitySchemes: {
        bearer: { type: 'http', scheme: 'bearer', bearerFormat: 'JWT' },
        cookie: { type: 'apiKey', in: 'cookie', name: 'sw_session' },
      },
    },
  }
}
