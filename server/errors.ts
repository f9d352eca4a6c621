import type { ZodError } from 'zod'

/** One error family for the whole API; the error handler maps each to its status. */
export interface ErrorDetail {
  path: string
  message: string
  code?: string
}

export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details: ErrorDetail[] = [],
  ) {
    super(message)
    this.name = new.target.name
  }
}

export class ValidationError extends AppError {
  constructor(message: string, details: ErrorDetail[] = []) {
    super(400, 'validation_failed', message, details)
  }
}
export class UnauthenticatedError extends AppError {
  constructor(message = 'Sign in to continue.') {
    super(401, 'unauthenticated', message)
  }
}
export class ForbiddenError extends AppError {
  constructor(message = 'Your role does not allow this.') {
    super(403, 'forbidden', message)
  }
}
export class NotFoundError extends AppError {
  constructor(what = 'Resource') {
    super(404, 'not_found', `${what} not found.`)
  }
}
export class ConflictError extends AppError {
  constructor(message: string, details: ErrorDetail[] = []) {
    super(409, 'conflict', message, details)
  }
}
/** The server is busy (a full queue): 503 with Retry-After [s]; nothing was done. */
export class ServiceBusyError extends AppError {
  constructor(
    message: string,
    readonly retryAfterSeconds: number,
  ) {
    super(503, 'busy', message)
  }
}

export class InfeasibleError extends AppError {
  constructor(message: string, details: ErrorDetail[] = []) {
    super(422, 'infeasible_design', message, details)
  }
}
export class TooManyRequestsError extends AppError {
  constructor(message = 'Too many attempts; try again later.') {
    super(429, 'rate_limited', message)
  }
}

/** Field-path details of a zod error, each path prefixed (body., query., params., or a case path). */
export function zodDetails(err: ZodError, prefix = ''): ErrorDetail[] {
  return err.issues.map((i) => ({
    path: [prefix, ...i.path.map(String)].filter(Boolean).join('.'),
    message: i.message,
    code: i.code,
  }))
}

/** Seconds a client is told to wait (Retry-After) while the database is unreachable. */
export const DB_RETRY_AFTER_SECONDS = 5
