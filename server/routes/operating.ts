import type { Router } from 'express'
import { defineRoutes, parse, ANY_ROLE } from './define.ts'
import { csvUpload } from './csv-upload.ts'
import * as svc from '../services/operating.ts'
import { idParam } from '../../shared/schemas/common.ts'
import { operatingEntryBody, updateOperatingEntryBody } from '../../shared/schemas/operating.ts'
import { ValidationError } from '../errors.ts'
import type { Config } from '../config.ts'
import { operatingLogAnswer } from '../../shared/schemas/answers.ts'

const study = (p: unknown) => parse(idParam, p, 'params.studyId')

export function operatingRoutes(router: Router, cfg: Config): Router {
  const upload = csvUpload(cfg.UPLOAD_LIMIT_BYTES)
  return defineRoutes(router, [
    {
      method: 'get', path: '/sites/:siteId/studies/:studyId/operating-entries', access: { kind: 'site', roles: ANY_ROLE },
      summary: 'Operating log of an approved study, each month priced against the approved design',
      doc: { response: operatingLogAnswer },
      handler: (req) => svc.listEntries(req.site!.id, study(req.params.studyId)),
    },
    {
      method: 'post', path: '/sites/:siteId/studies/:studyId/operating-entries', access: { kind: 'site', roles: ['engineer'] },
      summary: 'Log one month of operation',
      doc: { body: operatingEntryBody, response: operatingLogAnswer },
      handler: (req) => svc.createEntries(req.site!.id, study(req.params.studyId), [parse(operatingEntryBody, req.body)], req.user!, req.requestId),
    },
    {
      method: 'post', path: '/sites/:siteId/studies/:studyId/operating-entries/import', access: { kind: 'site', roles: ['engineer'] },
      summary: 'Log months from a CSV file (all rows or none)',
      before: [upload],
      doc: { body: 'csvUpload', response: operatingLogAnswer },
      handler: (req) => {
        if (!req.file) throw new ValidationError('Attach a CSV file.', [{ path: 'file', message: 'is required' }])
        return svc.importCsv(req.site!.id, study(req.params.studyId), req.file.buffer, req.user!, req.requestId)
      },
    },
    {
      method: 'put', path: '/sites/:siteId/studies/:studyId/operating-entries/:entryId', access: { kind: 'site', roles: ['engineer'] },
      summary: 'Correct a logged month (optimistic locking)',
      doc: { body: updateOperatingEntryBody, response: operatingLogAnswer },
      handler: (req) => svc.updateEntry(req.site!.id, study(req.params.studyId), parse(idParam, req.params.entryId, 'params.entryId'), parse(updateOperatingEntryBody, req.body), req.user!, req.requestId),
    },
    {
      method: 'delete', path: '/sites/:siteId/studies/:studyId/operating-entries/:entryId', access: { kind: 'site', roles: ['engineer'] },
      summary: 'Remove a logged month',
      handler: async (req) => {
        await svc.deleteEntry(req.site!.id, study(req.params.studyId), parse(idParam, req.params.entryId, 'params.entryId'), req.user!, req.requestId)
      },
    },
  ])
}
