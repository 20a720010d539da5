import type { RequestHandler } from 'express'
import { type z } from 'zod'
import { fieldMessages, invalidFields } from './errors'

interface Schemas {
  body?: z.ZodType
  query?: z.ZodType
  params?: z.ZodType
}

/**
 * Parses body, query and params with the shared schemas and replaces them with the parsed values,
 * so handlers read typed, trimmed, defaulted input. All failures are reported together.
 */
export function validate(schemas: Schemas): RequestHandler {
  return (req, _res, next) => {
    const fields: Record<string, string> = {}
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part]
      if (!schema) continue
      const result = schema.safeParse(req[part] ?? {})
      if (result.success) {
        // Express 5 exposes req.query as a getter, so it is redefined rather than assigned.
        Object.defineProperty(req, part, { value: result.data, writable: true, configurable: true })
      } else {
        Object.assign(fields, fieldMessages(result.error))
      }
    }
    if (Object.keys(fields).length) {
      throw invalidFields(fields)
    }
    next()
  }
}

/** The parsed value of a validated request part, typed by its schema. */
export function input<S extends z.ZodType>(_schema: S, value: unknown): z.output<S> {
  return value as z.output<S>
}
