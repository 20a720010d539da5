import { Writable } from 'node:stream'
import { pino } from 'pino'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signLinkToken, tokenKey } from '../../server/features/auth/auth.tokens'
import { loggedPath } from '../../server/http/request-log'
import { TEST_SECRET, testApp } from '../helpers/app'
import { createTestDb } from '../helpers/db'

let ctx: Awaited<ReturnType<typeof createTestDb>>
const lines: string[] = []
const sink = new Writable({
  write(chunk, _enc, done) {
    lines.push(String(chunk))
    done()
  },
})

beforeAll(async () => {
  ctx = await createTestDb()
})
afterAll(() => ctx.drop())

describe('the request log', () => {
  it('writes no token from a share link, a mail link or a page path', async () => {
    const app = testApp(ctx.db, { logger: pino({ level: 'info' }, sink) })
    const token = await signLinkToken(tokenKey(TEST_SECRET), {
      purpose: 'trip-share',
      subject: '00000000-0000-4000-8000-000000000000',
    })
    await request(app).get(`/api/shared/trips/${token}`)
    await request(app).get(`/trip/${token}`)
    await request(app).get(`/api/shared/trips/not-even-a-token`)
    await request(app).post(`/api/brief/unsubscribe?token=${token}`)
    await request(app).get(`/verify-email/${token}`)
    const log = lines.join('')
    expect(lines.length).toBeGreaterThanOrEqual(5)
    expect(log).not.toContain(token)
    expect(log).not.toContain(token.split('.')[1]!)
    expect(log).not.toContain('not-even-a-token')
    expect(log).toContain('"path":"/api/shared/trips/:token"')
    expect(log).toContain('"path":"/trip/:token"')
  })

  it.each([
    ['/api/lakes/quillmere/read', '/api/lakes/quillmere/read'],
    ['/api/lakes/quillmere/plan/2025-05-01', '/api/lakes/quillmere/plan/2025-05-01'],
    ['/api/brief/unsubscribe?token=abc', '/api/brief/unsubscribe'],
    ['/api/shared/trips/abc.def', '/api/shared/trips/:token'],
    ['/assets/index-Ab12.Cd34.js', '/assets/index-Ab12.Cd34.js'],
  ])('logs %s as %s', (url, path) => {
    expect(loggedPath(url)).toBe(path)
  })
})
