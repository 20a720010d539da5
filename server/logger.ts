import { pino, type Logger } from 'pino'

export type { Logger }

/** Cookies and credentials never reach a log line. */
export const REDACT = [
  'req.headers.cookie',
  'req.headers.authorization',
  'res.headers["set-cookie"]',
  '*.password',
  '*.passwordHash',
  '*.newPassword',
  '*.currentPassword',
  '*.token',
]

export function createLogger(level: string): Logger {
  return pino({ level, redact: { paths: REDACT, censor: '[redacted]' } })
}
