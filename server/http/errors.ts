import type { ErrorRequestHandler, RequestHandler } from 'express'
import { z } from 'zod'
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

export const notFound: RequestHandler = (req, res) => {
  res.status(404).json(body('not_found', `No route for ${req.method} ${req.path}.`))
}

// Express recognises an error handler by its four parameters.
export const errorHandler =
  (logger: Logger): ErrorRequestHandler =>
  (err, req, res, _next) => {
    if (err instanceof HttpError) {
      res.status(err.status).json(body(err.code, err.message, err.fields))
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
    logger.error({ err, requestId: req.id }, 'unexpected error')
    res
      .status(500)
      .json(body('internal', `Something went wrong on our side (request ${String(req.id)}).`))
  }
