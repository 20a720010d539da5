import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { bankExposure } from '../../shared/conditions/exposure'
import type { Position } from '../../shared/geo/types'
import { seasonOf } from '../../shared/journal/insights'
import { CatchView, Insights } from '../../shared/schemas/journal'
import { localDate } from '../../shared/time'
import { lakes } from '../../server/db/schema/index'
import { seedDemo } from '../../server/db/seed/index'
import { conditionsFor } from '../../server/features/conditions/conditions.service'
import { backfillReadings } from '../../server/features/ingest/readings.ingest'
import { ingestWeather } from '../../server/features/ingest/weather.ingest'
import { timeOfDay } from '../../server/features/journal/catch-conditions'
import { lakeReadRepo } from '../../server/features/lakes/lake-read.repo'
import { lakeReadService } from '../../server/features/lakes/lake-read.service'
import { signedInAgent, testApp } from '../helpers/app'
import { createTestDb } from '../helpers/db'
import { ingestDeps, startTestFeed, type TestFeed } from '../helpers/feed'

let ctx: Awaited<ReturnType<typeof createTestDb>>
let feed: TestFeed
let app: ReturnType<typeof testApp>

async function lakeRow(slug: string) {
  const [lake] = await ctx.db.select().from(lakes).where(eq(lakes.slug, slug))
  return lake!
}

beforeAll(async () => {
  ctx = await createTestDb()
  await seedDemo(ctx.db)
  feed = await startTestFeed(new Date().toISOString())
  await backfillReadings(ingestDeps(ctx.db, feed), (await lakeRow('quillmere')).id, 20)
  await ingestWeather(ingestDeps(ctx.db, feed))
  await conditionsFor(ctx.db).refreshAll(feed.now())
  app = testApp(ctx.db)
}, 120_000)
afterAll(async () => {
  await feed.close()
  await ctx.drop()
})

const aCatch = (over: Record<string, unknown> = {}) => ({
  lakeSlug: 'quillmere',
  caughtAt: new Date(Date.now() - 2 * 3_600_000).toISOString(),
  species: 'smallmouth',
  lengthM: 0.36,
  released: true,
  lure: { family: 'jerkbait' },
  ...over,
})

describe('conditions attached to a catch', () => {
  it('come from the stored readings and weather at the catch time, and the bank meets that wind', async () => {
    const angler = await signedInAgent(app, ctx.db, 'conditions@journal.test')
    const lake = await lakeRow('quillmere')
    const shore = (lake.shoreline as { coordinates: Position[][] }).coordinates[0]!
    const bank = (
      await angler
        .post('/api/lakes/quillmere/banks')
        .send({ name: 'Windy rock', points: [shore[10], shore[13]], cover: ['rock'] })
        .expect(201)
    ).body
    const at = new Date(Date.now() - 2 * 3_600_000)
    const made = CatchView.parse(
      (
        await angler
          .post('/api/journal/catches')
          .send(aCatch({ caughtAt: at.toISOString(), bankId: bank.id }))
          .expect(201)
      ).body,
    )
    const c = made.conditions!
    const read = await lakeReadService(lakeReadRepo(ctx.db)).compute(lake, at)
    expect(c.waterC).toBeCloseTo(read.waterTemp!.valueC, 6)
    expect(c.clarity?.class).toBe(read.clarity!.class)
    expect(c.clarity?.trend).toBe(read.clarity!.trend?.label ?? null)
    expect(c.phase).toBe(read.phase!.phase)
    expect(c.wind).toEqual({
      ms: read.windNow!.windMs,
      gustMs: read.windNow!.gustMs,
      fromDeg: read.windNow!.windFromDeg,
    })
    expect(c.bankExposure).toBe(
      bankExposure(bank.exposure, read.windNow!.windFromDeg, read.windNow!.windMs).exposure,
    )
    expect(['sun', 'partly', 'overcast']).toContain(c.sky)
    expect(c.pressure?.label).toBe(read.pressure!.label)
    expect(['go', 'caution', 'no-go']).toContain(c.verdict)
    expect(c.timeOfDay).toBe(timeOfDay(at, lake))
  })

  it('are never typed: conditions in the body are ignored', async () => {
    const angler = await signedInAgent(app, ctx.db, 'typed@journal.test')
    const made = await angler
      .post('/api/journal/catches')
      .send({ ...aCatch(), conditions: { waterC: 99 } })
      .expect(201)
    expect(made.body.conditions.waterC).not.toBe(99)
  })

  it('leave out what was not measured: a lake without readings has no water or wind', async () => {
    const angler = await signedInAgent(app, ctx.db, 'dry@journal.test')
    const made = await angler
      .post('/api/journal/catches')
      .send(aCatch({ lakeSlug: 'vessandra' }))
      .expect(201)
    expect(made.body.conditions).toMatchObject({ waterC: null, clarity: null, phase: null })
  })

  it('name the part of the day by the sun at the lake', async () => {
    const lake = await lakeRow('quillmere')
    const noonLocal = new Date(`${new Date().toISOString().slice(0, 10)}T12:00:00Z`)
    const results = Array.from({ length: 24 }, (_, h) =>
      timeOfDay(new Date(noonLocal.getTime() + (h - 12) * 3_600_000), lake),
    )
    expect(new Set(results)).toEqual(new Set(['night', 'dawn', 'midday', 'afternoon']))
  })
})

describe('insights from the journal', () => {
  it("answer one angler's catches by condition, filtered by lake and season", async () => {
    const angler = await signedInAgent(app, ctx.db, 'insights@journal.test')
    const someoneElse = await signedInAgent(app, ctx.db, 'else@journal.test')
    for (let i = 0; i < 6; i++)
      await angler
        .post('/api/journal/catches')
        .send(aCatch({ caughtAt: new Date(Date.now() - (i + 1) * 3_600_000).toISOString() }))
        .expect(201)
    await someoneElse.post('/api/journal/catches').send(aCatch()).expect(201)

    const all = Insights.parse((await angler.get('/api/journal/insights').expect(200)).body)
    expect(all.total).toBe(6)
    const clarity = all.dimensions.find((d) => d.dimension === 'clarity')!
    expect(clarity.groups.reduce((n, g) => n + g.count, 0)).toBe(clarity.known)
    expect(clarity.known).toBeGreaterThan(0)
    const tod = all.dimensions.find((d) => d.dimension === 'timeOfDay')!
    expect(tod.known).toBe(6)

    const elsewhere = await angler.get('/api/journal/insights?lake=vessandra').expect(200)
    expect(elsewhere.body.total).toBe(0)
    const season = seasonOf(localDate(new Date(), 'UTC'), 40)
    const other = ['spring', 'summer', 'fall', 'winter'].find(
      (s) => s !== seasonOf(new Date().toISOString().slice(0, 10), 34.8),
    )
    expect(season).toBeTruthy()
    expect((await angler.get(`/api/journal/insights?season=${other}`).expect(200)).body.total).toBe(
      0,
    )
    const bad = await angler.get('/api/journal/insights?season=monsoon').expect(400)
    expect(bad.body.error.fields.season).toBeTruthy()
  })
})
