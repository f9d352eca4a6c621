import type { Router } from 'express'
import { defineRoutes, parse, ANY_ROLE } from './define.ts'
import { standingColumn } from '../services/standing.ts'
import { idParam } from '../../shared/schemas/common.ts'
import { standingColumnAnswer } from '../../shared/schemas/answers.ts'

/** The standing (as-built) column of an approved study: its rating case and window. */
export function standingRoutes(router: Router): Router {
  return defineRoutes(router, [
    {
      method: 'get', path: '/sites/:siteId/studies/:studyId/standing-column', access: { kind: 'site', roles: ANY_ROLE },
      summary: 'The approved design as a standing column: its rating case, the rating at design flows with the operating window, and the logged months',
      doc: { response: standingColumnAnswer },
      handler: (req) => standingColumn(req.site!.id, parse(idParam, req.params.studyId, 'params.studyId')),
    },
  ])
}
