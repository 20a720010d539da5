import { eq, sql } from 'drizzle-orm'
import { pino } from 'pino'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { exposureTable } from '../../shared/conditions/exposure'
import { shoreIndex } from '../../shared/geo/fetch'
import type { Polygon, Position } from '../../shared/geo/types'
import { BankList, BankView, type BankInput } from '../../shared/schemas/banks'
import { DayPlanResponse } from '../../shared/schemas/day-plan'
import { LakeRead } from '../../shared/schemas/lake-read'
import { localDate, addDays } from '../../shared/time'
import { runRecomputeBanks } from '../../jobs/recompute-banks'
import { banks, lakeDays, lakes } from '../../server/db/schema/index'
import { seedDemo } from '../../server/db/seed/index'
import { conditionsFor } from '../../server/features/conditions/conditions.service'
import { backfillReadings } from '../../server/features/ingest/readings.ingest'
import { ingestWeather } from '../../server/features/ingest/weather.ingest'
import { signedInAgent, testApp } from '../helpers/app'
import { createTestDb } from '../helpers/db'
import { ingestDeps, startTestFeed, type TestFeed } from '../helpers/feed'

let ctx: Awaited<ReturnType<typeof createTestDb>>
let feed: TestFeed
let shore: Position[]
let shoreline: Polygon

async function lakeRow(slug: string) {
  const [lake] = await ctx.db.select().from(lakes).where(eq(lakes.slug, slug))
  return lake!
}

/** A point a few metres out from a shoreline vertex, toward the lake's centre: a fingertip's miss. */
function nearShore(i: number): Position {
  const [lon, lat] = shore[i]!
  return [lon + (-88.214 - lon) * 0.002, lat + (34.872 - lat) * 0.002]
}

const bank = (over: Partial<BankInput> = {}) => ({
  name: 'Rock point',
  points: [nearShore(10), nearShore(13)],
  cover: ['rock', 'sparse-grass'],
  depthM: 3,
  slope: 'steep',
  notes: 'Flat behind it',
  ...over,
})

beforeAll(async () => {
  ctx = await createTestDb()
  await seedDemo(ctx.db)
  feed = await startTestFeed(new Date().toISOString())
  await backfillReadings(ingestDeps(ctx.db, feed), (await lakeRow('quillmere')).id, 20)
  await backfillReadings(ingestDeps(ctx.db, feed), (await lakeRow('vessandra')).id, 3)
  await ingestWeather(ingestDeps(ctx.db, feed))
  await conditionsFor(ctx.db).refreshAll(feed.now())
  shoreline = (await lakeRow('quillmere')).shoreline as Polygon
  shore = shoreline.coordinates[0]!
})
afterAll(async () => {
  await feed.close()
  await ctx.drop()
})

describe('banks', () => {
  it('snaps the points onto the shore and stores the exposure table for 16 directions', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'banker@example.test')
    const res = await angler.post('/api/lakes/quillmere/banks').send(bank()).expect(201)
    const saved = BankView.parse(res.body)
    const index = shoreIndex(shoreline)
    for (const p of saved.points)
      expect(index.nearestShorePoint(p, 1)!.distanceM).toBeLessThan(0.01)
    expect(saved.exposure).toEqual(
      JSON.parse(JSON.stringify(exposureTable(shoreline, saved.points))),
    )
    expect(saved.exposure.rows).toHaveLength(16)
    const list = BankList.parse((await angler.get('/api/lakes/quillmere/banks').expect(200)).body)
    expect(list.items.map((b) => b.name)).toEqual(['Rock point'])
  })

  it('keeps a bank to its angler: anyone else gets 404, and no session gets 401', async () => {
    const app = testApp(ctx.db)
    const owner = await signedInAgent(app, ctx.db, 'owner@example.test')
    const other = await signedInAgent(app, ctx.db, 'nosy@example.test')
    const { id } = BankView.parse(
      (await owner.post('/api/lakes/quillmere/banks').send(bank()).expect(201)).body,
    )
    expect((await other.get('/api/lakes/quillmere/banks').expect(200)).body.items).toEqual([])
    await other
      .put(`/api/lakes/quillmere/banks/${id}`)
      .send(bank({ name: 'Mine' }))
      .expect(404)
    await other.delete(`/api/lakes/quillmere/banks/${id}`).expect(404)
    // The same id under another lake is not the bank either.
    await owner.delete(`/api/lakes/vessandra/banks/${id}`).expect(404)
    await request(app).get('/api/lakes/quillmere/banks').expect(401)
    await request(app).post('/api/lakes/quillmere/banks').send(bank()).expect(401)
    expect((await owner.get('/api/lakes/quillmere/banks').expect(200)).body.items).toHaveLength(1)
  })

  it('answers bad banks with 400 and a message per field, and a repeated name with 409', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'careless@example.test')
    const offShore = await angler
      .post('/api/lakes/quillmere/banks')
      .send(bank({ points: [nearShore(10), [-88.214, 34.872]] }))
      .expect(400)
    expect(offShore.body.error.fields.points).toMatch(/Point 2 is not on the shore/)
    const bad = await angler
      .post('/api/lakes/quillmere/banks')
      .send({ ...bank({ name: '  ', cover: [] }), depthM: -2, points: [nearShore(3)] })
      .expect(400)
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['cover', 'depthM', 'name', 'points'])
    // Two picks on the same spot make no bank to face the water from.
    const same = await angler
      .post('/api/lakes/quillmere/banks')
      .send(bank({ points: [nearShore(10), nearShore(10)] }))
      .expect(400)
    expect(same.body.error.fields.points).toMatch(/at least 1 m/)
    await angler.post('/api/lakes/quillmere/banks').send(bank()).expect(201)
    const twice = await angler.post('/api/lakes/quillmere/banks').send(bank()).expect(409)
    expect(twice.body.error.fields.name).toBeTruthy()
    expect((await angler.get('/api/lakes/quillmere/banks').expect(200)).body.items).toHaveLength(1)
    await angler.post('/api/lakes/no-such-lake/banks').send(bank()).expect(404)
  })

  it('refuses a bank that jumps to an island or runs too far along the shore, saying what to do', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'stray-tap@example.test')
    // A stray tap snapped to an island between two on the main shore.
    const island = shoreline.coordinates[1]![0]!
    const jump = await angler
      .post('/api/lakes/quillmere/banks')
      .send(bank({ points: [nearShore(10), island, nearShore(13)] }))
      .expect(400)
    expect(jump.body.error.fields.points).toMatch(
      /same stretch of shore; point 2 jumps to an island\. Pick points along one shore, within 1\.5 km/,
    )
    const index = shoreIndex(shoreline)
    const far = [nearShore(10), nearShore(120)]
    const [a, b] = far.map((p) => index.locate(p, 40)!.alongM)
    expect(Math.abs(b! - a!)).toBeGreaterThan(1500)
    const long = await angler
      .post('/api/lakes/quillmere/banks')
      .send(bank({ points: far }))
      .expect(400)
    expect(long.body.error.fields.points).toMatch(/km along it\. Pick points along one shore/)
    expect((await angler.get('/api/lakes/quillmere/banks').expect(200)).body.items).toEqual([])
  })

  it('faces a bank the same way whichever end was picked first', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'either-end@example.test')
    const points = [nearShore(40), nearShore(43), nearShore(47)]
    const there = BankView.parse(
      (await angler.post('/api/lakes/quillmere/banks').send(bank({ points })).expect(201)).body,
    )
    const back = BankView.parse(
      (
        await angler
          .post('/api/lakes/quillmere/banks')
          .send(bank({ name: 'Back again', points: [...points].reverse() }))
          .expect(201)
      ).body,
    )
    expect(back.exposure.facingDeg).toBeCloseTo(there.exposure.facingDeg, 6)
  })

  it('edits a bank (new points, new exposure) and deletes it', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'editor@example.test')
    const first = BankView.parse(
      (await angler.post('/api/lakes/quillmere/banks').send(bank()).expect(201)).body,
    )
    const moved = BankView.parse(
      (
        await angler
          .put(`/api/lakes/quillmere/banks/${first.id}`)
          .send(bank({ name: 'Far side', points: [nearShore(200), nearShore(204)] }))
          .expect(200)
      ).body,
    )
    expect(moved.name).toBe('Far side')
    expect(moved.exposure.facingDeg).not.toBeCloseTo(first.exposure.facingDeg, 0)
    await angler.delete(`/api/lakes/quillmere/banks/${first.id}`).expect(204)
    await angler.delete(`/api/lakes/quillmere/banks/${first.id}`).expect(404)
  })
})

describe('banks stored by an older engine', () => {
  it('get their exposure table made again at start; a bank across two shores is flagged to redraw', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'old-timer@example.test')
    const save = async (name: string, points: Position[]) =>
      BankView.parse(
        (await angler.post('/api/lakes/quillmere/banks').send(bank({ name, points })).expect(201))
          .body,
      )
    const kept = await save('Old rocks', [nearShore(60), nearShore(64)])
    const straddling = await save('Old straddle', [nearShore(20), nearShore(23)])
    const current = await save('New rocks', [nearShore(90), nearShore(94)])
    // As version 1 stored them: no version, and a facing turned round by the order of the picks.
    const island = shoreline.coordinates[1]![0]!
    const old = sql`(${banks.exposure} - 'version') || jsonb_build_object('facingDeg', ((${banks.exposure}->>'facingDeg')::float + 180)::numeric % 360)`
    await ctx.db
      .update(banks)
      .set({ exposure: old })
      .where(sql`${banks.id} in (${kept.id}, ${straddling.id})`)
    await ctx.db
      .update(banks)
      .set({ points: [straddling.points[0]!, island] })
      .where(eq(banks.id, straddling.id))
    const before = await ctx.db.select().from(banks).where(eq(banks.id, kept.id))
    expect(before[0]!.exposure.facingDeg).not.toBeCloseTo(kept.exposure.facingDeg, 0)

    const log = pino({ level: 'silent' })
    const run = await runRecomputeBanks({ db: ctx.db, log })
    expect(run).toEqual({ skipped: false, result: { recomputed: 1, flagged: 1 } })
    const list = BankList.parse((await angler.get('/api/lakes/quillmere/banks').expect(200)).body)
    const byName = new Map(list.items.map((b) => [b.name, b]))
    expect(byName.get('Old rocks')!.exposure).toEqual(kept.exposure)
    // A recompute is not the angler's edit.
    expect(byName.get('Old rocks')!.updatedAt).toBe(before[0]!.updatedAt.toISOString())
    expect(byName.get('Old straddle')!.detached).toBe(true)
    expect(byName.get('New rocks')).toEqual(current)
    // Nothing is left to do on the next start.
    expect(await runRecomputeBanks({ db: ctx.db, log })).toEqual({
      skipped: false,
      result: { recomputed: 0, flagged: 0 },
    })
  })
})

describe('GET /api/lakes/:slug/plan/:date', () => {
  it("ranks the angler's banks in each window with reasons, from the cached day", async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'planner@example.test')
    await angler.post('/api/lakes/quillmere/banks').send(bank()).expect(201)
    await angler
      .post('/api/lakes/quillmere/banks')
      .send(bank({ name: 'Dock row', points: [nearShore(150), nearShore(153)], cover: ['docks'] }))
      .expect(201)
    const today = localDate(feed.now(), 'America/Chicago')
    const res = DayPlanResponse.parse(
      (await angler.get(`/api/lakes/quillmere/plan/${today}`).expect(200)).body,
    )
    expect(res.banksSaved).toBe(2)
    expect(res.dates[0]).toBe(today)
    expect(res.dates.length).toBeGreaterThanOrEqual(6)
    const windows = res.plan!.windows.filter((w) => w.weather)
    expect(windows.length).toBeGreaterThan(0)
    for (const w of windows) {
      expect(w.banks.map((b) => b.rank)).toEqual([1, 2])
      expect(w.banks[0]!.components.map((c) => c.key)).toContain('wind')
      expect(w.tackle[0]!.why.length).toBeGreaterThan(0)
      expect(w.cautions.at(-1)!.kind).toBe('authority')
    }

    // Another angler sees the same lake's day with none of these banks.
    const other = await signedInAgent(app, ctx.db, 'bystander@example.test')
    const theirs = DayPlanResponse.parse(
      (await other.get(`/api/lakes/quillmere/plan/${today}`).expect(200)).body,
    )
    expect(theirs.banksSaved).toBe(0)
    for (const w of theirs.plan!.windows) expect(w.banks).toEqual([])
  })

  it('refreshes one lake from two places at once without either failing', async () => {
    // An ingest job and a desk edit (or two first views) can replace a lake's days together.
    const conditions = conditionsFor(ctx.db)
    const { id } = await lakeRow('quillmere')
    for (let i = 0; i < 3; i++)
      await Promise.all([conditions.refresh(id, feed.now()), conditions.refresh(id, feed.now())])
    const days = await ctx.db.select().from(lakeDays).where(eq(lakeDays.lakeId, id))
    expect(days.length).toBeGreaterThan(0)
  })

  it('reads the cache: with readings and weather gone, plan and read are unchanged until the next refresh', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'cached@example.test')
    const today = localDate(feed.now(), 'America/Chicago')
    const before = (await angler.get(`/api/lakes/quillmere/plan/${today}`).expect(200)).body
    const readBefore = LakeRead.parse(
      (await angler.get('/api/lakes/quillmere/read').expect(200)).body,
    )
    const [cached] = await ctx.db.select().from(lakeDays).where(eq(lakeDays.date, today))
    expect(cached).toBeTruthy()
    await ctx.db.execute(sql`delete from weather_hours`)
    await ctx.db.execute(sql`delete from readings`)
    const after = (await angler.get(`/api/lakes/quillmere/plan/${today}`).expect(200)).body
    expect(after.plan).toEqual(before.plan)
    const readAfter = LakeRead.parse(
      (await angler.get('/api/lakes/quillmere/read').expect(200)).body,
    )
    expect(readAfter.waterTemp).toEqual(readBefore.waterTemp)
  })

  it('serves the stored read while its stale flags hold, and re-judges them after', async () => {
    const conditions = conditionsFor(ctx.db)
    const now = LakeRead.parse((await conditions.read('quillmere')).read)
    expect(now.waterTemp!.stale).toBe(false)
    // Water temperature is read every 15 minutes and counts as stale after two hours.
    const later = new Date(Date.parse(now.waterTemp!.at) + 2 * 3_600_000 + 60_000)
    const then = LakeRead.parse((await conditions.read('quillmere', later)).read)
    expect(then.waterTemp!.stale).toBe(true)
    expect(then.waterTemp!.valueC).toBe(now.waterTemp!.valueC)
  })

  it('says why there is no plan, refuses dates outside the forecast and bad dates', async () => {
    const app = testApp(ctx.db)
    const angler = await signedInAgent(app, ctx.db, 'early@example.test')
    const today = localDate(feed.now(), 'America/Chicago')
    // Three days of history are too few for a seasonal phase.
    const res = DayPlanResponse.parse(
      (await angler.get(`/api/lakes/vessandra/plan/${today}`).expect(200)).body,
    )
    expect(res.plan).toBeNull()
    expect(res.unavailable).toMatch(/two weeks of water temperatures/)
    await angler.get(`/api/lakes/quillmere/plan/${addDays(today, 9)}`).expect(404)
    // The window's edges, in the lake's time zone: yesterday and six days ahead are in it.
    await angler.get(`/api/lakes/quillmere/plan/${addDays(today, -1)}`).expect(200)
    await angler.get(`/api/lakes/quillmere/plan/${addDays(today, 6)}`).expect(200)
    await angler.get(`/api/lakes/quillmere/plan/${addDays(today, -2)}`).expect(404)
    await angler.get(`/api/lakes/quillmere/plan/${addDays(today, 7)}`).expect(404)
    const bad = await angler.get('/api/lakes/quillmere/plan/2026-13-40').expect(400)
    expect(bad.body.error.fields.date).toBeTruthy()
    await request(app).get(`/api/lakes/quillmere/plan/${today}`).expect(401)
  })
})
