import { createRequire } from 'node:module'
import path from 'node:path'
import express, { type Router } from 'express'

/**
 * The browsable API reference at /api/v1/docs/: the swagger-ui-dist package served from
 * node_modules (nothing from a CDN), reading the generated /api/v1/openapi.json.
 */
const assets = path.dirname(createRequire(import.meta.url).resolve('swagger-ui-dist/package.json'))

const PAGE = `<!doctype html>
<html lang="en">
  <head>
    <meta charset="utf-8">
    <title>Scrubwright API reference</title>
    <link rel="stylesheet" href="./swagger-ui.css">
  </head>
  <body>
    <div id="api-reference"></div>
    <script src="./swagger-ui-bundle.js"></script>
    <script src="./reference-init.js"></script>
  </body>
</html>
`

const INIT = `window.addEventListener('load', function () {
  window.ui = SwaggerUIBundle({
    url: '../openapi.json',
    dom_id: '#api-reference',
    deepLinking: true,
    layout: 'BaseLayout',
    withCredentials: true,
  })
})
`

export function apiReference(): Router {
  const router = express.Router()
  router.get('/', (req, res) => {
    // Relative asset addresses need the trailing slash.
    if (!req.originalUrl.split('?')[0]!.endsWith('/')) {
      res.redirect(301, `${req.baseUrl}/`)
      return
    }
    res.type('html').set('Cache-Control', 'no-cache').send(PAGE)
  })
  router.get('/reference-init.js', (_req, res) => {
    res.type('application/javascript').set('Cache-Control', 'no-cache').send(INIT)
  })
  router.use(express.static(assets, { index: false, maxAge: '1d' }))
  return router
}
