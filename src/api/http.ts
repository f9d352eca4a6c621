/**
 * The one fetch wrapper: JSON in and out, the session cookie (same origin), the API's error
 * shape turned into an ApiError, and responses parsed with a zod schema where one exists.
 */
import type { ZodType } from 'zod'

export const API_BASE = '/api/v1'

export interface ErrorDetail {
  path: string
  message: string
}

export class ApiError extends Error {
  readonly status: number
  readonly code: string
  readonly details: ErrorDetail[]
  readonly requestId?: string
  constructor(status: number, code: string, message: string, details: ErrorDetail[] = [], requestId?: string) {
    super(message)
    this.name = 'ApiError'
    this.status = status
    this.code = code
    this.details = details
    this.requestId = requestId
  }
  get isConflict(): boolean {
    return this.status === 409
  }
  get isForbidden(): boolean {
    return this.status === 403
  }
}

let unitSystem: string | null = null

/** The person's unit system, sent as X-Unit-System so that the server's messages speak it. */
export function setUnitSystemHeader(system: string | null): void {
  unitSystem = system
}

type Handler = () => void
let onUnauthorized: Handler | null = null

/** Called when the API answers 401 to anything but the sign-in and session probes. */
export function setUnauthorizedHandler(h: Handler | null): void {
  onUnauthorized = h
}

export type Query = Record<string, string | number | boolean | undefined | null>

export interface RequestOptions<T> {
  body?: unknown
  query?: Query
  schema?: ZodType<T>
  /** Do not call the 401 handler (session probe, sign-in). */
  quiet401?: boolean
  signal?: AbortSignal
}

function buildUrl(path: string, query?: Query): string {
  let url = API_BASE + path
  if (query) {
    const qs = new URLSearchParams()
    for (const [k, v] of Object.entries(query)) {
      if (v !== undefined && v !== null && v !== '') qs.set(k, String(v))
    }
    const s = qs.toString()
    if (s) url += `?${s}`
  }
  return url
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v)
}

/** Turn any error body (or none) into an ApiError. */
export function toApiError(status: number, body: unknown): ApiError {
  if (isRecord(body) && isRecord(body.error)) {
    const e = body.error
    const details: ErrorDetail[] = Array.isArray(e.details)
      ? e.details.filter(isRecord).map((d) => ({ path: String(d.path ?? ''), message: String(d.message ?? '') }))
      : []
    return new ApiError(
      status,
      typeof e.code === 'string' ? e.code : 'error',
      typeof e.message === 'string' ? e.message : `Request failed (${status})`,
      details,
      typeof e.requestId === 'string' ? e.requestId : undefined,
    )
  }
  return new ApiError(status, 'http', `The server answered ${status}.`)
}

export async function request<T>(method: string, path: string, opts: RequestOptions<T> = {}): Promise<T> {
  const init: RequestInit = {
    method,
    credentials: 'same-origin',
    headers: { Accept: 'application/json', ...(unitSystem ? { 'X-Unit-System': unitSystem } : {}) },
    signal: opts.signal,
  }
  if (opts.body !== undefined) {
    init.headers = { ...init.headers, 'Content-Type': 'application/json' }
    init.body = JSON.stringify(opts.body)
  }
  let res: Response
  try {
    res = await fetch(buildUrl(path, opts.query), init)
  } catch (err) {
    if (err instanceof DOMException && err.name === 'AbortError') throw err
    throw new ApiError(0, 'network', 'The server cannot be reached. Check the connection and try again.')
  }
  const text = await res.text()
  let body: unknown = null
  if (text) {
    try {
      body = JSON.parse(text)
    } catch {
      body = null
    }
  }
  if (!res.ok) {
    if (res.status === 401 && !opts.quiet401 && onUnauthorized) onUnauthorized()
    throw toApiError(res.status, body)
  }
  if (opts.schema) {
    const parsed = opts.schema.safeParse(body)
    if (!parsed.success) {
      throw new ApiError(res.status, 'badResponse', 'The server sent an answer this page does not understand.')
    }
    return parsed.data
  }
  return body as T
}

export const http = {
  get: <T>(path: string, opts?: RequestOptions<T>) => request<T>('GET', path, opts),
  post: <T>(path: string, body?: unknown, opts?: RequestOptions<T>) => request<T>('POST', path, { ...opts, body: body ?? {} }),
  put: <T>(path: string, body: unknown, opts?: RequestOptions<T>) => request<T>('PUT', path, { ...opts, body }),
  patch: <T>(path: string, body: unknown, opts?: RequestOptions<T>) => request<T>('PATCH', path, { ...opts, body }),
  del: <T>(path: string, opts?: RequestOptions<T>) => request<T>('DELETE', path, opts),
}

/**
 * Field errors from an ApiError, keyed by field path without the leading 'body.'
 * (and without any of the given prefixes, e.g. 'inputs.' or 'case.').
 */
export function fieldErrors(err: unknown, stripPrefixes: string[] = []): Record<string, string[]> {
  const out: Record<string, string[]> = {}
  if (!(err instanceof ApiError)) return out
  for (const d of err.details) {
    let p = d.path.replace(/^body\.?/, '')
    for (const pre of stripPrefixes) {
      if (p.startsWith(pre)) {
        p = p.slice(pre.length)
        break
      }
    }
    ;(out[p] ??= []).push(d.message)
  }
  return out
}

/**
 * Field errors from a client-side check with a shared zod schema, keyed by field path the same
 * way as fieldErrors (optionally under a prefix such as 'search').
 */
export function issueErrors(issues: readonly { path: readonly PropertyKey[]; message: string }[], prefix: readonly string[] = []): Record<string, string[]> {
  const out: Record<string, string[]> = {}
  for (const i of issues) (out[[...prefix, ...i.path.map(String)].join('.')] ??= []).push(i.message)
  return out
}

/** A sentence for an alert: the message plus any details not shown on a field. */
export function errorText(err: unknown): string {
  if (err instanceof ApiError) {
    if (err.status === 403) return 'Not allowed: your role at this site does not permit this.'
    return err.message
  }
  if (err instanceof Error) return err.message
  return 'Something went wrong.'
}
