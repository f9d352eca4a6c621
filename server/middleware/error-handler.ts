import type { ErrorRequestHandler, RequestHandler } from 'express'
import { ZodError } from 'zod'
import multer from 'multer'
import { AppError, NotFoundError, ServiceBusyError, type ErrorDetail } from '../errors.ts'
import { logger } from '../logger.ts'
import type { ErrorBody } from '../../shared/schemas/common.ts'

export function zodDetails(err: ZodError, prefix = ''): ErrorDetail[] {
  return err.issues.map((i) => ({
    path: [prefix, ...i.path.map(String)].filter(Boolean).join('.'),
    message: i.message,
    code: i.code,
  }))
}

/** JSON 404 for unknown API paths. */
export const notFound: RequestHandler = (_req, _res, next) => next(new NotFoundError('Route'))

/** The one error handler: every error leaves as { error: { code, message, details, requestId } }. */
export const errorHandler: ErrorRequestHandler = (err: unknown, req, res, _next) => {
  let status = 500
  let body: ErrorBody['error'] = { code: 'internal', message: 'Something went wrong on our side.', details: [], requestId: req.requestId }
  if (err instanceof AppError) {
    status = err.status
    body = { code: err.code, message: err.message, details: err.details, requestId: req.requestId }
  } else if (err instanceof ZodError) {
    status = 400
    body = { code: 'validation_failed', message: 'The request is not valid.', details: zodDetails(err), requestId: req.requestId }
  } else if (err instanceof multer.MulterError) {
    const tooLarge = err.code === 'LIMIT_FILE_SIZE'
    status = tooLarge ? 413 : 400
    body = {
      code: tooLarge ? 'payload_too_large' : 'bad_upload',
      message: tooLarge ? 'The file is larger than the upload limit.' : `The upload is not valid: ${err.message}.`,
      details: [{ path: err.field ?? 'file', message: err.message }],
      requestId: req.requestId,
    }
  } else if (isBodyParserError(err)) {
    status = err.status
    body = {
      code: err.type === 'entity.too.large' ? 'payload_too_large' : 'bad_request',
      message: err.type === 'entity.too.large' ? 'The request body is too large.' : 'The request body is not valid JSON.',
      details: [],
      requestId: req.requestId,
    }
  }
  if (status >= 500) logger.error({ err, requestId: req.requestId, path: req.path }, 'request failed')
  if (res.headersSent) return
  if (err instanceof ServiceBusyError) res.setHeader('Retry-After', String(err.retryAfterSeconds))
  res.status(status).json({ error: body })
}

function isBodyParserError(e: unknown): e is { status: number; type: string } {
  return typeof e === 'object' && e !== null && 'type' in e && 'status' in e && typeof (e as { status: unknown }).status === 'number'
}
