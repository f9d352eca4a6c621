import type { Request, RequestHandler } from 'express'
import { publicUrlIsHttps, type Config } from '../config.ts'
import { ForbiddenError } from '../errors.ts'

/**
 * Served over https? Either the published address is https (PUBLIC_URL) or the request came in
 * over TLS, directly or through a trusted proxy's X-Forwarded-Proto (see TRUST_PROXY; Express
 * only believes the header from a proxy it trusts).
 */
export function isHttps(req: Request, cfg: Pick<Config, 'PUBLIC_URL'>): boolean {
  return publicUrlIsHttps(cfg) || req.secure
}

/** Strict-Transport-Security on every answer served over https, one year, subdomains included. */
export function hsts(cfg: Config): RequestHandler {
  return (req, res, next) => {
    if (isHttps(req, cfg)) res.set('Strict-Transport-Security', 'max-age=31536000; includeSubDomains')
    next()
  }
}

/** API answers are personal and change: no cache keeps them. */
export const noStore: RequestHandler = (_req, res, next) => {
  res.set('Cache-Control', 'no-store')
  next()
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS'])

/** The app's own origin: PUBLIC_URL's when set, else the one the request was addressed to. */
export function ownOrigins(req: Request, cfg: Pick<Config, 'PUBLIC_URL' | 'TRUSTED_ORIGINS'>): Set<string> {
  const out = new Set<string>()
  if (cfg.PUBLIC_URL) {
    try {
      out.add(new URL(cfg.PUBLIC_URL).origin)
    } catch {
      // config validation keeps PUBLIC_URL a string only; an unparsable one adds nothing
    }
  }
  const host = req.get('host')
  if (host) out.add(`${req.protocol}://${host}`)
  for (const o of cfg.TRUSTED_ORIGINS.split(',').map((s) => s.trim()).filter(Boolean)) out.add(o.replace(/\/$/, ''))
  return out
}

/**
 * Cross-site request check for writes authenticated by the session cookie: the browser's Origin
 * must be the app's own, or, without Origin, Sec-Fetch-Site must say same-origin (or none: typed
 * by the person). Requests with a Bearer token are not sent by browsers on their own and pass.
 */
export function assertSameOriginWrite(req: Request, cfg: Pick<Config, 'PUBLIC_URL' | 'TRUSTED_ORIGINS'>): void {
  if (SAFE_METHODS.has(req.method)) return
  const origin = req.get('origin')
  if (origin !== undefined) {
    if (origin !== 'null' && ownOrigins(req, cfg).has(origin.replace(/\/$/, ''))) return
    throw new ForbiddenError('Cross-site request refused: this change must come from the app itself.')
  }
  const site = req.get('sec-fetch-site')
  if (site !== undefined && site !== 'same-origin' && site !== 'none') {
    throw new ForbiddenError('Cross-site request refused: this change must come from the app itself.')
  }
}
