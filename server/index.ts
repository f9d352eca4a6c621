import { createApp } from './app.ts'
import { config } from './config.ts'
import { logger } from './logger.ts'
import { sequelize } from './db/sequelize.ts'
import { startFakeSmtp } from './mail/fake-smtp.ts'
import { startMailLoop, stopMailLoop, kick } from './services/mail.ts'
import { warmOptimisePool, stopOptimisePool } from './services/optimise-pool.ts'

// Development and tests: a local capture server stands in for the SMTP relay (see the Outbox page).
let fakeSmtp: { close: () => Promise<void> } | null = null
if (config.MAIL_MODE === 'fake') {
  try {
    fakeSmtp = await startFakeSmtp(config.SMTP_PORT, config.SMTP_HOST)
    logger.info({ port: config.SMTP_PORT }, 'fake SMTP server capturing mail')
  } catch (err) {
    logger.warn({ err }, 'fake SMTP server could not start; mail stays queued and is retried')
  }
}
startMailLoop(config.MAIL_POLL_MS)
void kick().catch(() => undefined)

warmOptimisePool()
const app = createApp()
const server = app.listen(config.PORT, config.HOST, (err?: Error) => {
  if (err) {
    logger.fatal({ err }, 'could not listen')
    process.exit(1)
  }
  logger.info({ url: `http://${config.HOST}:${config.PORT}` }, 'Scrubwright listening')
})

let stopping = false
async function shutdown(signal: string): Promise<void> {
  if (stopping) return
  stopping = true
  logger.info({ signal }, 'shutting down')
  const timer = setTimeout(() => process.exit(1), 10_000)
  stopMailLoop()
  server.close(async () => {
    await fakeSmtp?.close().catch(() => undefined)
    await stopOptimisePool().catch(() => undefined)
    await sequelize.close().catch(() => undefined)
    clearTimeout(timer)
    process.exit(0)
  })
  server.closeAllConnections?.()
}
process.on('SIGINT', () => void shutdown('SIGINT'))
process.on('SIGTERM', () => void shutdown('SIGTERM'))
