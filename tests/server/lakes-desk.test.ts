import { eq } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Polygon, Position } from '../../shared/geo/types'
import { RecomputeStatus, ShorelinePreview } from '../../shared/schemas/desk'
import { AuditPage } from '../../shared/schemas/audit'
import { banks, lakes } from '../../server/db/schema/index'
import { seedDemo } from '../../server/db/seed/index'
import { signedInAgent, testApp } from '../helpers/app'
import { createTestDb } from '../helpers/db'
import { diagonalStrips } from '../shared/geo/fixtures'

let ctx: Awaited<ReturnType<typeof createTestDb>>
let shoreline: Polygon

beforeAll(async () => {
  ctx = await createTestDb()
  await seedDemo(ctx.db)
  const [lake] = await ctx.db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
  shoreline = lake!.shoreline as Polygon
})
afterAll(() => ctx.drop())

const file = (doc: unknown) => Buffer.from(JSON.stringify(doc))
const feature = (geometry: unknown) => ({ type: 'Feature', properties: {}, geometry })
const shifted = (dLon: number): Polygon => ({
  type: 'Polygon',
  coordinates: shoreline.coordinates.map((ring) =>
    ring.map(([lon, lat]) => [lon + dLon, lat] as Position),
  ),
})
const lakeCount = async () => (await ctx.db.select().from(lakes)).length

async function settled(admin: Awaited<ReturnType<typeof signedInAgent>>, slug: string) {
  for (let i = 0; i < 100; i++) {
    const status = RecomputeStatus.parse(
      (await admin.get(`/api/admin/lakes/${slug}/recompute`).expect(200)).body,
    )
    if (status.finishedAt) return status
    await new Promise((r) => setTimeout(r, 50))
  }
  throw new Error('the recompute did not finish')
}

describe('outline uploads', () => {
  it('previews a good GeoJSON outline without saving it', async () => {
    const admin = await signedInAgent(testApp(ctx.db), ctx.db, 'outline@desk.test', 'admin')
    const res = await admin
      .post('/api/admin/lakes/shoreline-preview')
      .attach('file', file(feature(shoreline)), 'quillmere.geojson')
      .expect(200)
    const preview = ShorelinePreview.parse(res.body)
    expect(preview.stats.islands).toBeGreaterThanOrEqual(1)
    expect(preview.shoreline.coordinates).toEqual(shoreline.coordinates)
  })

  it('refuses bad files with a clear 4xx and changes nothing', async () => {
    const admin = await signedInAgent(testApp(ctx.db), ctx.db, 'badfiles@desk.test', 'admin')
    const before = await lakeCount()
    const bowTie: Position[] = [
      [-88.1, 35],
      [-88.0, 35.05],
      [-88.0, 35],
      [-88.1, 35.05],
      [-88.1, 35],
    ]
    const cases: [string, Buffer, string, number, RegExp][] = [
      ['not JSON', Buffer.from('{"type": "Polygon", '), 'lake.geojson', 400, /not JSON/],
      [
        'a line',
        file({
          type: 'LineString',
          coordinates: [
            [0, 0],
            [1, 1],
          ],
        }),
        'lake.geojson',
        400,
        /no Polygon/,
      ],
      [
        'two lakes',
        file({ type: 'FeatureCollection', features: [feature(shoreline), feature(shoreline)] }),
        'lake.geojson',
        400,
        /exactly one/,
      ],
      [
        'self-intersecting',
        file({ type: 'Polygon', coordinates: [bowTie] }),
        'lake.geojson',
        400,
        /crosses or touches itself/,
      ],
      ['wrong type', file(feature(shoreline)), 'lake.kml', 415, /geojson/],
      ['too large', Buffer.alloc(3 * 1024 * 1024, 32), 'lake.geojson', 413, /larger than/],
      ['path traversal', file(feature(shoreline)), '../../lake.geojson', 400, /plain file name/],
    ]
    for (const [what, body, name, status, message] of cases) {
      const res = await admin
        .post('/api/admin/lakes/quillmere/shoreline')
        // form-data's filepath (untyped in superagent) keeps the name whole instead of its last part.
        .attach('file', body, { filepath: name } as unknown as { filename: string })
      expect(res.status, what).toBe(status)
      expect(res.body.error.message, what).toMatch(message)
    }
    expect(await lakeCount()).toBe(before)
    const [lake] = await ctx.db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
    expect(lake!.shoreline).toEqual(shoreline)
    await admin.get('/api/admin/lakes/quillmere/recompute').expect(404)
  })
})

describe('heavy outlines', () => {
  it('checks 50,000 vertices of diagonal strips off the request thread: other requests go on', async () => {
    const app = testApp(ctx.db)
    const admin = await signedInAgent(app, ctx.db, 'strips@desk.test', 'admin')
    const order: string[] = []
    const preview = admin
      .post('/api/admin/lakes/shoreline-preview')
      .attach('file', file(feature(diagonalStrips(50_000))), 'strips.geojson')
      .then((res) => {
        order.push('preview')
        return res
      })
    await new Promise((r) => setTimeout(r, 100))
    const started = performance.now()
    await request(app).get('/api/health').expect(200)
    order.push('health')
    expect(performance.now() - started).toBeLessThan(300)
    const res = await preview
    expect(res.status).toBe(200)
    expect(ShorelinePreview.parse(res.body).stats.vertices).toBe(50_000)
    expect(order).toEqual(['health', 'preview'])
  }, 20_000)

  it('stops a check that runs past its time limit with a 503 that says so', async () => {
    const admin = await signedInAgent(
      testApp(ctx.db, { outlineCheckMs: 1 }),
      ctx.db,
      'slow@desk.test',
      'admin',
    )
    const res = await admin
      .post('/api/admin/lakes/shoreline-preview')
      .attach('file', file(feature(shoreline)), 'lake.geojson')
      .expect(503)
    expect(res.body.error.code).toBe('outline_check_timeout')
  })
})

describe('malformed uploads', () => {
  it('answers a multipart body cut short, a bad part header or no boundary with a 400', async () => {
    const app = testApp(ctx.db)
    const admin = await signedInAgent(app, ctx.db, 'multipart@desk.test', 'admin')
    const guide = await signedInAgent(app, ctx.db, 'multipart@guide.test', 'guide')
    const boundary = 'XyZ'
    const bodies = (file: string) => [
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${file}"\r\n\r\n{"type"`,
      `--${boundary}\r\nContent-Disposition form-data\r\n\r\nx\r\n--${boundary}--\r\n`,
    ]
    for (const [agent, path, file] of [
      [admin, '/api/admin/lakes/shoreline-preview', 'a.geojson'],
      [guide, '/api/guide/clients/import', 'a.csv'],
    ] as const) {
      for (const body of bodies(file)) {
        const res = await agent
          .post(path)
          .set('Content-Type', `multipart/form-data; boundary=${boundary}`)
          .send(body)
        expect(res.status, `${path}: ${body.slice(0, 40)}`).toBe(400)
        expect(res.body.error.code).toBe('bad_upload')
      }
      const res = await agent.post(path).set('Content-Type', 'multipart/form-data').send('x')
      expect(res.status, `${path}: no boundary`).toBe(400)
    }
  })
})

describe('lakes on the desk', () => {
  it('replaces an outline, recomputes every bank on the lake as a job, and flags banks left off the shore', async () => {
    const app = testApp(ctx.db)
    const admin = await signedInAgent(app, ctx.db, 'replace@desk.test', 'admin')
    const angler = await signedInAgent(app, ctx.db, 'banks@desk.test')
    const shore = shoreline.coordinates[0]!
    // A bank on Quillmere, whose outline is about to move.
    const bank = (
      await angler
        .post('/api/lakes/quillmere/banks')
        .send({ name: 'Point', points: [shore[10], shore[13]], cover: ['rock'] })
        .expect(201)
    ).body.id as string

    // The same outline again: the bank stays on the shore and keeps a table.
    await admin
      .post('/api/admin/lakes/quillmere/shoreline')
      .attach('file', file(feature(shoreline)), 'same.geojson')
      .expect(202)
    expect(await settled(admin, 'quillmere')).toMatchObject({
      total: 1,
      done: 1,
      detached: 0,
      error: null,
    })

    // Moved 2 km east: the bank's points are no longer on the shore.
    const started = RecomputeStatus.parse(
      (
        await admin
          .post('/api/admin/lakes/quillmere/shoreline')
          .attach('file', file(shifted(0.022)), 'moved.geojson')
          .expect(202)
      ).body,
    )
    expect(started.total).toBe(1)
    expect(await settled(admin, 'quillmere')).toMatchObject({ done: 1, detached: 1, error: null })
    const [row] = await ctx.db.select().from(banks).where(eq(banks.id, bank))
    expect(row!.detachedAt).not.toBeNull()
    // Its angler sees it flagged; saving it again on the new shore clears the flag.
    const listed = (await angler.get('/api/lakes/quillmere/banks').expect(200)).body.items
    expect(listed).toMatchObject([{ id: bank, detached: true }])
    const moved = shifted(0.022).coordinates[0]!
    const redrawn = await angler
      .put(`/api/lakes/quillmere/banks/${bank}`)
      .send({ name: 'Point', points: [moved[10], moved[13]], cover: ['rock'] })
      .expect(200)
    expect(redrawn.body.detached).toBe(false)
    const log = AuditPage.parse(
      (await admin.get('/api/admin/audit?action=lake.shoreline').expect(200)).body,
    )
    expect(log.items).toHaveLength(2)
  })

  it('creates and edits lakes, with a message per bad field, and audits both', async () => {
    const admin = await signedInAgent(testApp(ctx.db), ctx.db, 'lakes@desk.test', 'admin')
    const fields = {
      slug: 'marrowbend',
      name: 'Marrowbend Lake',
      region: 'Invented County',
      timeZone: 'America/Chicago',
      normalPoolM: '120',
    }
    const post = () => {
      const req = admin.post('/api/admin/lakes')
      for (const [k, v] of Object.entries(fields)) req.field(k, v)
      return req.attach('file', file(feature(shifted(0.5))), 'marrowbend.geojson')
    }
    expect((await post().expect(201)).body).toEqual({ slug: 'marrowbend' })
    expect((await post().expect(409)).body.error.fields.slug).toBeDefined()
    const bad = await admin
      .put('/api/admin/lakes/marrowbend')
      .send({ name: '', region: 'X', timeZone: 'Nowhere/Town', normalPoolM: 20000 })
      .expect(400)
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['name', 'normalPoolM', 'timeZone'])
    await admin
      .put('/api/admin/lakes/marrowbend')
      .send({
        name: 'Marrowbend Reservoir',
        region: 'Invented County',
        timeZone: 'America/Chicago',
        normalPoolM: 121,
      })
      .expect(200)
    await admin
      .put('/api/admin/lakes/atlantis')
      .send({ name: 'A', region: 'B', timeZone: 'UTC', normalPoolM: 1 })
      .expect(404)
    const log = AuditPage.parse((await admin.get('/api/admin/audit').expect(200)).body)
    expect(log.items.slice(0, 2).map((e) => e.action)).toEqual(['lake.edit', 'lake.create'])
  })
})

describe('junk the desk stores no more', () => {
  it('answers a normal pool of null, blank, true or a list with a field message, and stores nothing', async () => {
    const admin = await signedInAgent(testApp(ctx.db), ctx.db, 'junk@desk.test', 'admin')
    const [before] = await ctx.db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
    const lake = { name: before!.name, region: before!.region, timeZone: before!.timeZone }
    for (const normalPoolM of [null, '', '  ', true, [5], 'abc']) {
      const res = await admin.put('/api/admin/lakes/quillmere').send({ ...lake, normalPoolM })
      expect(res.status, JSON.stringify(normalPoolM)).toBe(400)
      expect(res.body.error.fields.normalPoolM).toMatch(/normal pool/i)
    }
    const [after] = await ctx.db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
    expect(after!.normalPoolM).toBe(before!.normalPoolM)
    // A form field's text still counts as the number it spells.
    await admin
      .put('/api/admin/lakes/quillmere')
      .send({ ...lake, normalPoolM: ' 151.5 ' })
      .expect(200)
    const [edited] = await ctx.db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
    expect(edited!.normalPoolM).toBe(151.5)
  })
})
