import { QueryTypes } from 'sequelize'
import { sequelize } from '../db/sequelize.ts'
import { AppError, DB_RETRY_AFTER_SECONDS } from '../errors.ts'

/** 503 'unavailable' (with Retry-After from the error handler) when the database is unreachable. */
export class UnavailableError extends AppError {
  constructor(message = 'The database is not reachable just now; try again in a few seconds.') {
    super(503, 'unavailable', message, [{ path: 'database', message: 'does not answer' }])
  }
}

/** Resolves when the database answers a trivial query within 2 s; throws UnavailableError otherwise. */
export async function databaseReady(timeoutMs = 2000): Promise<void> {
  let timer: NodeJS.Timeout | undefined
  try {
    await Promise.race([
      sequelize.query('SELECT 1 AS ok', { type: QueryTypes.SELECT }),
      new Promise((_, reject) => {
        timer = setTimeout(() => reject(new Error('timeout')), timeoutMs)
      }),
    ])
  } catch {
    throw new UnavailableError()
  } finally {
    clearTimeout(timer)
  }
}

export { DB_RETRY_AFTER_SECONDS }
