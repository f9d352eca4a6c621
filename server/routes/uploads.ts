import path from 'node:path'
import type { Router, Request, RequestHandler } from 'express'
import multer from 'multer'
import { defineRoutes, parse, ANY_ROLE } from './define.ts'
import * as svc from '../services/uploads.ts'
import { AppError, ValidationError } from '../errors.ts'
import type { Config } from '../config.ts'
import { idParam } from '../../shared/schemas/common.ts'
import { equilibriumUploadFields, quoteListQuery, fitBody, adoptFitBody } from '../../shared/schemas/uploads.ts'

const CSV_TYPES = new Set(['text/csv', 'text/plain', 'application/csv'])

function sizeText(bytes: number): string {
  return bytes >= 1024 * 1024 ? `${(bytes / (1024 * 1024)).toFixed(bytes % (1024 * 1024) ? 1 : 0)} MiB` : `${Math.round(bytes / 1024)} KiB`
}

/** Multipart with one CSV file in the field `file`, kept in memory up to the upload limit. */
export function csvUpload(limitBytes: number): RequestHandler {
  const handle = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: limitBytes, files: 1, fields: 10, fieldSize: 2000, parts: 12 },
    fileFilter: (_req, file, cb) => {
      const ext = path.extname(file.originalname).toLowerCase()
      if (ext === '.csv' || CSV_TYPES.has(file.mimetype)) return cb(null, true)
      cb(new AppError(400, 'unsupported_file_type', 'Only CSV files (.csv, text/csv or text/plain) can be uploaded here.', [
        { path: 'file', message: `'${file.originalname}' (${file.mimetype}) is not a CSV file` },
      ]))
    },
  }).single('file')
  return (req, res, next) => {
    handle(req, res, (err?: unknown) => {
      if (!err) return next()
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          return next(new AppError(413, 'payload_too_large', `The file is larger than the upload limit of ${sizeText(limitBytes)}.`, [
            { path: 'file', message: `must be at most ${limitBytes} bytes` },
          ]))
        }
        return next(new ValidationError('The upload is not valid.', [{ path: err.field ? `body.${err.field}` : 'file', message: err.message }]))
      }
      next(err)
    })
  }
}

function fileOf(req: Request): svc.UploadedFile {
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
      doc: { body: 'csvUpload' },
      handler: (req) => svc.previewEquilibrium(fileOf(req), parse(equilibriumUploadFields, req.body ?? {}, 'body')),
    },
    {
      method: 'post', path: '/sites/:siteId/uploads/equilibrium', access: { kind: 'site', roles: SAVERS_EQ }, before: [upload],
      summary: 'Save an equilibrium CSV as a site equilibrium table (400 with line-numbered details and nothing saved on any error)',
      doc: { body: 'csvUpload' },
      handler: (req) => svc.saveEquilibrium(req.site!.id, fileOf(req), parse(equilibriumUploadFields, req.body ?? {}, 'body'), req.user!, req.requestId),
    },
    {
      method: 'get', path: '/sites/:siteId/equilibrium-tables', access: { kind: 'site', roles: ANY_ROLE },
      summary: 'Uploaded equilibrium tables of the site, newest first, each ready as { model: "table", points }',
      handler: (req) => svc.listEquilibriumTables(req.site!.id),
    },
    {
      method: 'post', path: '/sites/:siteId/uploads/quotes/preview', access: { kind: 'site', roles: ECONOMISTS }, before: [upload],
      summary: 'Check a vendor-quotes CSV: quotes, line-numbered errors and warnings; nothing is saved',
      status: 200,
      doc: { body: 'csvUpload' },
      handler: (req) => svc.previewQuotes(req.site!.id, fileOf(req)),
    },
    {
      method: 'post', path: '/sites/:siteId/uploads/quotes', access: { kind: 'site', roles: ECONOMISTS }, before: [upload],
      summary: 'Save vendor quotes from a CSV in one transaction (all or nothing) under one upload reference',
      doc: { body: 'csvUpload' },
      handler: (req) => svc.saveQuotes(req.site!.id, fileOf(req), req.user!, req.requestId),
    },
    {
      method: 'get', path: '/sites/:siteId/quotes', access: { kind: 'site', roles: ANY_ROLE },
      summary: 'Vendor quotes of the site (?equipmentType=)',
      doc: { query: quoteListQuery },
      handler: (req) => svc.listQuotes(req.site!.id, parse(quoteListQuery, req.query, 'query').equipmentType),
    },
    {
      method: 'delete', path: '/sites/:siteId/quotes/:id', access: { kind: 'site', roles: ECONOMISTS },
      summary: 'Delete one vendor quote',
      handler: async (req) => {
        await svc.deleteQuote(req.site!.id, parse(idParam, req.params.id, 'params.id'), req.user!, req.requestId)
      },
    },
    {
      method: 'post', path: '/sites/:siteId/quotes/fit', access: { kind: 'site', roles: ECONOMISTS },
      summary: 'Least-squares fit in log space of the quotes of one equipment type, in the form of the cost-basis curve',
      status: 200,
      doc: { body: fitBody },
      handler: (req) => svc.fitQuotes(req.site!.id, parse(fitBody, req.body)),
    },
    {
      method: 'post', path: '/sites/:siteId/cost-bases/:id/adopt-fit', access: { kind: 'site', roles: ECONOMISTS },
      summary: 'Write fitted coefficients into a draft cost basis (409 when published or stale lockVersion)',
      status: 200,
      doc: { body: adoptFitBody },
      handler: (req) => svc.adoptFit(req.site!.id, parse(idParam, req.params.id, 'params.id'), parse(adoptFitBody, req.body), req.user!, req.requestId),
    },
  ])
}
