import express, { type Express } from 'express'
import helmet from 'helmet'
import cookieParser from 'cookie-parser'
import { pinoHttp } from 'pino-http'
import path from 'node:path'
import fs from 'node:fs'
import { fileURLToPath } from 'node:url'
import { config as defaultConfig, trustProxyValue, type Config } from './config.ts'
import { hsts, noStore } from './middleware/transport-security.ts'
import { logger } from './logger.ts'
import { requestId } from './middleware/request-id.ts'
import { unitSystem } from './middleware/unit-system.ts'
import { staticClient, clientFallback } from './middleware/static-client.ts'
import { errorHandler, notFound } from './middleware/error-handler.ts'
import { newRouter } from './routes/define.ts'
import { identityRoutes } from './routes/identity.ts'
import { associate } from './db/associations.ts'
import { registerFeatureRoutes } from './routes/index.ts'
import { apiReference } from './api-reference.ts'

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..')

/** The whole HTTP application, without listening: tests use it in-process. */
export function createApp(overrides: Partial<Config> = {}): Express {
  const cfg: Config = { ...defaultConfig, ...overrides }
  associate()
  const app = express()
  app.disable('x-powered-by')
  app.locals.cfg = cfg
  // Forwarded headers are believed only from the proxies TRUST_PROXY names (none by default).
  app.set('trust proxy', trustProxyValue(cfg.TRUST_PROXY))
  app.use(requestId)
  app.use('/api', noStore)
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'default-src': ["'self'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'style-src': ["'self'", "'unsafe-inline'"],
          'font-src': ["'self'", 'data:'],
          'script-src': ["'self'"],
          'connect-src': ["'self'"],
          // Served over plain HTTP on loopback by default; a TLS proxy in front may add it back.
          'upgrade-insecure-requests': null,
        },
      },
      // Sent by hsts() below whenever the app is served over https, whatever NODE_ENV says.
      strictTransportSecurity: false,
    }),
  )
  app.use(hsts(cfg))
  app.use(pinoHttp({ logger, genReqId: (req) => (req as express.Request).id, autoLogging: { ignore: (req) => req.url === '/api/v1/health' } }))
  app.use(express.json({ limit: '512kb' }))
  app.use('/api', unitSystem)
  app.use(cookieParser())

  const api = newRouter()
  identityRoutes(api, cfg)
  registerFeatureRoutes(api, cfg)
  app.use('/api/v1/docs', apiReference())
  app.use('/api/v1', api)
  app.use('/api', notFound)

  const dist = path.join(root, 'dist')
  if (fs.existsSync(path.join(dist, 'index.html'))) {
    app.use(...staticClient(dist))
    app.get('/{*splat}', clientFallback(dist))
  }
  app.use(notFound)
  app.use(errorHandler)
  return app
}
