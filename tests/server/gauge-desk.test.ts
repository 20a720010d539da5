import { and, eq, sql } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { toSi } from '../../shared/readings'
import { AuditPage } from '../../shared/schemas/audit'
import { QuarantinePage } from '../../shared/schemas/quarantine'
import { ReadingsImportReport, StationHistories } from '../../shared/schemas/stations'
import { datastreams, lakes, quarantine, readings, stations } from '../../server/db/schema/index'
import { stationsRepo } from '../../server/features/stations/stations.repo'
import type { QuarantineReason } from '../../shared/readings'
import { seedDemo } from '../../server/db/seed/index'
import { backfillReadings } from '../../server/features/ingest/readings.ingest'
import { signedInAgent, testApp } from '../helpers/app'
import { createTestDb } from '../helpers/db'
import { ingestDeps, startTestFeed, type TestFeed } from '../helpers/feed'

let ctx: Awaited<ReturnType<typeof createTestDb>>
let feed: TestFeed
let station: typeof stations.$inferSelect
let unit: string
const at = new Date('2026-04-01T12:00:00Z')

beforeAll(async () => {
  ctx = await createTestDb()
  await seedDemo(ctx.db)
  feed = await startTestFeed('2026-04-10T12:00:00Z')
  const [lake] = await ctx.db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
  await backfillReadings(ingestDeps(ctx.db, feed), lake!.id, 1)
  const [first] = await ctx.db.select().from(stations).where(eq(stations.lakeId, lake!.id))
  station = first!
  const [ds] = await ctx.db
    .select()
    .from(datastreams)
    .where(and(eq(datastreams.stationId, station!.id), eq(datastreams.parameter, 'water_temp')))
  unit = ds!.unit
})
afterAll(async () => {
  await feed.close()
  await ctx.drop()
})

/** A refused row as the ingest job writes one. */
async function held(reason: QuarantineReason, raw: unknown, feedId: string) {
  const [row] = await ctx.db
    .insert(quarantine)
    .values({
      stationId: station.id,
      parameter: 'water_temp',
      feedId,
      observedAt: at,
      raw,
      reason,
      detail: `test ${reason}`,
    })
    .returning()
  return row!.id
}

describe('quarantine review', () => {
  it('lists held rows by station and reason, releases a reviewed value as a reading, and audits it', async () => {
    const admin = await signedInAgent(testApp(ctx.db), ctx.db, 'desk@admin.test', 'admin')
    // 33 units: implausibly warm for the day it was read, but a real reading after review.
    const warm = await held(
      'rate_of_change',
      { result: 33, phenomenonTime: at.toISOString() },
      'q-warm',
    )
    const junk = await held('malformed', { result: 'n/a' }, 'q-junk')
    const page = QuarantinePage.parse(
      (
        await admin
          .get(`/api/admin/quarantine?stationId=${station.id}&reason=rate_of_change`)
          .expect(200)
      ).body,
    )
    expect(page.items.map((i) => [i.id, i.releasable])).toEqual([[warm, true]])
    const bad = await admin.get('/api/admin/quarantine?reason=because').expect(400)
    expect(bad.body.error.fields.reason).toBe('Not a reason for refusing a row.')
    expect(page.items[0]!.station!.name).toBe(station.name)

    await admin.post(`/api/admin/quarantine/${warm}/release`).expect(204)
    const [stored] = await ctx.db
      .select()
      .from(readings)
      .where(and(eq(readings.stationId, station.id), eq(readings.observedAt, at)))
    // Stored in SI as the job stores readings (°F to °C: NIST SP 811).
    expect(stored).toMatchObject({
      value: toSi('water_temp', 33, unit),
      originalValue: 33,
      originalUnit: unit,
    })
    await admin.post(`/api/admin/quarantine/${warm}/release`).expect(404)

    const refused = await admin.post(`/api/admin/quarantine/${junk}/release`).expect(409)
    expect(refused.body.error.code).toBe('not_releasable')
    await admin.post(`/api/admin/quarantine/${junk}/discard`).expect(204)
    const discarded = QuarantinePage.parse(
      (await admin.get('/api/admin/quarantine?status=discarded').expect(200)).body,
    )
    expect(discarded.items.map((i) => i.id)).toEqual([junk])

    const log = AuditPage.parse((await admin.get('/api/admin/audit').expect(200)).body)
    expect(log.items.slice(0, 2).map((e) => [e.action, e.targetId, e.actorEmail])).toEqual([
      ['quarantine.discard', String(junk), 'desk@admin.test'],
      ['quarantine.release', String(warm), 'desk@admin.test'],
    ])
    expect(log.items[1]!.before).toMatchObject({ status: 'held', reason: 'rate_of_change' })
    expect(log.items[1]!.after).toMatchObject({ status: 'released' })
  })
})

describe('the audit log', () => {
  it('records role changes with before and after, and nobody can edit it, not even the database owner', async () => {
    const app = testApp(ctx.db)
    const admin = await signedInAgent(app, ctx.db, 'roles@admin.test', 'admin')
    const target = await signedInAgent(app, ctx.db, 'promoted@guide.test')
    const id = (await target.get('/api/me')).body.user.id as string
    await admin.patch(`/api/admin/users/${id}`).send({ role: 'guide' }).expect(200)
    const log = AuditPage.parse(
      (await admin.get('/api/admin/audit?action=user.role').expect(200)).body,
    )
    expect(log.items[0]).toMatchObject({
      actorEmail: 'roles@admin.test',
      targetType: 'user',
      targetId: id,
      before: { role: 'angler' },
      after: { role: 'guide' },
    })
    for (const change of [
      sql`update audit_log set action = 'forged'`,
      sql`delete from audit_log`,
      sql`truncate audit_log`,
    ])
      await expect(ctx.db.execute(change)).rejects.toMatchObject({
        cause: { message: expect.stringMatching(/append-only/) },
      })
    expect(
      (await ctx.db.execute(sql`select count(*)::int as n from audit_log`)).rows[0],
    ).toMatchObject({
      n: log.total + 2,
    })
  })
})

describe('stations on the desk', () => {
  it('creates, edits and deactivates stations with a message per bad field, and audits each', async () => {
    const admin = await signedInAgent(testApp(ctx.db), ctx.db, 'stations@admin.test', 'admin')
    const station = {
      name: 'South dam',
      lakeSlug: 'quillmere',
      feedThingId: 'new-901',
      active: true,
    }
    const { id } = (await admin.post('/api/admin/stations').send(station).expect(201)).body
    const again = await admin.post('/api/admin/stations').send(station).expect(409)
    expect(again.body.error.fields.feedThingId).toBeDefined()
    const bad = await admin
      .post('/api/admin/stations')
      .send({ name: '', lakeSlug: 'atlantis', feedThingId: 'has spaces' })
      .expect(400)
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['feedThingId', 'name'])
    const unknownLake = await admin
      .post('/api/admin/stations')
      .send({ ...station, feedThingId: 'new-902', lakeSlug: 'atlantis' })
      .expect(400)
    expect(unknownLake.body.error.fields.lakeSlug).toBe('No such lake.')

    await admin
      .put(`/api/admin/stations/${id}`)
      .send({ ...station, active: false })
      .expect(200)
    const listed = (await admin.get('/api/admin/stations').expect(200)).body.items
    expect(listed.find((s: { id: string }) => s.id === id)).toMatchObject({ active: false })
    const log = AuditPage.parse((await admin.get('/api/admin/audit').expect(200)).body)
    expect(log.items.slice(0, 2).map((e) => e.action)).toEqual([
      'station.deactivate',
      'station.create',
    ])
    expect((await admin.post(`/api/admin/stations/${id}/run`).expect(409)).body.error.code).toBe(
      'station_inactive',
    )
  })

  it('runs ingestion for one station now and reports what it read', async () => {
    const app = testApp(ctx.db, { feedUrl: feed.url })
    const admin = await signedInAgent(app, ctx.db, 'runner@admin.test', 'admin')
    const res = await admin.post(`/api/admin/stations/${station.id}/run`).expect(200)
    expect(res.body).toMatchObject({ failed: false, health: { state: expect.any(String) } })
    expect(res.body.good + res.body.quarantined).toBeGreaterThan(0)
    const noFeed = await signedInAgent(testApp(ctx.db), ctx.db, 'nofeed@admin.test', 'admin')
    expect(
      (await noFeed.post(`/api/admin/stations/${station.id}/run`).expect(503)).body.error.code,
    ).toBe('no_feed')
  })
})

describe('readings import', () => {
  it('checks a CSV by the ingest rules, previews it, stores and quarantines it, and a second import changes nothing', async () => {
    const admin = await signedInAgent(testApp(ctx.db), ctx.db, 'import@admin.test', 'admin')
    const csv = Buffer.from(
      [
        'parameter,observed_at,value,unit',
        'water_temp,2026-03-01T00:00:00Z,10,°C',
        'water_temp,2026-03-01T00:15:00Z,10.2,°C',
        // 60 °C: no lake is that warm (the range rule of ingestion).
        'water_temp,2026-03-01T00:30:00Z,60,°C',
        'water_temp,yesterday,10,°C',
        'air_pressure,2026-03-01T00:00:00Z,1013,hPa',
      ].join('\n'),
    )
    const send = (commit: boolean) =>
      admin
        .post(`/api/admin/stations/${station.id}/readings?commit=${commit}`)
        .attach('file', csv, 'history.csv')
        .expect(200)
    const march = async () =>
      (
        await ctx.db.execute<{ n: number }>(
          sql`select count(*)::int as n from readings where station_id = ${station.id} and observed_at < '2026-03-02'`,
        )
      ).rows[0]!.n
    const held = async () =>
      (
        await ctx.db.execute<{ n: number }>(
          sql`select count(*)::int as n from quarantine where feed_id like 'csv:%'`,
        )
      ).rows[0]!.n

    const preview = ReadingsImportReport.parse((await send(false)).body)
    expect(preview.rows.map((r) => [r.line, r.status])).toEqual([
      [2, 'stored'],
      [3, 'stored'],
      [4, 'quarantined'],
      [5, 'quarantined'],
      [6, 'invalid'],
    ])
    expect(preview.rows[2]!.reason).toMatch(/out_of_range/)
    expect(preview.rows[4]!.reason).toMatch(/Unknown parameter/)
    expect([await march(), await held()]).toEqual([0, 0])

    const done = ReadingsImportReport.parse((await send(true)).body)
    expect(done).toMatchObject({ stored: 2, quarantined: 2, invalid: 1, committed: true })
    expect([await march(), await held()]).toEqual([2, 2])
    await send(true)
    expect([await march(), await held()]).toEqual([2, 2])

    const bad = await admin
      .post(`/api/admin/stations/${station.id}/readings`)
      .attach('file', Buffer.from('when,how much\n1,2'), 'history.csv')
      .expect(400)
    expect(bad.body.error.fields.file).toBeDefined()
  })
})

describe('station history', () => {
  it('counts each of the last days for every station at once: stored against expected, and refusals', async () => {
    const admin = await signedInAgent(testApp(ctx.db), ctx.db, 'history@admin.test', 'admin')
    const res = await admin.get('/api/admin/stations/history?days=3').expect(200)
    const { items } = StationHistories.parse(res.body)
    expect(items.length).toBe(await ctx.db.$count(stations))
    const { days } = items.find((h) => h.stationId === station.id)!
    expect(days).toHaveLength(3)
    expect(days.at(-1)!.date).toBe(new Date().toISOString().slice(0, 10))
    // A parameter read every 15 minutes is expected 96 times a day.
    expect(days[0]!.expected).toBeGreaterThanOrEqual(96)
    // The rows the quarantine tests above held today count against today, for this station only.
    expect(days.at(-1)!.rejected).toBeGreaterThan(0)
    expect(items.filter((h) => h.days.at(-1)!.rejected > 0)).toHaveLength(1)
    await admin.get('/api/admin/stations/history?days=90').expect(400)

    // The feed's day, seen from then: the backfilled readings count on the days they were read.
    const then = await stationsRepo(ctx.db).histories(new Date('2026-04-10T12:00:00Z'), 2)
    const mine = then.filter((r) => r.station_id === station.id)
    expect(mine.map((r) => r.date)).toEqual(['2026-04-09', '2026-04-10'])
    expect(mine.every((r) => r.stored > 0)).toBe(true)
  })
})
