import { randomUUID } from 'node:crypto'
import { SMTPServer } from 'smtp-server'
import { readMessage } from './mime-read'

export interface CaughtMail {
  id: string
  receivedAt: string
  /** Envelope recipients, as the SMTP client gave them. */
  recipients: string[]
  subject: string
  from: string
  to: string
  text: string
  html: string | null
}

export interface MailCatcher {
  host: string
  port: number
  /** Newest first. */
  messages(): CaughtMail[]
  clear(): void
  /** Resolves with the first message (already caught or still to come) that matches, or rejects after timeoutMs. */
  waitFor(match: (m: CaughtMail) => boolean, timeoutMs?: number): Promise<CaughtMail>
  stop(): Promise<void>
}

/** Messages kept; the oldest go first, so a long-running dev server does not grow without bound. */
export const CATCHER_LIMIT = 200
/** Largest message accepted (bytes): our mails are a few kB. */
const MAX_MESSAGE_BYTES = 1_000_000

/**
 * A local SMTP server that accepts anything on 127.0.0.1 and keeps it in memory, so development and
 * tests exercise the real SMTP path without sending mail anywhere.
 */
export async function startMailCatcher(limit = CATCHER_LIMIT): Promise<MailCatcher> {
  const kept: CaughtMail[] = []
  const waiters = new Set<{ match: (m: CaughtMail) => boolean; resolve: (m: CaughtMail) => void }>()

  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: MAX_MESSAGE_BYTES,
    rejectOversized: true,
    onData(stream, session, callback) {
      const chunks: Buffer[] = []
      stream.on('data', (c: Buffer) => chunks.push(c))
      stream.on('end', () => {
        const parsed = readMessage(Buffer.concat(chunks).toString('utf8'))
        const mail: CaughtMail = {
          id: randomUUID(),
          receivedAt: new Date().toISOString(),
          recipients: session.envelope.rcptTo.map((r) => r.address),
          subject: parsed.subject,
          from: parsed.from,
          to: parsed.to,
          text: parsed.text,
          html: parsed.html,
        }
        kept.unshift(mail)
        kept.splice(limit)
        for (const w of waiters) if (w.match(mail)) {
          waiters.delete(w)
          w.resolve(mail)
        }
        callback()
      })
    },
  })
  // Keep the catcher quiet: a client that hangs up mid-message is not our concern.
  server.on('error', () => {})

  await new Promise<void>((resolve, reject) => {
    server.server.once('error', reject)
    server.listen(0, '127.0.0.1', () => resolve())
  })
  const address = server.server.address()
  const port = typeof address === 'object' && address ? address.port : 0

  return {
    host: '127.0.0.1',
    port,
    messages: () => [...kept],
    clear: () => {
      kept.length = 0
    },
    waitFor(match, timeoutMs = 5_000) {
      const found = kept.find(match)
      if (found) return Promise.resolve(found)
      return new Promise((resolve, reject) => {
        const waiter = { match, resolve: (m: CaughtMail) => (clearTimeout(timer), resolve(m)) }
        const timer = setTimeout(() => {
          waiters.delete(waiter)
          reject(new Error(`no matching mail arrived within ${timeoutMs} ms`))
        }, timeoutMs)
        waiters.add(waiter)
      })
    },
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  }
}
