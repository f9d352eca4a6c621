import { createApp } from './app.ts'
import { config } from './config.ts'
import { logger } from './logger.ts'
import { sequelize } from './db/sequelize.ts'

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
  server.close(async () => {
    await sequelize.close().catch(() => undefined)
    clearTimeout(timer)
    process.exit(0)
  })
  server.closeAllConnections?.()
}
process.on('SIGINT', () => void shutdown('SIGINT'))
process.on('SIGTERM', () => void shutdown('SIGTERM'))
