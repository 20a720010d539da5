import type { AddressInfo } from 'node:net'
import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'
import type { CaughtMail } from '../../../shared/schemas/brief'

/** How the fake refuses mail, so tests can see retries and recorded failures. */
export interface MailControls {
  /** Recipients refused at RCPT TO: 451 (try again later) or 550 (no such mailbox). */
  refuse: Map<string, 'temporary' | 'permanent'>
  /** The next this many messages are refused with 451 after their data arrives. */
  failNext: number
  /** How long each message waits for its 250 reply: time for a test to kill the sender mid-send. */
  stallMs: number
}

function smtpError(code: number, message: string) {
  return Object.assign(new Error(message), { responseCode: code })
}

/**
 * The local stand-in for a hosted SMTP service: accepts mail on 127.0.0.1 without TLS or auth,
 * parses each message and keeps the latest `keep` in memory for tests and the development inbox.
 * Port 0 picks a free one (tests).
 */
export async function startMailServer(opts: { port?: number; keep?: number } = {}) {
  const keep = opts.keep ?? 500
  const caught: CaughtMail[] = []
  let nextId = 1
  const controls: MailControls = { refuse: new Map(), failNext: 0, stallMs: 0 }
  // Sessions whose client went away: a message not yet acknowledged with 250 is not delivered.
  const closed = new Set<string>()

  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: 2 * 1024 * 1024,
    onRcptTo(address, _session, callback) {
      const refusal = controls.refuse.get(address.address.toLowerCase())
      if (refusal === 'temporary') return callback(smtpError(451, 'Mailbox busy, try again later'))
      if (refusal === 'permanent') return callback(smtpError(550, 'No such mailbox'))
      callback()
    },
    onClose(session) {
      closed.add(session.id)
    },
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          if (controls.stallMs) await new Promise((r) => setTimeout(r, controls.stallMs))
          if (closed.has(session.id)) return callback(smtpError(421, 'Client went away'))
          if (controls.failNext > 0) {
            controls.failNext--
            return callback(smtpError(451, 'Temporary local problem, try again later'))
          }
          caught.unshift({
            id: nextId++,
            receivedAt: new Date().toISOString(),
            from: parsed.from?.text ?? '',
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
            headers: Object.fromEntries(
              parsed.headerLines.map((h) => [
                h.key,
                h.line
                  .slice(h.line.indexOf(':') + 1)
                  .replace(/\r?\n\s+/g, ' ')
                  .trim(),
              ]),
            ),
          })
          caught.length = Math.min(caught.length, keep)
          callback()
        })
        .catch((err: Error) => callback(err))
    },
  })

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(opts.port ?? 0, '127.0.0.1', () => resolve())
  })
  const port = (server.server.address() as AddressInfo).port
  return {
    url: `smtp://127.0.0.1:${port}`,
    controls,
    /** Newest first. */
    messages: (): readonly CaughtMail[] => caught,
    message: (id: number) => caught.find((m) => m.id === id),
    clear: () => {
      caught.length = 0
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  }
}
export type MailServer = Awaited<ReturnType<typeof startMailServer>>
