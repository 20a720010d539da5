import { and, eq, gte } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { LakeRead, LakeShape } from '../../shared/schemas/lake-read'
import { LakeSeries } from '../../shared/schemas/lake-series'
import { LakePage } from '../../shared/schemas/lakes'
import { lakePhases, lakes, weatherHours } from '../../server/db/schema/index'
import { seedDemo } from '../../server/db/seed/index'
import { conditionsFor } from '../../server/features/conditions/conditions.service'
import { backfillReadings, ingestReadings } from '../../server/features/ingest/readings.ingest'
import { ingestWeather } from '../../server/features/ingest/weather.ingest'
import { signedInAgent, testApp } from '../helpers/app'
import { createTestDb } from '../helpers/db'
import { ingestDeps, startTestFeed, type TestFeed } from '../helpers/feed'

let ctx: Awaited<ReturnType<typeof createTestDb>>
let feed: TestFeed

async function loadLake(slug: string, days: number) {
  const [lake] = await ctx.db.select().from(lakes).where(eq(lakes.slug, slug))
  await backfillReadings(ingestDeps(ctx.db, feed), lake!.id, days)
}

beforeAll(async () => {
  ctx = await createTestDb()
  await seedDemo(ctx.db)
  // Fresh data for one lake, data three hours old for another.
  feed = await startTestFeed(new Date().toISOString())
  await loadLake('quillmere', 20)
  await ingestWeather(ingestDeps(ctx.db, feed))
  feed.setNow(new Date(Date.now() - 3 * 3_600_000))
  await loadLake('vessandra', 3)
  // What the ingest jobs do after each run: every lake's read worked out once and cached.
  await conditionsFor(ctx.db).refreshAll()
})
afterAll(async () => {
  await feed.close()
  await ctx.drop()
})

describe('GET /api/lakes/:slug/read', () => {
  it('gives the water strip, wind, sky, phase and cautions from stored readings', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'reader@example.test')
    const res = await angler.get('/api/lakes/quillmere/read').expect(200)
    const read = LakeRead.parse(res.body)
    expect(read.lake.slug).toBe('quillmere')
    expect(read.waterTemp).toMatchObject({ stale: false })
    expect(read.waterTemp!.trendCPerDay).not.toBeNull()
    // Quillmere has a Secchi disk read daily, so the strip shows the disk, not the estimate.
    expect(read.clarity).toMatchObject({ source: 'secchi', stale: false })
    expect(read.level!.vsMedian30dM).not.toBeNull()
    expect(read.windNow).not.toBeNull()
    expect(read.windNext12h.length).toBeGreaterThanOrEqual(11)
    expect(read.pressure?.label).toBeTruthy()
    // The phase carries its numbers as fields, judged on the last whole day.
    expect(read.phase).toMatchObject({ pending: null })
    expect(read.phase!.meanC).toBeCloseTo(read.waterTemp!.valueC, -1)
    expect(read.phase!.reason).not.toMatch(/°/)
    expect(read.cautions.at(-1)!.kind).toBe('authority')
  })

  it('answers 304 to a client that already holds this read (RFC 9110, If-None-Match)', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'etag@example.test')
    const first = await angler.get('/api/lakes/quillmere/read').expect(200)
    expect(first.headers.etag).toMatch(/^W\/"/)
    await angler
      .get('/api/lakes/quillmere/read')
      .set('if-none-match', first.headers.etag!)
      .expect(304)
  })

  it('sends a phone that takes gzip the read gzipped, with the same ETag (RFC 9110, Content-Encoding)', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'gzip@example.test')
    const plain = await angler.get('/api/lakes/quillmere/read').set('accept-encoding', 'identity')
    expect(plain.headers['content-encoding']).toBeUndefined()
    const zipped = await angler.get('/api/lakes/quillmere/read').set('accept-encoding', 'gzip, br')
    expect(zipped.headers['content-encoding']).toBe('gzip')
    expect(zipped.headers.vary).toMatch(/Accept-Encoding/i)
    expect(zipped.headers.etag).toBe(plain.headers.etag)
    // Sent whole from the kept gzip, so it has a length; compressing per response streams it.
    expect(Number(zipped.headers['content-length'])).toBeGreaterThan(0)
    // supertest has unzipped it: the same read.
    expect(zipped.body).toEqual(plain.body)
  })

  it('marks readings that are hours old as stale rather than current', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'late@example.test')
    const read = LakeRead.parse((await angler.get('/api/lakes/vessandra/read').expect(200)).body)
    expect(read.waterTemp!.stale).toBe(true)
    expect(read.clarity!.source).toBe('turbidity')
    // Three days of data are too few for a seasonal phase, and the read says so by leaving it out.
    expect(read.phase).toBeNull()
  })

  it('answers 404 for an unknown lake, 400 for a malformed slug and 401 without a session', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'lost@example.test')
    await angler.get('/api/lakes/no-such-lake/read').expect(404)
    const bad = await angler.get('/api/lakes/Bad%20Slug!/read').expect(400)
    expect(bad.body.error.fields.slug).toBeTruthy()
    await request(app).get('/api/lakes/quillmere/read').expect(401)
  })
})

describe('GET /api/lakes/:slug/shoreline', () => {
  it('serves the outline apart from the read, revalidated by ETag', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'outline@example.test')
    const res = await angler.get('/api/lakes/quillmere/shoreline').expect(200)
    expect(LakeShape.parse(res.body).shoreline.type).toBe('Polygon')
    expect(res.headers['cache-control']).toBe('private, no-cache')
    await angler
      .get('/api/lakes/quillmere/shoreline')
      .set('if-none-match', res.headers.etag!)
      .expect(304)
    await angler.get('/api/lakes/nowhere/shoreline').expect(404)
    await request(app).get('/api/lakes/quillmere/shoreline').expect(401)
  })
})

describe('GET /api/lakes and subscriptions', () => {
  it('lists lakes with freshness and the one-line read, and follows and unfollows idempotently', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'follower@example.test')
    const page = LakePage.parse((await angler.get('/api/lakes').expect(200)).body)
    const quill = page.items.find((l) => l.slug === 'quillmere')!
    expect(quill).toMatchObject({ subscribed: false, stale: false })
    expect(quill.today.waterC).not.toBeNull()
    expect(quill.today.clarity).not.toBeNull()
    expect(quill.today.windMs).not.toBeNull()
    // Tanglewhit has no readings loaded in this test.
    expect(page.items.find((l) => l.slug === 'tanglewhit')).toMatchObject({
      lastReadingAt: null,
      stale: true,
    })

    await angler.put('/api/lakes/quillmere/subscription').expect(204)
    await angler.put('/api/lakes/quillmere/subscription').expect(204)
    const after = LakePage.parse(
      (await angler.get('/api/lakes').query({ q: 'quill' }).expect(200)).body,
    )
    expect(after.items).toHaveLength(1)
    expect(after.items[0]!.subscribed).toBe(true)
    // Another angler's view is their own.
    const other = await signedInAgent(app, ctx.db, 'other@example.test')
    const theirs = LakePage.parse(
      (await other.get('/api/lakes').query({ q: 'quill' }).expect(200)).body,
    )
    expect(theirs.items[0]!.subscribed).toBe(false)

    await angler.delete('/api/lakes/quillmere/subscription').expect(204)
    await angler.delete('/api/lakes/quillmere/subscription').expect(204)
    await angler.put('/api/lakes/nowhere/subscription').expect(404)
    await request(app).put('/api/lakes/quillmere/subscription').expect(401)
  })

  it('pages on the server and rejects a bad page size', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'pager@example.test')
    const first = LakePage.parse(
      (await angler.get('/api/lakes').query({ pageSize: 2 }).expect(200)).body,
    )
    expect(first).toMatchObject({ total: 3, page: 1, pageSize: 2 })
    expect(first.items).toHaveLength(2)
    const bad = await angler.get('/api/lakes').query({ pageSize: 1000 }).expect(400)
    expect(bad.body.error.fields.pageSize).toBeTruthy()
  })
})

describe('GET /api/lakes/:slug/series', () => {
  it('returns aligned hourly series for 7 or 30 days and refuses other periods', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'charts@example.test')
    const week = LakeSeries.parse(
      (await angler.get('/api/lakes/quillmere/series').query({ days: 7 }).expect(200)).body,
    )
    expect(week.hours.length).toBe(7 * 24 + 1)
    for (const key of [
      'waterC',
      'secchiM',
      'gaugeM',
      'windMs',
      'gustMs',
      'precipitationMm',
    ] as const) {
      expect(week[key]).toHaveLength(week.hours.length)
    }
    expect(week.waterC.filter((v) => v !== null).length).toBeGreaterThan(7 * 24 - 3)
    const month = LakeSeries.parse(
      (await angler.get('/api/lakes/quillmere/series').query({ days: 30 }).expect(200)).body,
    )
    // Only 20 days were loaded: the older hours are empty, not invented.
    expect(month.waterC.slice(0, 24 * 9).every((v) => v === null)).toBe(true)
    const bad = await angler.get('/api/lakes/quillmere/series').query({ days: 9 }).expect(400)
    expect(bad.body.error.fields.days).toMatch(/7 or 30/)
  })
})

describe('the seasonal phase as stored state', () => {
  // Its own world at a fixed date in August, when the water at Quillmere (about 35° N) is in summer.
  let world: Awaited<ReturnType<typeof createTestDb>>
  let summerFeed: TestFeed
  let lakeId: string
  const stored = async () =>
    (await world.db.select().from(lakePhases).where(eq(lakePhases.lakeId, lakeId)))[0]!
  /** A day later at the feed: its readings and weather ingested, then the refresh the jobs run. */
  const nextDay = () => atFeed(new Date(summerFeed.now().getTime() + 86_400_000))
  async function atFeed(now: Date) {
    summerFeed.setNow(now)
    await ingestReadings(ingestDeps(world.db, summerFeed), { lakeId })
    await ingestWeather(ingestDeps(world.db, summerFeed))
    await conditionsFor(world.db).refreshAll(summerFeed.now())
  }

  beforeAll(async () => {
    world = await createTestDb()
    await seedDemo(world.db)
    summerFeed = await startTestFeed('2026-08-10T17:00:00Z')
    const [lake] = await world.db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
    lakeId = lake!.id
    await backfillReadings(ingestDeps(world.db, summerFeed), lakeId, 20)
    await ingestWeather(ingestDeps(world.db, summerFeed))
    await conditionsFor(world.db).refreshAll(summerFeed.now())
  })
  afterAll(async () => {
    await summerFeed.close()
    await world.drop()
  })

  it('persists across refreshes on consecutive days, carried on rather than re-derived (from memory: a phase is a state through the year)', async () => {
    const app = testApp(world.db)
    const angler = await signedInAgent(app, world.db, 'season@example.test')
    const first = await stored()
    // Judged up to yesterday at the lake (Central time), the last whole day.
    expect(first).toMatchObject({ phase: 'summer', lastDay: '2026-08-09', pendingPhase: null })

    // Were the phase worked out afresh from the last month, it would begin inside that month.
    await world.db
      .update(lakePhases)
      .set({ since: '2026-05-30' })
      .where(eq(lakePhases.lakeId, lakeId))

    await nextDay()
    const second = await stored()
    expect(second).toMatchObject({ phase: 'summer', since: '2026-05-30', lastDay: '2026-08-10' })
    const read = LakeRead.parse((await angler.get('/api/lakes/quillmere/read').expect(200)).body)
    expect(read.phase).toMatchObject({
      phase: 'summer',
      since: '2026-05-30',
      lastDay: '2026-08-10',
    })
    expect(read.phase!.meanC).toBe(second.meanC)

    // A second refresh the same day judges nothing again.
    await conditionsFor(world.db).refreshAll(summerFeed.now())
    expect(await stored()).toEqual(second)

    await nextDay()
    await nextDay()
    expect(await stored()).toMatchObject({
      phase: 'summer',
      since: '2026-05-30',
      lastDay: '2026-08-12',
    })
  })

  it('names the rain that stained the water, then reads clearing with when it reaches the next class (from memory: rain stains a lake, which clears over days)', async () => {
    // The clock goes on from the test above. The feed's next rain at Quillmere falls from about
    // 14:00 UTC on 15 August for six hours.
    await atFeed(new Date('2026-08-16T04:00:00Z'))
    const app = testApp(world.db)
    const angler = await signedInAgent(app, world.db, 'rain@example.test')
    const wet = LakeRead.parse((await angler.get('/api/lakes/quillmere/read').expect(200)).body)
    const rainRows = await world.db
      .select()
      .from(weatherHours)
      .where(
        and(
          eq(weatherHours.lakeId, lakeId),
          eq(weatherHours.kind, 'observed'),
          gte(weatherHours.at, new Date('2026-08-15T00:00:00Z')),
        ),
      )
    const stored = rainRows.reduce((sum, r) => sum + r.precipitationMm, 0)
    expect(stored).toBeGreaterThan(5)
    expect(wet.clarity!.trend).toMatchObject({ label: 'staining', basis: 'event' })
    expect(wet.clarity!.trend!.rain!.mm).toBeCloseTo(stored, 6)
    expect(wet.clarity!.trend!.rain!.since.slice(0, 10)).toBe('2026-08-15')

    await atFeed(new Date('2026-08-17T16:00:00Z'))
    const clearing = LakeRead.parse(
      (await angler.get('/api/lakes/quillmere/read').expect(200)).body,
    ).clarity!.trend!
    expect(clearing).toMatchObject({ label: 'clearing', basis: 'event' })
    expect(clearing.rain!.mm).toBeCloseTo(stored, 6)
    expect(Date.parse(clearing.nextClassAt!)).toBeGreaterThan(Date.parse('2026-08-17T16:00:00Z'))
    expect(clearing.nextClass).not.toBeNull()
  })
})
