import path from 'node:path'
import type { RequestHandler } from 'express'
import multer from 'multer'
import { AppError, ValidationError } from '../errors.ts'

/** Every CSV upload (equilibrium tables, vendor quotes, the operating log) comes in through this. */
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
