/**
 * Serving the built client: the precompressed copy the browser accepts with its Content-Encoding,
 * hashed files cached as immutable, index.html revalidated. Rules: RFC 9110 (Content-Encoding,
 * Vary), RFC 8246 (immutable); the product's caching rule for hashed file names.
 */
import { describe, expect, it, beforeAll, afterAll } from 'vitest'
import express from 'express'
import request from 'supertest'
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { brotliCompressSync, gzipSync, brotliDecompressSync } from 'node:zlib'
import { staticClient, clientFallback } from '../../server/middleware/static-client.ts'

const dir = mkdtempSync(join(tmpdir(), 'scrubwright-dist-'))
const js = 'export const answer = 42;\n'.repeat(200)
let app: express.Express

beforeAll(() => {
  mkdirSync(join(dir, 'assets'))
  writeFileSync(join(dir, 'index.html'), '<!doctype html><title>x</title>')
  writeFileSync(join(dir, 'assets/app-AbC123.js'), js)
  writeFileSync(join(dir, 'assets/app-AbC123.js.br'), brotliCompressSync(js))
  writeFileSync(join(dir, 'assets/app-AbC123.js.gz'), gzipSync(js))
  writeFileSync(join(dir, 'assets/small-Zz9.css'), 'a{}')
  app = express()
  app.use(...staticClient(dir))
  app.get('/{*splat}', clientFallback(dir))
})
afterAll(() => rmSync(dir, { recursive: true, force: true }))

describe('built client', () => {
  it('brotli when accepted, with the JavaScript type, Vary and immutable caching', async () => {
    const r = await request(app).get('/assets/app-AbC123.js').set('Accept-Encoding', 'gzip, deflate, br').buffer(true).parse((res, cb) => {
      const parts: Buffer[] = []
      res.on('data', (c: Buffer) => parts.push(c))
      res.on('end', () => cb(null, Buffer.concat(parts)))
    })
    expect(r.status).toBe(200)
    expect(r.headers['content-encoding']).toBe('br')
    expect(r.headers['content-type']).toMatch(/javascript/)
    expect(r.headers['vary']).toMatch(/Accept-Encoding/i)
    expect(r.headers['cache-control']).toBe('public, max-age=31536000, immutable')
    // the client library may inflate brotli itself; either way the content is the file
    const body = r.body as Buffer
    expect(body.toString() === js ? js : brotliDecompressSync(body).toString()).toBe(js)
  })
  it('gzip when only gzip is accepted; the plain file otherwise', async () => {
    const g = await request(app).get('/assets/app-AbC123.js').set('Accept-Encoding', 'gzip')
    expect(g.headers['content-encoding']).toBe('gzip')
    expect(g.text).toBe(js) // supertest inflates gzip
    const p = await request(app).get('/assets/small-Zz9.css').set('Accept-Encoding', 'identity')
    expect(p.headers['content-encoding']).toBeUndefined()
    expect(p.headers['cache-control']).toBe('public, max-age=31536000, immutable')
  })
  it('index.html and client routes are revalidated every time', async () => {
    for (const path of ['/index.html', '/portfolio']) {
      const r = await request(app).get(path)
      expect(r.status).toBe(200)
      expect(r.headers['cache-control']).toBe('no-cache')
      expect(r.text).toContain('<title>x</title>')
    }
  })
})
