import { SMTPServer } from 'smtp-server'
import type { AddressInfo } from 'node:net'

/**
 * A local capture server for development and tests: accepts every message on loopback and keeps
 * it in memory for the Outbox page. Never used when MAIL_MODE is 'smtp'.
 */
export interface CapturedMail {
  id: number
  receivedAt: string
  from: string
  to: string[]
  subject: string
  text: string
}

const captured: CapturedMail[] = []
const MAX_KEPT = 500
let nextId = 1

export function capturedMail(): CapturedMail[] {
  return captured.slice().reverse()
}

export function clearCapturedMail(): void {
  captured.length = 0
}

function decodeQuotedPrintable(s: string): string {
  return s.replace(/=\r?\n/g, '').replace(/=([0-9A-F]{2})/gi, (_m, h: string) => String.fromCharCode(parseInt(h, 16)))
}

/** Minimal header and text extraction of a single-part text message as nodemailer writes it. */
export function parseMessage(raw: string): { subject: string; text: string } {
  const split = raw.search(/\r?\n\r?\n/)
  const head = split >= 0 ? raw.slice(0, split) : raw
  let body = split >= 0 ? raw.slice(split).replace(/^\r?\n\r?\n/, '') : ''
  const unfolded = head.replace(/\r?\n[ \t]+/g, ' ')
  const header = (name: string) => new RegExp(`^${name}:\\s*(.*)$`, 'im').exec(unfolded)?.[1]?.trim() ?? ''
  let subject = header('Subject')
  const enc = /^=\?utf-8\?([BQ])\?(.*)\?=$/i.exec(subject)
  if (enc) subject = enc[1]!.toUpperCase() === 'B' ? Buffer.from(enc[2]!, 'base64').toString('utf8') : decodeQuotedPrintable(enc[2]!.replace(/_/g, ' '))
  const cte = header('Content-Transfer-Encoding').toLowerCase()
  if (cte === 'quoted-printable') body = Buffer.from(decodeQuotedPrintable(body), 'latin1').toString('utf8')
  else if (cte === 'base64') body = Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8')
  return { subject, text: body.trim() }
}

export async function startFakeSmtp(port: number, host = '127.0.0.1'): Promise<{ port: number; close: () => Promise<void> }> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    banner: 'Scrubwright local mail capture',
    size: 1024 * 1024,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = []
      stream.on('data', (c: Buffer) => chunks.push(c))
      stream.on('end', () => {
        const { subject, text } = parseMessage(Buffer.concat(chunks).toString('utf8'))
        captured.push({
          id: nextId++,
          receivedAt: new Date().toISOString(),
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          to: session.envelope.rcptTo.map((r) => r.address),
          subject,
          text,
        })
        if (captured.length > MAX_KEPT) captured.shift()
        callback()
      })
    },
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, host, () => resolve())
  })
  const actual = (server.server.address() as AddressInfo).port
  return { port: actual, close: () => new Promise<void>((r) => server.close(() => r())) }
}
