import type { Router, Request } from 'express'
import { defineRoutes, parse, ANY_ROLE } from './define.ts'
import { csvUpload } from './csv-upload.ts'
import * as equilibrium from '../services/uploads/equilibrium.ts'
import * as quotes from '../services/uploads/quotes.ts'
import * as fits from '../services/uploads/fits.ts'
import type { UploadedFile } from '../services/csv/reader.ts'
import { ValidationError } from '../errors.ts'
import type { Config } from '../config.ts'
import { idParam } from '../../shared/schemas/common.ts'
import { equilibriumUploadFields, quoteListQuery, fitBody, adoptFitBody } from '../../shared/schemas/uploads.ts'
import { costBasisVersionAnswer, equilibriumPreviewAnswer, equilibriumTableAnswer, fitAnswer, quoteAnswer, quotesPreviewAnswer, savedQuotesAnswer } from '../../shared/schemas/answers.ts'
import { z } from 'zod'

function fileOf(req: Request): UploadedFile {
  const f = req.file
  if (!f) throw new ValidationError('Attach a CSV file in the form field "file".', [{ path: 'file', message: 'required' }])
  return { originalname: f.originalname, buffer: f.buffer }
}

const UPLOADERS_EQ = ['engineer', 'economist', 'admin'] as const
const SAVERS_EQ = ['engineer', 'admin'] as const
const ECONOMISTS = ['economist', 'admin'] as const

export function uploadRoutes(router: Router, cfg: Config): Router {
  const upload = csvUpload(cfg.UPLOAD_LIMIT_BYTES)
  return defineRoutes(router, [
    {
      method: 'post', path: '/sites/:siteId/uploads/equilibrium/preview', access: { kind: 'site', roles: UPLOADERS_EQ }, before: [upload],
      summary: 'Check an x-y equilibrium CSV (x,y[,temperature]): points, line-numbered errors and warnings; nothing is saved',
      status: 200,
      doc: { body: 'csvUpload', response: equilibriumPreviewAnswer },
      handler: (req) => equilibrium.previewEquilibrium(fileOf(req), parse(equilibriumUploadFields, req.body ?? {}, 'body')),
    },
    {
      method: 'post', path: '/sites/:siteId/uploads/equilibrium', access: { kind: 'site', roles: SAVERS_EQ }, before: [upload],
      summary: 'Save an equilibrium CSV as a site equilibrium table (400 with line-numbered details and nothing saved on any error)',
      doc: { body: 'csvUpload', response: equilibriumTableAnswer },
      handler: (req) => equilibrium.saveEquilibrium(req.site!.id, fileOf(req), parse(equilibriumUploadFields, req.body ?? {}, 'body'), req.user!, req.requestId),
    },
    {
      method: 'get', path: '/sites/:siteId/equilibrium-tables', access: { kind: 'site', roles: ANY_ROLE },
      summary: 'Uploaded equilibrium tables of the site, newest first, each ready as { model: "table", points }',
      doc: { response: z.array(equilibriumTableAnswer) },
      handler: (req) => equilibrium.listEquilibriumTables(req.site!.id),
    },
    {
      method: 'post', path: '/sites/:siteId/uploads/quotes/preview', access: { kind: 'site', roles: ECONOMISTS }, before: [upload],
      summary: 'Check a vendor-quotes CSV: quotes, line-numbered errors and warnings; nothing is saved',
      status: 200,
      doc: { body: 'csvUpload', response: quotesPreviewAnswer },
      handler: (req) => quotes.previewQuotes(req.site!.id, fileOf(req)),
    },
    {
      method: 'post', path: '/sites/:siteId/uploads/quotes', access: { kind: 'site', roles: ECONOMISTS }, before: [upload],
      summary: 'Save vendor quotes from a CSV in one transaction (all or nothing) under one upload reference',
      doc: { body: 'csvUpload', response: savedQuotesAnswer },
      handler: (req) => quotes.saveQuotes(req.site!.id, fileOf(req), req.user!, req.requestId),
    },
    {
      method: 'get', path: '/sites/:siteId/quotes', access: { kind: 'site', roles: ANY_ROLE },
      summary: 'Vendor quotes of the site (?equipmentType=)',
      doc: { query: quoteListQuery, response: z.array(quoteAnswer) },
      handler: (req) => quotes.listQuotes(req.site!.id, parse(quoteListQuery, req.query, 'query').equipmentType),
    },
    {
      method: 'delete', path: '/sites/:siteId/quotes/:id', access: { kind: 'site', roles: ECONOMISTS },
      summary: 'Delete one vendor quote',
      handler: async (req) => {
        await quotes.deleteQuote(req.site!.id, parse(idParam, req.params.id, 'params.id'), req.user!, req.requestId)
      },
    },
    {
      method: 'post', path: '/sites/:siteId/quotes/fit', access: { kind: 'site', roles: ECONOMISTS },
      summary: 'Least-squares fit in log space of the quotes of one equipment type, in the form of the cost-basis curve',
      status: 200,
      doc: { body: fitBody, response: fitAnswer },
      handler: (req) => fits.fitQuotes(req.site!.id, parse(fitBody, req.body)),
    },
    {
      method: 'post', path: '/sites/:siteId/cost-bases/:id/adopt-fit', access: { kind: 'site', roles: ECONOMISTS },
      summary: 'Write fitted coefficients into a draft cost basis (409 when published or stale lockVersion)',
      status: 200,
      doc: { body: adoptFitBody, response: costBasisVersionAnswer },
      handler: (req) => fits.adoptFit(req.site!.id, parse(idParam, req.params.id, 'params.id'), parse(adoptFitBody, req.body), req.user!, req.requestId),
    },
  ])
}
