/** Development outbox: mail captured by the local mail server and the delivery queue (system admins). */
import type { CapturedMail, QueuedMail, OutboxView } from '@shared/schemas/answers.ts'
import { http } from './http.ts'

export type { CapturedMail, QueuedMail, OutboxView }

export const outboxApi = {
  get: (opts?: { quiet401?: boolean }): Promise<OutboxView> => http.get('/outbox', { quiet401: opts?.quiet401 }),
}
