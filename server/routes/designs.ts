import type { Router } from 'express'
import { z } from 'zod'
import { defineRoutes, parse } from './define.ts'
import * as svc from '../services/designs.ts'
import { pricedDesignSchema, optimisationResultSchema } from '../../shared/schemas/results.ts'
import { caseSchema } from '../../shared/schemas/case.ts'
import { searchSpecSchema } from '../../shared/schemas/search.ts'
import { ratingResultSchema } from '../../shared/schemas/rating.ts'
import { robustSpecSchema, uncertaintyRequestSchema, uncertaintyResultSchema } from '../../shared/schemas/uncertainty.ts'
import { componentAnswer, refusedCaseAnswer } from '../../shared/schemas/answers.ts'

const siteAndBasis = {
  siteId: z.number().int().positive().optional().meta({ description: "Use this site's components and the cost basis in force" }),
  costBasis: z.unknown().optional().meta({ description: 'A full cost basis, or { "preset": "key" }' }),
}
/** The documented request forms (the case may also be sent bare, or as { cases: [...] } for a batch). */
const evaluateRequest = z.looseObject({ case: caseSchema, ...siteAndBasis })
const optimiseRequest = z.looseObject({ case: caseSchema, search: searchSpecSchema.optional(), robust: robustSpecSchema.optional(), ...siteAndBasis })

export function designRoutes(router: Router): Router {
  return defineRoutes(router, [
    {
      method: 'get', path: '/components', access: { kind: 'signedIn' }, summary: 'The component library (with a site\'s own components when ?siteId= is given)',
      doc: { response: z.array(componentAnswer) },
      handler: (req) => {
        const siteId = req.query.siteId === undefined ? undefined : parse(z.coerce.number().int().positive(), req.query.siteId, 'query.siteId')
        return svc.listComponents(req.user!, siteId)
      },
    },
    {
      method: 'post', path: '/designs/evaluate', access: { kind: 'signedIn' },
      summary: 'Design one case, { case, costBasis? , siteId? } or { cases: [...] } (stateless)',
      status: 200,
      doc: { body: evaluateRequest, response: z.union([pricedDesignSchema, z.array(z.union([pricedDesignSchema, refusedCaseAnswer]))]) },
      handler: async (req, res) => {
        const out = await svc.evaluate(req.user!, req.body)
        if (Array.isArray(out)) res.setHeader('X-Cases-Refused', String(out.filter((x) => typeof x === 'object' && x !== null && 'error' in x).length))
        return out
      },
    },
    {
      method: 'post', path: '/designs/rate', access: { kind: 'signedIn' },
      summary: 'Rate a standing column: { case, window?, siteId? }, a bare case or { cases: [...] } (stateless)',
      status: 200,
      doc: { response: z.union([ratingResultSchema, z.array(ratingResultSchema)]) },
      handler: (req) => svc.rate(req.user!, req.body),
    },
    {
      method: 'post', path: '/designs/optimize', access: { kind: 'signedIn' },
      summary: 'Lowest-cost design of { case, costBasis?, search?, robust?, siteId? } with curves and sensitivity (stateless)',
      status: 200,
      doc: { body: optimiseRequest, response: optimisationResultSchema },
      handler: (req) => svc.optimiseCase(req.user!, req.body),
    },
    {
      method: 'post', path: '/designs/uncertainty', access: { kind: 'signedIn' },
      summary: 'Chance the nominal design of { case, costBasis?, search?, uncertainty?, siteId? } meets its target (stateless)',
      status: 200,
      doc: { body: uncertaintyRequestSchema, response: uncertaintyResultSchema },
      handler: (req) => svc.uncertaintyCase(req.user!, req.body),
    },
  ])
}
