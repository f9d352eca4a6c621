import type { Router, Response } from 'express'
import { defineRoutes, parse, ANY_ROLE } from './define.ts'
import * as svc from '../services/reports.ts'
import { idParam } from '../../shared/schemas/common.ts'

function sendFile(res: Response, file: { fileName: string; body: Buffer }, type: string): void {
  res.status(200)
  res.setHeader('Content-Type', type)
  res.setHeader('Content-Disposition', `attachment; filename="${file.fileName}"`)
  res.setHeader('Cache-Control', 'private, no-store')
  res.setHeader('Content-Length', String(file.body.length))
  res.end(file.body)
}

export function reportRoutes(router: Router): Router {
  return defineRoutes(router, [
    {
      method: 'get', path: '/sites/:siteId/studies/:studyId/report.pdf', access: { kind: 'site', roles: ANY_ROLE },
      summary: 'Printable study report (PDF) from the newest design and optimisation runs, in the unit system of the reader',
      doc: { response: 'pdf' },
      handler: async (req, res) => {
        sendFile(res, await svc.studyReportPdf(req.site!.id, parse(idParam, req.params.studyId, 'params.studyId'), req.user!), 'application/pdf')
      },
    },
    {
      method: 'get', path: '/sites/:siteId/studies/:studyId/export.xlsx', access: { kind: 'site', roles: ANY_ROLE },
      summary: 'The study as a workbook: one sheet per part, full-precision numbers in the unit system of the reader',
      doc: { response: 'xlsx' },
      handler: async (req, res) => {
        sendFile(res, await svc.studyReportXlsx(req.site!.id, parse(idParam, req.params.studyId, 'params.studyId'), req.user!), 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet')
      },
    },
  ])
}
