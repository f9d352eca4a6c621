import { MailMessage } from '../db/models/index.ts'
import { capturedMail } from '../mail/fake-smtp.ts'
import { NotFoundError } from '../errors.ts'

/** Development only: mail captured by the local fake mail server and the delivery queue (404 otherwise). */
export async function outbox(mailMode: string) {
  if (mailMode !== 'fake') throw new NotFoundError('Outbox')
  const queue = await MailMessage.findAll({ order: [['id', 'DESC']], limit: 200 })
  return {
    captured: capturedMail(),
    queue: queue.map((m) => ({
      id: m.id, to: m.toAddress, subject: m.subject, status: m.status, attempts: m.attempts, lastError: m.lastError,
      createdAt: m.createdAt.toISOString(), sentAt: m.sentAt ? m.sentAt.toISOString() : null,
    })),
  }
}
