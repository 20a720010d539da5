import type { ErrorRequestHandler, RequestHandler } from 'express'
import { z } from 'zod'
import { DomainError } from '../../shared/errors'
import type { Logger } from '../logger'
import type { ApiErrorBody } from '../../shared/schemas/errors'

/** Throw this anywhere below a route; the error handler turns it into the one error shape. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message)
    this.name = 'HttpError'
  }
}

/** 404 `not_found`: `notFound('lake')` answers "No such lake."; `message` says more where it helps. */
export const notFound = (thing: string, message = `No such ${thing}.`) =>
  new HttpError(404, 'not_found', message)

/** 400 `invalid_input` with one message per field, the answer a zod failure gets. */
export const invalidFields = (fields: Record<string, string>) =>
  new HttpError(400, 'invalid_input', 'Some fields need attention.', fields)

/** 400 `invalid_input` for one field: `invalid('lakeSlug', 'No such lake.')`. */
export const invalid = (field: string, message: string) => invalidFields({ [field]: message })

/** 409: the request clashes with what is stored; with `field`, the message is that field's too. */
export const conflict = (code: string, message: string, field?: string) =>
  new HttpError(409, code, message, field ? { [field]: message } : undefined)

/** 410: what a link named is gone for good (withdrawn, expired). */
export const gone = (code: string, message: string) => new HttpError(410, code, message)
/** A signed link (sign-up, address, unsubscribe) that is forged, changed or past its time. */
export const invalidLink = (fix: string) =>
  new HttpError(400, 'invalid_link', `This link is not valid or has expired. ${fix}`)

/** 503: the server cannot do this just now (a service down, too busy); the message says what to do. */
export const unavailable = (code: string, message: string, fields?: Record<string, string>) =>
  new HttpError(503, code, message, fields)

/** A refused file: the message, and the `file` field's (the message again unless `fix`); 400 unless `status`. */
export const badFile = (code: string, message: string, fix = message, status = 400) =>
  new HttpError(status, code, message, { file: fix })

/** 400 `bad_csv`: a CSV that cannot be imported as it is. */
export const badCsv = (message: string, fix: string) => badFile('bad_csv', message, fix)

/** 400 `bad_csv` for a header row that lacks `missing` of the file's `columns`. */
export const missingColumns = (missing: string[], columns: readonly string[]) =>
  badCsv(
    `The header row needs ${missing.join(', ')}.`,
    `The first row must name the columns: ${columns.join(', ')}.`,
  )

export const unauthenticated = () => new HttpError(401, 'unauthenticated', 'Sign in to continue.')
export const forbidden = () => new HttpError(403, 'forbidden', 'Your account cannot do this.')

/** zod issues as one message per field; nested paths are joined with dots. */
export function fieldMessages(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {}
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_'
    fields[key] ??= issue.message
  }
  return fields
}

function body(code: string, message: string, fields?: Record<string, string>): ApiErrorBody {
  return { error: fields ? { code, message, fields } : { code, message } }
}

/** The JSON 404 after the routes. */
export const noRoute: RequestHandler = (req, res) => {
  res.status(404).json(body('not_found', `No route for ${req.method} ${req.path}.`))
}

/**
 * The database (or another service a route calls) out of reach for a moment (a restart, a
 * failover, a dropped connection): PostgreSQL's connection-exception class (08) and shutdown codes
 * (57P01-57P03), the socket's own errors, and node-postgres's words for a connection that ended
 * under a query or could not be made in time.
 */
const DB_UNREACHABLE_CODES = /^(08...|57P0[123]|ECONNREFUSED|ECONNRESET|ETIMEDOUT|EPIPE|ENOTFOUND)$/
const DB_UNREACHABLE_WORDS =
  /^Connection terminated|is not queryable|timeout exceeded when trying to connect/

function outOfReach(err: unknown): boolean {
  for (let e = err, i = 0; isObject(e) && i < 4; e = e.cause, i++) {
    if (typeof e.code === 'string' && DB_UNREACHABLE_CODES.test(e.code)) return true
    if (typeof e.message === 'string' && DB_UNREACHABLE_WORDS.test(e.message)) return true
  }
  return false
}

/** PostgreSQL's codes for text it cannot store (NUL, a broken encoding): the request's fault. */
const UNSTORABLE_TEXT = new Set(['22021', '22P05'])

type ErrorLike = {
  name?: unknown
  message?: unknown
  stack?: unknown
  code?: unknown
  query?: unknown
  params?: unknown
  cause?: unknown
}
const isObject = (v: unknown): v is ErrorLike => typeof v === 'object' && v !== null

/** Text in double quotes, where PostgreSQL puts the values it could not take. */
const quoted = (message: unknown) => String(message ?? '').replace(/"[^"]*"/g, '"[redacted]"')

/**
 * An unexpected error as it may be logged: type, code, the SQL with its placeholders but never its
 * parameters, and only the stack's frames (a failed query's message holds the values, which may
 * be a client's e-mail or notes). PostgreSQL's own detail, which repeats values, is left out.
 */
export function loggableError(err: unknown, depth = 0): Record<string, unknown> {
  if (!isObject(err)) return { type: typeof err }
  const query = typeof err.query === 'string'
  const stack =
    typeof err.stack === 'string'
      ? err.stack
          .split('\n')
          .filter((line) => line.startsWith('    at '))
          .join('\n')
      : undefined
  const pg = typeof err.code === 'string' && /^[0-9A-Z]{5}$/.test(err.code)
  return {
    type: typeof err.name === 'string' ? err.name : 'Error',
    ...(typeof err.code === 'string' ? { code: err.code } : {}),
    message: query ? 'Failed query' : pg ? quoted(err.message) : String(err.message ?? ''),
    ...(query ? { query: err.query } : {}),
    ...(stack ? { stack } : {}),
    ...(isObject(err.cause) && depth < 3 ? { cause: loggableError(err.cause, depth + 1) } : {}),
  }
}

/** The PostgreSQL error code behind an error, through a failed query's cause. */
function pgCode(err: unknown): string | undefined {
  for (let e = err, i = 0; isObject(e) && i < 4; e = e.cause, i++)
    if (typeof e.code === 'string' && /^[0-9A-Z]{5}$/.test(e.code)) return e.code
  return undefined
}

// Express recognises an error handler by its four parameters.
export const errorHandler =
  (logger: Logger): ErrorRequestHandler =>
  (err, req, res, _next) => {
    if (err instanceof HttpError) {
      res.status(err.status).json(body(err.code, err.message, err.fields))
      return
    }
    // A shared computation refusing a field of the request (a bank's points) is the request's fault.
    if (err instanceof DomainError && err.field) {
      const http = invalid(err.field, err.message)
      res.status(http.status).json(body(http.code, http.message, http.fields))
      return
    }
    if (err instanceof z.ZodError) {
      res.status(400).json(body('invalid_input', 'Some fields need attention.', fieldMessages(err)))
      return
    }
    // body-parser marks its own errors with a status and a type.
    const status = typeof err?.status === 'number' ? err.status : 500
    if (err?.type === 'entity.too.large') {
      res.status(413).json(body('payload_too_large', 'The request body is too large.'))
      return
    }
    if (err?.type === 'entity.parse.failed') {
      res.status(400).json(body('invalid_json', 'The request body is not valid JSON.'))
      return
    }
    if (status >= 400 && status < 500) {
      res.status(status).json(body('bad_request', 'The request could not be read.'))
      return
    }
    if (UNSTORABLE_TEXT.has(pgCode(err) ?? '')) {
      logger.warn({ err: loggableError(err), requestId: req.id }, 'text the database refused')
      res.status(400).json(body('invalid_text', 'Some text holds characters we cannot store.'))
      return
    }
    if (outOfReach(err)) {
      // Said as such, so a client or a balancer tries again; a write it reports may or may not
      // have been stored (the answer to a commit can be what was lost).
      logger.warn(
        { err: loggableError(err), requestId: req.id },
        'the database or a service is out of reach',
      )
      res
        .status(503)
        .set('Retry-After', '5')
        .json(
          body('unavailable', 'The service is briefly unavailable. Try again in a few seconds.'),
        )
      return
    }
    logger.error({ err: loggableError(err), requestId: req.id }, 'unexpected error')
    res
      .status(500)
      .json(body('internal', `Something went wrong on our side (request ${String(req.id)}).`))
  }
