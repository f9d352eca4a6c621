import type { Router, Request } from 'express'
import { z } from 'zod'
import { defineRoutes, parse } from './define.ts'
import { AppError, ForbiddenError, ValidationError } from '../errors.ts'
import { parseCase, parseBasis, parseSearch, runDesign, runOptimiseAsync, assertFinite, libraryWith } from '../services/engine-gateway.ts'
import { siteLibrary } from '../services/runs.ts'
import { basisInForce } from '../services/cost-bases.ts'
import { loadPreset, hasPreset, DEFAULT_PRESET } from '../engine/costing/index.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import type { ComponentLibrary } from '../engine/case.ts'

const MAX_BATCH = 1000

const costBasisRef = z.union([z.object({ preset: z.string().max(80) }).strict(), z.record(z.string(), z.unknown())])
const envelope = z.object({
  siteId: z.number().int().positive().optional(),
  costBasis: costBasisRef.optional(),
})

/** The site whose library and cost basis a stateless request uses (membership checked). */
async function siteContext(req: Request, siteId: number | undefined): Promise<{ library: ComponentLibrary; basis: CostBasisData | null }> {
  if (siteId === undefined) return { library: libraryWith(), basis: null }
  if (!req.user!.isAdmin && !req.user!.roles.has(siteId)) throw new ForbiddenError('You are not a member of this site.')
  const row = await basisInForce(siteId)
  return { library: await siteLibrary(siteId), basis: row ? (row.data as CostBasisData) : null }
}

/** The slot of one batch case: its design, or { error: { code, message, issues: [{ path, message }] } }. */
function designSlot(run: () => unknown): unknown {
  try {
    const r = run()
    assertFinite(r)
    return r
  } catch (e) {
    if (!(e instanceof AppError) || e.status >= 500) throw e
    return { error: { code: e.code, message: e.message, issues: e.details.map((d) => ({ path: d.path, message: d.message })) } }
  }
}

function resolveBasis(ref: unknown, fallback: CostBasisData | null, path: string): CostBasisData | null {
  if (ref === undefined) return fallback
  const r = ref as { preset?: unknown }
  if (typeof r.preset === 'string' && Object.keys(r).length === 1) {
    if (!hasPreset(r.preset)) throw new ValidationError('Unknown preset.', [{ path: `${path}.preset`, message: `no preset named '${r.preset}'` }])
    return loadPreset(r.preset)
  }
  return parseBasis(ref, path)
}

export function designRoutes(router: Router): Router {
  return defineRoutes(router, [
    {
      method: 'get', path: '/components', access: { kind: 'signedIn' }, summary: 'The component library (with a site\'s own components when ?siteId= is given)',
      handler: async (req) => {
        const siteId = req.query.siteId === undefined ? undefined : parse(z.coerce.number().int().positive(), req.query.siteId, 'query.siteId')
        const { library } = await siteContext(req, siteId)
        return Object.entries(library.components).map(([name, c]) => ({
          name,
          aliases: c.aliases ?? [],
          formula: c.formula ?? null,
          molarMass: c.molarMass?.value ?? null,
          hasHenry: Boolean(c.henry),
          hasVapourPressure: Boolean(c.antoine),
          hazards: c.hazards?.flags ?? [],
          source: c.molarMass?.source ?? c.henry?.source ?? '',
        }))
      },
    },
    {
      method: 'post', path: '/designs/evaluate', access: { kind: 'signedIn' },
      summary: 'Design one case, { case, costBasis? , siteId? } or { cases: [...] } (stateless)',
      handler: async (req, res) => {
        const body = req.body as Record<string, unknown> | undefined
        if (!body || typeof body !== 'object' || Array.isArray(body)) throw new ValidationError('The body must be a JSON object.', [{ path: 'body', message: 'must be an object' }])
        const env = parse(envelope, { siteId: body.siteId, costBasis: body.costBasis })
        const ctx = await siteContext(req, env.siteId)
        const basis = resolveBasis(env.costBasis, env.costBasis === undefined && env.siteId === undefined ? null : ctx.basis, 'body.costBasis')
        let out: unknown
        if (Array.isArray(body.cases)) {
          if (body.cases.length > MAX_BATCH) throw new ValidationError('Too many cases.', [{ path: 'body.cases', message: `at most ${MAX_BATCH} cases per request` }])
          // Each case its own slot: the design, or why it was refused; one refused case never stops the others.
          const slots = body.cases.map((c, i) => designSlot(() => runDesign(parseCase(c, ctx.library, `body.cases.${i}`), basis, `body.cases.${i}`)))
          res.setHeader('X-Cases-Refused', String(slots.filter((x) => typeof x === 'object' && x !== null && 'error' in x).length))
          out = slots
        } else if ('case' in body) {
          out = runDesign(parseCase(body.case, ctx.library, 'body.case'), basis, 'body.case')
        } else {
          out = runDesign(parseCase(body, ctx.library, 'body'), basis, 'body')
        }
        assertFinite(out)
        res.status(200).json(out)
      },
    },
    {
      method: 'post', path: '/designs/optimize', access: { kind: 'signedIn' },
      summary: 'Lowest-cost design of { case, costBasis?, search?, siteId? } with curves and sensitivity (stateless)',
      handler: async (req, res) => {
        const body = parse(envelope.extend({ case: z.unknown(), search: z.unknown().optional() }), req.body)
        const ctx = await siteContext(req, body.siteId)
        const basis = resolveBasis(body.costBasis, ctx.basis, 'body.costBasis') ?? loadPreset(DEFAULT_PRESET)
        const c = parseCase(body.case, ctx.library, 'body.case')
        const out = await runOptimiseAsync(c, basis, parseSearch(body.search, 'body.search'), 'body.case')
        assertFinite(out)
        res.status(200).json(out)
      },
    },
  ])
}
