import { z } from 'zod'

// C0 controls (but tab, line feed, carriage return), DEL and C1 controls: never part of what a person means.
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/
const LINE_BREAK = /[\t\n\r]/

/**
 * The one rule for what people type (names, notes, free-text tackle): trimmed, at most `max`
 * characters, no NUL or other control characters; line breaks only where `multiline`.
 */
export function PersonText(max: number, what: string, opts: { multiline?: boolean } = {}) {
  return z
    .string({ error: `Give ${what} as text.` })
    .trim()
    .max(max, `Keep ${what} under ${max.toLocaleString('en-US')} characters.`)
    .refine((s) => !CONTROL.test(s), `Leave control characters out of ${what}.`)
    .refine((s) => opts.multiline || !LINE_BREAK.test(s), `Keep ${what} on one line.`)
}
