import { z } from 'zod'
import { AppError, ForbiddenError, ValidationError, zodDetails } from '../errors.ts'
import { caseFromRequest, parseBasis, parseSearch, runDesign, runOptimiseAsync, runRate, runUncertaintyAsync, assertFinite, libraryWith } from './engine-gateway.ts'
import { robustSpecSchema, uncertaintySpecSchema } from '../../shared/schemas/uncertainty.ts'
import { windowOptionsSchema } from '../../shared/schemas/rating.ts'
import { siteLibrary } from './runs.ts'
import { assertOptimiseCapacity } from './optimise-pool.ts'
import { basisInForce } from './cost-bases.ts'
import { loadPreset, hasPreset, DEFAULT_PRESET } from '../engine/costing/index.ts'
import type { CostBasisData } from '../../shared/schemas/costBasis.ts'
import type { ComponentLibrary } from '../engine/case.ts'
import type { AuthUser } from '../types.d.ts'

/**
 * Stateless designs and optimisations (nothing stored): the caller's site library and cost basis
 * in force when a siteId is given (membership checked here), a named preset or an inline basis.
 */

export const MAX_BATCH = 1000

const costBasisRef = z.union([z.object({ preset: z.string().max(80) }).strict(), z.record(z.string(), z.unknown())])
const envelope = z.object({
  siteId: z.number().int().positive().optional(),
  costBasis: costBasisRef.optional(),
})

function parseOr400<T>(schema: z.ZodType<T>, value: unknown, prefix: string): T {
  const r = schema.safeParse(value)
  if (!r.success) throw new ValidationError('The request is not valid.', zodDetails(r.error, prefix))
  return r.data
}

/** The site whose library and cost basis a stateless request uses (membership checked). */
async function siteContext(user: AuthUser, siteId: number | undefined): Promise<{ library: ComponentLibrary; basis: CostBasisData | null }> {
  if (siteId === undefined) return { library: libraryWith(), basis: null }
  if (!user.isAdmin && !user.roles.has(siteId)) throw new ForbiddenError('You are not a member of this site.')
  const row = await basisInForce(siteId)
  return { library: await siteLibrary(siteId), basis: row ? (row.data as CostBasisData) : null }
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

/** The component library as the client lists it (with a site's own components when siteId is given). */
export async function listComponents(user: AuthUser, siteId: number | undefined) {
  const { library } = await siteContext(user, siteId)
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

/** Design one case ({ case } or the case itself) or a batch ({ cases: [...] }), priced when a basis applies. */
export async function evaluate(user: AuthUser, body: unknown) {
  if (!body || typeof body !== 'object' || Array.isArray(body)) throw new ValidationError('The body must be a JSON object.', [{ path: 'body', message: 'must be an object' }])
  const b = body as Record<string, unknown>
  const env = parseOr400(envelope, { siteId: b.siteId, costBasis: b.costBasis }, 'body')
  const ctx = await siteContext(user, env.siteId)
  const basis = resolveBasis(env.costBasis, env.costBasis === undefined && env.siteId === undefined ? null : ctx.basis, 'body.costBasis')
  let out: unknown
  if (Array.isArray(b.cases)) {
    if (b.cases.length > MAX_BATCH) throw new ValidationError('Too many cases.', [{ path: 'body.cases', message: `at most ${MAX_BATCH} cases per request` }])
    // Each case its own slot: the design, or why it was refused; one refused case never stops the others.
    return b.cases.map((c, i) => designSlot(() => runDesign(caseFromRequest(c, ctx.library, `body.cases.${i}`), basis, `body.cases.${i}`)))
  } else if ('case' in b) {
    out = runDesign(caseFromRequest(b.case, ctx.library, 'body.case'), basis, 'body.case')
  } else {
    out = runDesign(caseFromRequest(b, ctx.library, 'body'), basis, 'body')
  }
  assertFinite(out)
  return out
}

/** Rate a standing column: { case, window?, siteId? }, a bare case or { cases: [...] }. */
export async function rate(user: AuthUser, body: unknown) {
  if (!body || typeof body !== 'object' || Array.isArray(body)) throw new ValidationError('The body must be a JSON object.', [{ path: 'body', message: 'must be an object' }])
  const b = body as Record<string, unknown>
  const env = parseOr400(envelope.pick({ siteId: true }).extend({ window: windowOptionsSchema.optional() }), { siteId: b.siteId, window: b.window }, 'body')
  const ctx = await siteContext(user, env.siteId)
  let out: unknown
  if (Array.isArray(b.cases)) {
    if (b.cases.length > MAX_BATCH) throw new ValidationError('Too many cases.', [{ path: 'body.cases', message: `at most ${MAX_BATCH} cases per request` }])
    if (!b.cases.length) throw new ValidationError('The batch is empty.', [{ path: 'body.cases', message: 'give at least one case' }])
    out = b.cases.map((c, i) => runRate(c, ctx.library, `body.cases.${i}`, env.window))
  } else if ('case' in b) {
    out = runRate(b.case, ctx.library, 'body.case', env.window)
  } else {
    out = runRate(b, ctx.library, 'body', env.window)
  }
  assertFinite(out)
  return out
}

/** The lowest-cost design of { case, costBasis?, search?, siteId? } with curves and sensitivity. */
export async function optimiseCase(user: AuthUser, body: unknown) {
  const b = parseOr400(envelope.extend({ case: z.unknown(), search: z.unknown().optional(), robust: z.unknown().optional() }), body, 'body')
  assertOptimiseCapacity()
  const ctx = await siteContext(user, b.siteId)
  const basis = resolveBasis(b.costBasis, ctx.basis, 'body.costBasis') ?? loadPreset(DEFAULT_PRESET)
  const c = caseFromRequest(b.case, ctx.library, 'body.case')
  const search = parseSearch(b.search, 'body.search')
  const robust = b.robust === undefined ? undefined : parseOr400(robustSpecSchema, b.robust, 'body.robust')
  const out = await runOptimiseAsync(c, basis, search, 'body.case', robust)
  assertFinite(out)
  return out
}

/**
 * The chance a design meets its target: { case, costBasis?, search? (emissionLimit), uncertainty?, siteId? }.
 * The case is designed at nominal values and the built column rated in every sample.
 */
export async function uncertaintyCase(user: AuthUser, body: unknown) {
  const b = parseOr400(envelope.extend({ case: z.unknown(), search: z.unknown().optional(), uncertainty: uncertaintySpecSchema.optional() }), body, 'body')
  const ctx = await siteContext(user, b.siteId)
  const basis = resolveBasis(b.costBasis, ctx.basis, 'body.costBasis') ?? loadPreset(DEFAULT_PRESET)
  const c = caseFromRequest(b.case, ctx.library, 'body.case')
  const search = parseSearch(b.search, 'body.search')
  const out = await runUncertaintyAsync(c, basis, b.uncertainty ?? uncertaintySpecSchema.parse({}), search.emissionLimit, 'body.case')
  assertFinite(out)
  return out
}
