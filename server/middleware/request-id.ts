import { randomUUID } from 'node:crypto'
import type { RequestHandler } from 'express'

/** Every request gets an id (or keeps a sane incoming one); it is echoed and logged. */
export const requestId: RequestHandler = (req, res, next) => {
  const incoming = req.get('x-request-id')
  const id = incoming && /^[\w-]{8,64}$/.test(incoming) ? incoming : randomUUID()
  req.requestId = id
  res.setHeader('X-Request-Id', id)
  next()
}
