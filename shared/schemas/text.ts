import { z } from 'zod'

/**
 * Characters no one types into a name or a note: C0 and C1 controls (NUL, the ESC that starts an
 * ANSI escape, DEL), and the invisible marks that reorder text around them (bidi embeddings,
 * overrides and isolates). Tab and line breaks are kept apart: a note may hold them.
 */
// eslint-disable-next-line no-control-regex -- control characters are what it looks for
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F]/
const LINE = /[\t\n\r]/
const BIDI = /[\u061C\u200E\u200F\u202A-\u202E\u2066-\u2069]/
/** Half a character: text cut in the middle of a pair, which PostgreSQL would store as U+FFFD. */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/

/** Whether `text` is something a person typed: no control or bidi marks, line breaks only if `lines`. */
export function isPlainText(text: string, lines = false): boolean {
  return (
    !CONTROL.test(text) &&
    !BIDI.test(text) &&
    (lines || !LINE.test(text)) &&
    !LONE_SURROGATE.test(text)
  )
}

/**
 * People's text, as every name, note and search the API stores or looks up takes it: in Unicode
 * NFC, trimmed, and refused with a field message when it holds control characters (NUL, ANSI
 * escapes), bidi overrides, or, unless `lines`, line breaks and tabs. Chain `.min`, `.max`,
 * `.regex` and `.default` on it as on any string.
 */
export function PlainText(opts: { lines?: boolean; error?: string } = {}) {
  return z
    .string(opts.error ? { error: opts.error } : undefined)
    .normalize('NFC')
    .trim()
    .refine((s) => isPlainText(s, opts.lines), {
      error: opts.lines
        ? 'Leave out control characters and direction marks.'
        : 'Keep it to one line, without control characters or direction marks.',
    })
}
