import express from 'express'
import { pino } from 'pino'
import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { DomainError } from '../../shared/errors'
import {
  conflict,
  errorHandler,
  forbidden,
  invalid,
  noRoute,
  notFound,
  unauthenticated,
} from '../../server/http/errors'

/** An app whose routes each throw one error, answered by the real error handler. */
function throwing(errors: Record<string, () => Error>) {
  const app = express()
  for (const [path, make] of Object.entries(errors))
    app.get(`/${path}`, () => {
      throw make()
    })
  app.use(noRoute)
  app.use(errorHandler(pino({ level: 'silent' })))
  return app
}

describe('the error factories', () => {
  const app = throwing({
    lake: () => notFound('lake'),
    outline: () => notFound('recompute', 'This lake has had no new outline yet.'),
    field: () => invalid('lakeSlug', 'No such lake.'),
    taken: () => conflict('slug_taken', 'Another lake has that slug.', 'slug'),
    ended: () => conflict('link_ended', 'This link has ended.'),
    signin: () => unauthenticated(),
    role: () => forbidden(),
    domain: () =>
      new DomainError('invalid_geometry', 'A bank must be at least 1 m long.', 'points'),
    bare: () => new DomainError('invalid_series', 'Too few samples.'),
  })
  it.each([
    ['lake', 404, { code: 'not_found', message: 'No such lake.' }],
    ['outline', 404, { code: 'not_found', message: 'This lake has had no new outline yet.' }],
    [
      'field',
      400,
      {
        code: 'invalid_input',
        message: 'Some fields need attention.',
        fields: { lakeSlug: 'No such lake.' },
      },
    ],
    [
      'taken',
      409,
      {
        code: 'slug_taken',
        message: 'Another lake has that slug.',
        fields: { slug: 'Another lake has that slug.' },
      },
    ],
    ['ended', 409, { code: 'link_ended', message: 'This link has ended.' }],
    ['signin', 401, { code: 'unauthenticated', message: 'Sign in to continue.' }],
    ['role', 403, { code: 'forbidden', message: 'Your account cannot do this.' }],
    [
      'domain',
      400,
      {
        code: 'invalid_input',
        message: 'Some fields need attention.',
        fields: { points: 'A bank must be at least 1 m long.' },
      },
    ],
  ])('answer /%s with %i and the one error shape', async (path, status, error) => {
    const res = await request(app).get(`/${path}`).expect(status)
    expect(res.body).toEqual({ error })
  })

  it('leave a DomainError that names no field of the request a server error', async () => {
    const res = await request(app).get('/bare').expect(500)
    expect(res.body.error.code).toBe('internal')
  })
})
