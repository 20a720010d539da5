import { Writable } from 'node:stream'
import { eq, sql } from 'drizzle-orm'
import express from 'express'
import { pino } from 'pino'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { clients, stations } from '../../server/db/schema/index'
import { seedDemo } from '../../server/db/seed/index'
import { errorHandler, loggableError } from '../../server/http/errors'
import { signedInAgent, testApp } from '../helpers/app'
import { createTestDb } from '../helpers/db'

let ctx: Awaited<ReturnType<typeof createTestDb>>
let shore: [number, number][]
beforeAll(async () => {
  ctx = await createTestDb()
  await seedDemo(ctx.db)
  const [lake] = await ctx.db
    .execute<{ shoreline: { coordinates: [number, number][][] } }>(
      sql`select shoreline from lakes where slug = 'quillmere'`,
    )
    .then((r) => r.rows)
  shore = lake!.shoreline.coordinates[0]!
})
afterAll(() => ctx.drop())

const NUL = 'a\u0000b'
const ANSI = '\u001b[31mred\u001b[0m'
const RTL = 'trip\u202Egnp.exe'

describe("people's text", () => {
  it('refuses NUL, ANSI escapes and bidi overrides in every field that reaches PostgreSQL with a 400, never a 500', async () => {
    const app = testApp(ctx.db)
    const admin = await signedInAgent(app, ctx.db, 'admin@text.test', 'admin')
    const guide = await signedInAgent(app, ctx.db, 'guide@text.test', 'guide')
    const [station] = await ctx.db.select().from(stations).limit(1)
    const trip = {
      lakeSlug: 'quillmere',
      date: new Date().toISOString().slice(0, 10),
      meetingTime: '06:00',
    }
    const bank = { points: [shore[10], shore[13]], cover: ['rock'] }
    const lake = {
      name: 'Quillmere',
      region: 'Hills',
      timeZone: 'America/Chicago',
      normalPoolM: 100,
    }
    const station0 = { name: 'Dam', lakeSlug: 'quillmere', feedThingId: 'x-1' }
    for (const bad of [NUL, ANSI, RTL]) {
      const attempts: [string, () => Promise<request.Response>][] = [
        ['lake search', () => guide.get(`/api/lakes?q=${encodeURIComponent(bad)}`)],
        ['user search', () => admin.get(`/api/admin/users?q=${encodeURIComponent(bad)}`)],
        ['audit filter', () => admin.get(`/api/admin/audit?action=${encodeURIComponent(bad)}`)],
        [
          'sign-up e-mail',
          () =>
            request(app)
              .post('/api/auth/signup')
              .send({ email: `${bad}@x.test`, password: 'long enough password' }),
        ],
        [
          'client name',
          () => guide.post('/api/guide/clients').send({ name: bad, email: 'c@text.test' }),
        ],
        [
          'client notes',
          () =>
            guide.post('/api/guide/clients').send({ name: 'C', email: 'c@text.test', notes: bad }),
        ],
        ['bank name', () => guide.post('/api/lakes/quillmere/banks').send({ ...bank, name: bad })],
        [
          'bank notes',
          () => guide.post('/api/lakes/quillmere/banks').send({ ...bank, name: 'B', notes: bad }),
        ],
        [
          'trip meeting point',
          () => guide.post('/api/guide/trips').send({ ...trip, meetingPoint: bad }),
        ],
        [
          'trip notes',
          () => guide.post('/api/guide/trips').send({ ...trip, meetingPoint: 'Ramp', notes: bad }),
        ],
        [
          'trip tackle',
          () => guide.post('/api/guide/trips').send({ ...trip, meetingPoint: 'Ramp', tackle: bad }),
        ],
        ['lake name', () => admin.put('/api/admin/lakes/quillmere').send({ ...lake, name: bad })],
        [
          'lake region',
          () => admin.put('/api/admin/lakes/quillmere').send({ ...lake, region: bad }),
        ],
        ['station name', () => admin.post('/api/admin/stations').send({ ...station0, name: bad })],
        [
          'station edit',
          () => admin.put(`/api/admin/stations/${station!.id}`).send({ ...station0, name: bad }),
        ],
      ]
      for (const [what, attempt] of attempts) {
        const res = await attempt()
        expect(res.status, `${what}: ${JSON.stringify(bad)}`).toBe(400)
      }
    }
    // A CSV of clients with a NUL in a name: reported, nothing stored, on preview and commit.
    for (const commit of [false, true]) {
      const res = await guide
        .post(`/api/guide/clients/import?commit=${commit}`)
        .attach('file', Buffer.from(`name,email\nDana${'\u0000'}Reel,dana@text.test\n`), 'c.csv')
      expect(res.status, `commit ${commit}`).toBe(commit ? 400 : 200)
      if (!commit) expect(res.body.rows[0].errors.name).toMatch(/control characters/)
    }
    expect(await ctx.db.$count(clients)).toBe(0)
    // A readings CSV with a NUL in a cell: reported, not a 500.
    const readings = await admin
      .post(`/api/admin/stations/${station!.id}/readings?commit=true`)
      .attach(
        'file',
        Buffer.from(
          `parameter,observed_at,value,unit\nwater_temp,2025-05-01T00:00:00Z,1${'\u0000'}2,degC\n`,
        ),
        'r.csv',
      )
    expect(readings.status).toBe(200)
    expect(readings.body.rows[0].reason).toMatch(/control characters/)
  })

  it('keeps line breaks in notes, trims, and stores names in NFC', async () => {
    const guide = await signedInAgent(testApp(ctx.db), ctx.db, 'nfc@text.test', 'guide')
    const res = await guide
      .post('/api/guide/clients')
      .send({ name: '  Rene\u0301e  ', email: 'renee@text.test', notes: 'Line one\nLine two' })
      .expect(201)
    expect(res.body.name).toBe('Ren\u00e9e')
    expect(res.body.notes).toBe('Line one\nLine two')
    const [row] = await ctx.db.select().from(clients).where(eq(clients.email, 'renee@text.test'))
    expect(row!.name).toBe('Ren\u00e9e')
    await guide
      .post('/api/guide/clients')
      .send({ name: 'Two\nlines', email: 'two@text.test' })
      .expect(400)
  })
})

describe('error logs', () => {
  it('name a failed query without its values, and answer text PostgreSQL refuses with a 400', async () => {
    const email = 'private.client@text.test'
    const err = await ctx.db.execute(sql`select ${`${email}\u0000`}::text as t`).then(
      () => null,
      (e: unknown) => e,
    )
    expect(err).not.toBeNull()
    const logged = JSON.stringify(loggableError(err))
    expect(logged).not.toContain(email)
    expect(logged).toMatch(/22021/)

    const lines: string[] = []
    const sink = new Writable({
      write(chunk, _enc, done) {
        lines.push(String(chunk))
        done()
      },
    })
    const app = express()
    app.get('/boom', () => {
      throw err
    })
    app.use(errorHandler(pino({ level: 'info' }, sink)))
    const res = await request(app).get('/boom').expect(400)
    expect(res.body.error.code).toBe('invalid_text')
    expect(lines.join('')).not.toContain(email)
  })
})
