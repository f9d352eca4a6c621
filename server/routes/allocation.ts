import type { Router } from 'express'
import { defineRoutes, parse, ANY_ROLE } from './define.ts'
import * as svc from '../services/allocation.ts'
import { idParam } from '../../shared/schemas/common.ts'
import { z } from 'zod'
import { allocationAbsorberSchema, allocationBody } from '../../shared/schemas/allocation.ts'
import { allocationAnswer, savedAllocationAnswer } from '../../shared/schemas/answers.ts'

export function allocationRoutes(router: Router): Router {
  return defineRoutes(router, [
    {
      method: 'post', path: '/sites/:siteId/allocations/solve', access: { kind: 'site', roles: ['engineer', 'economist', 'admin'] },
      summary: 'Split a limited solvent supply between absorbers (LP); optionally save it',
      status: 200,
      doc: { body: allocationBody, response: allocationAnswer },
      handler: (req) => svc.solve(req.site!.id, parse(allocationBody, req.body), req.user!, req.requestId),
    },
    {
      method: 'get', path: '/sites/:siteId/allocations/absorbers', access: { kind: 'site', roles: ANY_ROLE },
      summary: 'The absorbers an allocation can include, with their design solvent flows',
      doc: { response: z.array(allocationAbsorberSchema) },
      handler: (req) => svc.absorbers(req.site!.id),
    },
    {
      method: 'get', path: '/sites/:siteId/allocations', access: { kind: 'site', roles: ANY_ROLE }, summary: 'Saved allocations',
      doc: { response: z.array(savedAllocationAnswer) },
      handler: (req) => svc.listSaved(req.site!.id),
    },
    {
      method: 'get', path: '/sites/:siteId/allocations/:id', access: { kind: 'site', roles: ANY_ROLE }, summary: 'One saved allocation',
      doc: { response: savedAllocationAnswer },
      handler: (req) => svc.getSaved(req.site!.id, parse(idParam, req.params.id, 'params.id')),
    },
  ])
}
