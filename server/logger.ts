import { pino } from 'pino'
import { config } from './config.ts'

/** Structured JSON logs (one line per event) on stdout. */
export const logger = pino({
  level: config.NODE_ENV === 'test' && !process.env.LOG_LEVEL ? 'silent' : config.LOG_LEVEL,
  base: { service: 'scrubwright' },
  redact: ['req.headers.authorization', 'req.headers.cookie', 'res.headers["set-cookie"]'],
})
