import type { ErrorRequestHandler, RequestHandler } from 'express'
import { ZodError } from 'zod'
import multer from 'multer'
import { ConnectionError, DatabaseError, TimeoutError } from 'sequelize'
import { AppError, NotFoundError, ServiceBusyError, zodDetails, DB_RETRY_AFTER_SECONDS } from '../errors.ts'
import { logger } from '../logger.ts'
import type { ErrorBody } from '../../shared/schemas/common.ts'

/** JSON 404 for unknown API paths. */
export const notFound: RequestHandler = (_req, _res, next) => next(new NotFoundError('Route'))

/**
 * A multipart body the parser (busboy, under multer) could not read: cut short, another boundary
 * than the header names, a malformed part header (a CR LF inside a file name). The parser throws
 * plain Errors, so they are recognised by where they were thrown.
 */
export function isMultipartParseError(e: unknown): e is Error {
  if (!(e instanceof Error) || e instanceof AppError) return false
  const stack = e.stack ?? ''
  return /[\\/]node_modules[\\/](busboy|streamsearch)[\\/]/.test(stack) || /^(Unexpected end of (form|file)|Malformed part header|Multipart: Boundary not found|Malformed urlencoded form)/.test(e.message)
}

const LOST_CONNECTION_CODES = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT', 'EHOSTUNREACH', 'ER_SOCKET_UNEXPECTED_CLOSE', 'ER_CONNECTION_ALREADY_CLOSED',
  'ER_GET_CONNECTION_TIMEOUT', 'ER_CONNECTION_TIMEOUT', 'ER_POOL_ALREADY_CLOSED', 'ER_CLOSING_POOL', 'ER_SERVER_SHUTDOWN', 'ER_CMD_CONNECTION_CLOSED',
])

/** The database is unreachable (refused, dropped, pool timed out), as opposed to a query that failed. */
export function isDatabaseUnavailable(e: unknown): boolean {
  if (e instanceof ConnectionError || e instanceof TimeoutError) return true
  if (e instanceof DatabaseError) {
    const p = (e as DatabaseError & { parent?: { code?: unknown; fatal?: unknown } }).parent
    return p?.fatal === true || (typeof p?.code === 'string' && LOST_CONNECTION_CODES.has(p.code))
  }
  const o = e as { code?: unknown; fatal?: unknown; sqlMessage?: unknown } | null
  return typeof o?.code === 'string' && LOST_CONNECTION_CODES.has(o.code) && ('fatal' in o || 'sqlMessage' in o)
}

/** The one error handler: every error leaves as { error: { code, message, details, requestId } }. */
export const errorHandler: ErrorRequestHandler = (err: unknown, req, res, _next) => {
  let status = 500
  let body: ErrorBody['error'] = { code: 'internal', message: 'Something went wrong on our side.', details: [], requestId: req.requestId }
  if (err instanceof AppError) {
    status = err.status
    if (status === 503) res.set('Retry-After', String(DB_RETRY_AFTER_SECONDS))
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
  } else if (isMultipartParseError(err)) {
    status = 400
    body = {
      code: 'bad_upload',
      message: 'The upload could not be read: send multipart/form-data with the file in the field "file".',
      details: [{ path: 'file', message: err.message }],
      requestId: req.requestId,
    }
  } else if (isDatabaseUnavailable(err)) {
    status = 503
    res.set('Retry-After', String(DB_RETRY_AFTER_SECONDS))
    body = { code: 'unavailable', message: 'The database is not reachable just now; try again in a few seconds.', details: [], requestId: req.requestId }
  } else if (err instanceof URIError || isDecodeParamError(err)) {
    status = 400
    body = { code: 'bad_request', message: 'The address is not valid: it holds a malformed percent-encoding.', details: [{ path: 'params', message: 'is not valid percent-encoding' }], requestId: req.requestId }
  } else if (isBodyParserError(err)) {
    status = err.status
    body = {
      code: err.type === 'entity.too.large' ? 'payload_too_large' : 'bad_request',
      message: err.type === 'entity.too.large' ? 'The request body is too large.' : 'The request body is not valid JSON.',
      details: [],
      requestId: req.requestId,
    }
  } else if (isClientHttpError(err)) {
    status = err.status
    body = { code: 'bad_request', message: 'The request is not valid.', details: [], requestId: req.requestId }
  }
  if (status === 503) logger.warn({ requestId: req.requestId, path: req.path }, 'database unavailable')
  else if (status >= 500) logger.error({ err, requestId: req.requestId, path: req.path }, 'request failed')
  if (res.headersSent) return
  if (err instanceof ServiceBusyError) res.setHeader('Retry-After', String(err.retryAfterSeconds))
  res.status(status).json({ error: body })
}

function isBodyParserError(e: unknown): e is { status: number; type: string } {
  return typeof e === 'object' && e !== null && 'type' in e && 'status' in e && typeof (e as { status: unknown }).status === 'number'
}

/** Express's router throws "Failed to decode param" with status 400 for a malformed %-escape. */
function isDecodeParamError(e: unknown): boolean {
  return e instanceof Error && /^Failed to decode param/.test(e.message)
}

/** Other http-errors style client errors (status 400-499) raised by Express middleware. */
function isClientHttpError(e: unknown): e is { status: number } {
  const s = (e as { status?: unknown } | null)?.status
  return typeof s === 'number' && s >= 400 && s < 500
}
