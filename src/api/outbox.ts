/** Development outbox: mail captured by the local mail server and the delivery queue (system admins). */
import { http } from './http.ts'

export interface CapturedMail {
  id: number
  receivedAt: string
  from: string
  to: string[]
  subject: string
  text: string
}

export interface QueuedMail {
  id: number
  to: string
  subject: string
  status: string
  attempts: number
  lastError: string | null
  createdAt: string
  sentAt: string | null
}

export interface OutboxView {
  captured: CapturedMail[]
  queue: QueuedMail[]
}

export const outboxApi = {
  get: (opts?: { quiet401?: boolean }): Promise<OutboxView> => http.get('/outbox', { quiet401: opts?.quiet401 }),
}
