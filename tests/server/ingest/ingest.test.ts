import { eq, gt } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { runIngestReadings } from '../../../jobs/ingest-readings'
import { runIngestWeather } from '../../../jobs/ingest-weather'
import { quarantine, readings, stations, weatherHours } from '../../../server/db/schema/index'
import { seedDemo } from '../../../server/db/seed/index'
import { ingestReadings } from '../../../server/features/ingest/readings.ingest'
import { signedInAgent, testApp } from '../../helpers/app'
import { createTestDb } from '../../helpers/db'
import {
  countReadings,
  ingestDeps,
  readingRows,
  resetMarks,
  startTestFeed,
  stationByThing,
  type TestFeed,
} from '../../helpers/feed'

let ctx: Awaited<ReturnType<typeof createTestDb>>
let feed: TestFeed
const START = '2026-04-10T12:00:00Z'

beforeAll(async () => {
  feed = await startTestFeed(START)
})
afterAll(async () => {
  await feed.close()
})
beforeEach(async () => {
  await ctx?.drop()
  ctx = await createTestDb()
  await seedDemo(ctx.db)
  feed.setNow(START)
  feed.controls.setPlan({ requestRate: 0, itemRate: 0, kinds: [], latencyMs: 0 })
  feed.controls.disappeared.clear()
  feed.controls.silentAfter.clear()
})
afterAll(() => ctx?.drop())

describe('ingest-readings', () => {
  it('stores two days of readings in SI units, once, however often the same window is read', async () => {
    const first = await ingestReadings(ingestDeps(ctx.db, feed))
    // 10 quarter-hour datastreams x 2 days x 96, plus 2 daily Secchi readings.
    expect(first).toMatchObject({ stations: 3, failed: 0, quarantined: 0 })
    expect(await countReadings(ctx.db)).toBe(10 * 192 + 2)
    const snapshot = await readingRows(ctx.db)
    await ingestReadings(ingestDeps(ctx.db, feed))
    await resetMarks(ctx.db)
    await ingestReadings(ingestDeps(ctx.db, feed))
    expect(await readingRows(ctx.db)).toEqual(snapshot)
    // Vessandra publishes gauge height in metres and the others in feet; all are stored in metres.
    const heights = await ctx.db
      .select({ v: readings.value, unit: readings.originalUnit })
      .from(readings)
    const byUnit = (u: string) => heights.filter((h) => h.unit === u).map((h) => h.v)
    expect(Math.max(...byUnit('ft'))).toBeLessThan(10)
    expect(byUnit('m').length).toBeGreaterThan(0)
  })

  it('loses and doubles nothing when pages come shuffled and with repeats', async () => {
    await ingestReadings(ingestDeps(ctx.db, feed))
    const clean = await readingRows(ctx.db)
    await ctx.drop()
    ctx = await createTestDb()
    await seedDemo(ctx.db)
    feed.controls.setPlan({ itemRate: 0.3, kinds: ['duplicate', 'out-of-order'] })
    const before = feed.controls.faults.total
    await ingestReadings(ingestDeps(ctx.db, feed, { pageSize: 25 }))
    expect(feed.controls.faults.total - before).toBeGreaterThan(50)
    expect(await readingRows(ctx.db)).toEqual(clean)
    expect(await ctx.db.$count(quarantine)).toBe(0)
  })

  it('keeps one copy of a new reading that another writer stored first', async () => {
    await ingestReadings(ingestDeps(ctx.db, feed))
    feed.advance(2)
    await ingestReadings(ingestDeps(ctx.db, feed))
    const clean = await readingRows(ctx.db)
    const [late] = await ctx.db
      .select({ reading: readings, thing: stations.feedThingId })
      .from(readings)
      .innerJoin(stations, eq(stations.id, readings.stationId))
      .where(gt(readings.observedAt, new Date(START)))
      .limit(1)
    await ctx.drop()
    ctx = await createTestDb()
    await seedDemo(ctx.db)
    feed.setNow(START)
    await ingestReadings(ingestDeps(ctx.db, feed))
    // As a readings import would: a row past the job's high-water mark, stored before the job reads it.
    const station = await stationByThing(ctx.db, Number(late!.thing))
    await ctx.db.insert(readings).values({ ...late!.reading, stationId: station.id })
    feed.advance(2)
    const run = await ingestReadings(ingestDeps(ctx.db, feed))
    expect(run.failed).toBe(0)
    expect(await readingRows(ctx.db)).toEqual(clean)
  })

  it('quarantines implausible values with the raw value and the reason', async () => {
    await ingestReadings(ingestDeps(ctx.db, feed))
    feed.advance(6)
    feed.controls.setPlan({ itemRate: 0.2, kinds: ['implausible'] })
    await ingestReadings(ingestDeps(ctx.db, feed))
    const rows = await ctx.db.select().from(quarantine)
    expect(rows.length).toBeGreaterThan(5)
    const reasons = new Set(rows.map((r) => r.reason))
    expect(reasons).toContain('out_of_range')
    expect(reasons).toContain('rate_of_change')
    for (const r of rows) expect(r.raw).toHaveProperty('result')
    // Each rejected time is missing from readings, never stored with the bad value.
    for (const r of rows) expect(r.detail.length).toBeGreaterThan(0)
  })

  it('lets one runner do the work when two start at once', async () => {
    feed.controls.setPlan({ latencyMs: 30 })
    const deps = ingestDeps(ctx.db, feed)
    const [a, b] = await Promise.all([runIngestReadings(deps), runIngestReadings(deps)])
    expect([a.skipped, b.skipped].sort()).toEqual([false, true])
    expect(await countReadings(ctx.db)).toBe(10 * 192 + 2)
  })

  it('flips a silent station to stale and back to ok when it reports again', async () => {
    await ingestReadings(ingestDeps(ctx.db, feed))
    expect((await stationByThing(ctx.db, 100)).state).toBe('ok')
    feed.controls.silentAfter.set(100, feed.now().getTime())
    feed.advance(3)
    await ingestReadings(ingestDeps(ctx.db, feed))
    expect((await stationByThing(ctx.db, 100)).state).toBe('stale')
    expect((await stationByThing(ctx.db, 101)).state).toBe('ok')
    expect((await stationByThing(ctx.db, 100)).gapCount).toBeGreaterThanOrEqual(3 * 4 * 3 - 3)
    feed.controls.silentAfter.delete(100)
    feed.advance(0.25)
    await ingestReadings(ingestDeps(ctx.db, feed))
    expect((await stationByThing(ctx.db, 100)).state).toBe('ok')
  })

  it('marks a vanished station failing, keeps the others going, and opens its breaker after three failures', async () => {
    feed.controls.disappeared.add(102)
    for (let i = 0; i < 3; i++) {
      const run = await ingestReadings(ingestDeps(ctx.db, feed))
      expect(run.failed).toBe(1)
    }
    const gone = await stationByThing(ctx.db, 102)
    expect(gone.state).toBe('failing')
    expect(gone.lastError).toMatch(/not in the feed/)
    expect(gone.circuitOpenUntil!.getTime()).toBeGreaterThan(feed.now().getTime())
    expect((await stationByThing(ctx.db, 100)).state).toBe('ok')
    // While the breaker is open the station is left alone.
    expect((await ingestReadings(ingestDeps(ctx.db, feed))).stations).toBe(2)
  })

  it('survives 500s, timeouts and broken bodies by retrying', async () => {
    feed.controls.setPlan({
      requestRate: 0.3,
      kinds: ['http500', 'http503', 'truncated', 'malformed', 'slow'],
      slowMs: 400,
    })
    await ingestReadings(ingestDeps(ctx.db, feed, { pageSize: 50 }))
    expect(feed.controls.faults.total).toBeGreaterThan(3)
    // What a failed page left out, the next run picks up from the mark.
    feed.controls.setPlan({ requestRate: 0 })
    await ingestReadings(ingestDeps(ctx.db, feed))
    expect(await countReadings(ctx.db)).toBe(10 * 192 + 2)
    feed.advance(2)
    await ingestReadings(ingestDeps(ctx.db, feed))
    expect(await countReadings(ctx.db)).toBe(10 * (192 + 8) + 2)
  })
})

describe('ingest-weather', () => {
  it('stores observed hours once and keeps only the latest forecast', async () => {
    const deps = ingestDeps(ctx.db, feed)
    await runIngestWeather(deps)
    const observed = () => ctx.db.$count(weatherHours, undefined)
    const first = await observed()
    expect(first).toBe(3 * (48 + 168))
    await runIngestWeather(deps)
    expect(await observed()).toBe(first)
    feed.advance(3)
    await runIngestWeather(deps)
    // Three more observed hours; the forecast slid forward, its past hours dropped.
    expect(await observed()).toBe(3 * (48 + 3 + 168))
  })
})

describe('GET /api/admin/stations', () => {
  it('shows admins each station with its lake, parameters and health', async () => {
    await ingestReadings(ingestDeps(ctx.db, feed))
    const app = testApp(ctx.db)
    const admin = await signedInAgent(app, ctx.db, 'ops@example.test', 'admin')
    const res = await admin.get('/api/admin/stations').expect(200)
    expect(res.body.items).toHaveLength(3)
    const quill = res.body.items.find(
      (s: { lake: { slug: string } }) => s.lake.slug === 'quillmere',
    )
    expect(quill.parameters.map((p: { parameter: string }) => p.parameter).sort()).toEqual([
      'gauge_height',
      'secchi',
      'turbidity',
      'water_temp',
    ])
    expect(quill.health).toMatchObject({ state: 'ok', rejected24h: 0 })
    const angler = await signedInAgent(app, ctx.db, 'fish@example.test')
    await angler.get('/api/admin/stations').expect(403)
    await request(app).get('/api/admin/stations').expect(401)
    expect(await ctx.db.$count(stations)).toBe(3)
  })
})
