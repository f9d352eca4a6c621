import type { Router } from 'express'
import { defineRoutes, parse, ANY_ROLE } from './define.ts'
import * as svc from '../services/cost-bases.ts'
import { createCostBasisBody, updateCostBasisBody, publishCostBasisBody } from '../../shared/schemas/costBases.ts'
import { idParam } from '../../shared/schemas/common.ts'
import { costBasisVersionAnswer, costPresetAnswer } from '../../shared/schemas/answers.ts'
import { z } from 'zod'
import { costBasisSchema } from '../../shared/schemas/costBasis.ts'

const EDITORS = ['economist', 'admin'] as const

export function costBasisRoutes(router: Router): Router {
  return defineRoutes(router, [
    {
      method: 'get', path: '/cost-presets', access: { kind: 'signedIn' }, summary: 'Shipped cost-basis presets with their sources',
      doc: { response: z.array(costPresetAnswer) },
      handler: () => svc.listPresets(),
    },
    {
      method: 'get', path: '/cost-presets/:key', access: { kind: 'signedIn' }, summary: 'One preset in full',
      doc: { response: costBasisSchema },
      handler: (req) => svc.presetByKey(String(req.params.key)),
    },
    {
      method: 'get', path: '/sites/:siteId/cost-bases', access: { kind: 'site', roles: ANY_ROLE }, summary: 'Version history of the site cost basis',
      doc: { response: z.array(costBasisVersionAnswer) },
      handler: (req) => svc.listVersions(req.site!.id),
    },
    {
      method: 'get', path: '/sites/:siteId/cost-bases/current', access: { kind: 'site', roles: ANY_ROLE }, summary: 'The published version in force today',
      doc: { response: costBasisVersionAnswer },
      handler: (req) => svc.currentVersion(req.site!.id),
    },
    {
      method: 'get', path: '/sites/:siteId/cost-bases/:id', access: { kind: 'site', roles: ANY_ROLE }, summary: 'One version with its data',
      doc: { response: costBasisVersionAnswer },
      handler: (req) => svc.getVersion(req.site!.id, parse(idParam, req.params.id, 'params.id')),
    },
    {
      method: 'post', path: '/sites/:siteId/cost-bases', access: { kind: 'site', roles: EDITORS }, summary: 'Start a draft (from the newest version, another version or a preset)',
      doc: { body: createCostBasisBody, response: costBasisVersionAnswer },
      handler: (req) => svc.createDraft(req.site!.id, parse(createCostBasisBody, req.body), req.user!, req.requestId),
    },
    {
      method: 'put', path: '/sites/:siteId/cost-bases/:id', access: { kind: 'site', roles: EDITORS }, summary: 'Edit a draft (optimistic locking on lockVersion)',
      doc: { body: updateCostBasisBody, response: costBasisVersionAnswer },
      handler: (req) => svc.updateDraft(req.site!.id, parse(idParam, req.params.id, 'params.id'), parse(updateCostBasisBody, req.body), req.user!, req.requestId),
    },
    {
      method: 'delete', path: '/sites/:siteId/cost-bases/:id', access: { kind: 'site', roles: EDITORS }, summary: 'Discard a draft',
      handler: async (req) => {
        await svc.discardDraft(req.site!.id, parse(idParam, req.params.id, 'params.id'), req.user!, req.requestId)
      },
    },
    {
      method: 'post', path: '/sites/:siteId/cost-bases/:id/publish', access: { kind: 'site', roles: EDITORS }, summary: 'Publish a draft with an effective date; it becomes immutable',
      status: 200,
      doc: { body: publishCostBasisBody, response: costBasisVersionAnswer },
      handler: (req) => svc.publish(req.site!.id, parse(idParam, req.params.id, 'params.id'), parse(publishCostBasisBody, req.body), req.user!, req.requestId),
    },
  ])
}
