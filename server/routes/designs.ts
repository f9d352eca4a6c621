import type { Router } from 'express'
import { z } from 'zod'
import { defineRoutes, parse } from './define.ts'
import * as svc from '../services/designs.ts'

export function designRoutes(router: Router): Router {
  return defineRoutes(router, [
    {
      method: 'get', path: '/components', access: { kind: 'signedIn' }, summary: 'The component library (with a site\'s own components when ?siteId= is given)',
      handler: (req) => {
        const siteId = req.query.siteId === undefined ? undefined : parse(z.coerce.number().int().positive(), req.query.siteId, 'query.siteId')
        return svc.listComponents(req.user!, siteId)
      },
    },
    {
      method: 'post', path: '/designs/evaluate', access: { kind: 'signedIn' },
      summary: 'Design one case, { case, costBasis? , siteId? } or { cases: [...] } (stateless)',
      handler: async (req, res) => {
        res.status(200).json(await svc.evaluate(req.user!, req.body))
      },
    },
    {
      method: 'post', path: '/designs/optimize', access: { kind: 'signedIn' },
      summary: 'Lowest-cost design of { case, costBasis?, search?, siteId? } with curves and sensitivity (stateless)',
      handler: async (req, res) => {
        res.status(200).json(await svc.optimiseCase(req.user!, req.body))
      },
    },
  ])
}
