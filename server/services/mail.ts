import nodemailer, { type Transporter } from 'nodemailer'
import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../db/sequelize.ts'
import { config } from '../config.ts'
import { logger } from '../logger.ts'
import { MailMessage } from '../db/models/index.ts'

/**
 * Outgoing e-mail. An action stores its messages in mail_messages inside its own transaction;
 * delivery happens afterwards, in the background, so sending never blocks or breaks the action.
 * Failures are logged and retried with back-off up to MAX_ATTEMPTS.
 */
export const MAX_ATTEMPTS = 5

let transporter: Transporter | null = null
let smtpPortOverride: number | null = null

export function setSmtpPort(port: number): void {
  smtpPortOverride = port
  transporter = null
}

function transport(): Transporter {
  transporter ??= nodemailer.createTransport({
    host: config.SMTP_HOST,
    port: smtpPortOverride ?? config.SMTP_PORT,
    secure: config.SMTP_SECURE === 'true',
    ignoreTLS: config.MAIL_MODE === 'fake',
    auth: config.SMTP_USER ? { user: config.SMTP_USER, pass: config.SMTP_PASSWORD ?? '' } : undefined,
    connectionTimeout: 5000,
    greetingTimeout: 5000,
    socketTimeout: 10000,
  })
  return transporter
}

export interface Mail {
  to: string
  subject: string
  body: string
}

/**
 * Queue messages in the action's own transaction. Every replica queues, whatever its MAIL_MODE:
 * a replica with mail 'off' only does not send; the sending replica(s) deliver the queue.
 */
export async function enqueue(mails: Mail[], transaction?: Transaction): Promise<void> {
  if (!mails.length) return
  await MailMessage.bulkCreate(
    mails.map((m) => ({ toAddress: m.to, subject: m.subject.slice(0, 250), body: m.body, lastError: null, sentAt: null })),
    { transaction },
  )
}

/** How long a sender holds the messages it took; after that (a sender that died) another may take them. */
export const LEASE_MS = 60_000
const BATCH = 20

let queue: Promise<void> = Promise.resolve()

/**
 * Deliver what is due; safe to call often and from any number of processes. Passes run one after
 * another, so the promise a caller gets settles after a pass that started after the call (and saw
 * its messages).
 */
export function kick(): Promise<void> {
  if (config.MAIL_MODE === 'off') return Promise.resolve()
  queue = queue.then(deliverDue, deliverDue)
  return queue
}

/**
 * Take up to BATCH due messages for this sender: rows another sender holds are skipped
 * (SELECT ... FOR UPDATE SKIP LOCKED) and the ones taken get a lease in the same transaction, so
 * each message is delivered by exactly one sender. Back-off: attempt n waits 2^n * 5 s.
 */
async function claimDue(): Promise<MailMessage[]> {
  return sequelize.transaction(async (transaction) => {
    const now = new Date()
    const rows = await sequelize.query<{ id: number }>(
      `SELECT id FROM mail_messages
        WHERE status = 'pending' AND attempts < :max
          AND (claimed_until IS NULL OR claimed_until < :now)
          AND (attempts = 0 OR updated_at <= :now - INTERVAL (POW(2, attempts) * 5) SECOND)
        ORDER BY id LIMIT ${BATCH}
        FOR UPDATE SKIP LOCKED`,
      { replacements: { max: MAX_ATTEMPTS, now }, type: QueryTypes.SELECT, transaction },
    )
    const ids = rows.map((r) => r.id)
    if (!ids.length) return []
    await MailMessage.update({ claimedUntil: new Date(now.getTime() + LEASE_MS) }, { where: { id: ids }, transaction, silent: true })
    return MailMessage.findAll({ where: { id: ids }, order: [['id', 'ASC']], transaction })
  })
}

async function deliverDue(): Promise<void> {
  for (;;) {
    const taken = await claimDue()
    if (!taken.length) return
    for (const m of taken) {
      try {
        await transport().sendMail({ from: config.MAIL_FROM, to: m.toAddress, subject: m.subject, text: m.body })
        await m.update({ status: 'sent', sentAt: new Date(), attempts: m.attempts + 1, lastError: null, claimedUntil: null })
      } catch (err) {
        const attempts = m.attempts + 1
        logger.warn({ err, mailId: m.id, attempts }, 'mail delivery failed')
        await m.update({ attempts, lastError: err instanceof Error ? err.message : String(err), status: attempts >= MAX_ATTEMPTS ? 'failed' : 'pending', claimedUntil: null })
      }
    }
    if (taken.length < BATCH) return
  }
}

let timer: NodeJS.Timeout | null = null
/** Retry loop for the running server (not used by tests, which call kick()). */
export function startMailLoop(intervalMs = 15000): void {
  if (timer || config.MAIL_MODE === 'off') return
  timer = setInterval(() => void kick().catch((err: unknown) => logger.error({ err }, 'mail loop failed')), intervalMs)
  timer.unref()
}

export function stopMailLoop(): void {
  if (timer) clearInterval(timer)
  timer = null
}

/** After a committed action: deliver in the background, never throwing into the request. */
export function deliverSoon(): void {
  setImmediate(() => void kick().catch((err: unknown) => logger.error({ err }, 'mail delivery pass failed')))
}

export function linkTo(path: string): string {
  const base = config.PUBLIC_URL ?? `http://${config.HOST}:${config.PORT}`
  return `${base.replace(/\/$/, '')}${path}`
}
