import express, { type RequestHandler } from 'express'
import fs from 'node:fs'
import path from 'node:path'

/**
 * The built client (dist/): hashed files under /assets/ cached for a year as immutable,
 * index.html revalidated every time (no-cache), and for each file the precompressed copy the
 * browser accepts (name.br, else name.gz, made at build time) with its Content-Encoding.
 */
export function staticClient(dist: string): RequestHandler[] {
  const compressed = new Set<string>()
  const walk = (dir: string) => {
    for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
      const p = path.join(dir, e.name)
      if (e.isDirectory()) walk(p)
      else if (/\.(br|gz)$/.test(e.name)) compressed.add(path.relative(dist, p).split(path.sep).join('/'))
    }
  }
  walk(dist)

  const cacheFor = (urlPath: string) => (urlPath.startsWith('/assets/') ? 'public, max-age=31536000, immutable' : 'no-cache')

  const precompressed: RequestHandler = (req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return next()
    const rel = req.path.replace(/^\/+/, '')
    if (!rel || rel.includes('..')) return next()
    const accept = String(req.headers['accept-encoding'] ?? '')
    const enc = compressed.has(rel + '.br') && /\bbr\b/.test(accept) ? 'br' : compressed.has(rel + '.gz') && /\bgzip\b/.test(accept) ? 'gzip' : null
    res.setHeader('Vary', 'Accept-Encoding')
    if (!enc) return next()
    res.setHeader('Content-Encoding', enc)
    res.type(path.extname(rel))
    res.setHeader('Cache-Control', cacheFor(req.path))
    res.sendFile(path.join(dist, rel + (enc === 'br' ? '.br' : '.gz')), { cacheControl: false })
  }
  const plain = express.static(dist, {
    index: false,
    cacheControl: false,
    setHeaders: (res, file) => res.setHeader('Cache-Control', cacheFor('/' + path.relative(dist, file).split(path.sep).join('/'))),
  })
  return [precompressed, plain]
}

/** The single-page fallback: index.html, never cached without revalidation. */
export function clientFallback(dist: string): RequestHandler {
  return (req, res) => {
    res.setHeader('Cache-Control', 'no-cache')
    const accept = String(req.headers['accept-encoding'] ?? '')
    const file = path.join(dist, 'index.html')
    res.setHeader('Vary', 'Accept-Encoding')
    res.type('html')
    for (const [enc, ext] of [['br', '.br'], ['gzip', '.gz']] as const) {
      if (new RegExp(`\\b${enc}\\b`).test(accept) && fs.existsSync(file + ext)) {
        res.setHeader('Content-Encoding', enc)
        return res.sendFile(file + ext, { cacheControl: false })
      }
    }
    res.sendFile(file, { cacheControl: false })
  }
}
