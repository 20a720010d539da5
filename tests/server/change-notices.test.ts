import { eq, sql } from 'drizzle-orm'
import { pino } from 'pino'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import type { Position } from '../../shared/geo/types'
import { DayPlanResponse } from '../../shared/schemas/day-plan'
import { LakeRead } from '../../shared/schemas/lake-read'
import { localDate } from '../../shared/time'
import { NoticedCache, watchChanges, type Changes } from '../../server/db/changes'
import { lakes, users } from '../../server/db/schema/index'
import { seedDemo } from '../../server/db/seed/index'
import { conditionsAnswers } from '../../server/features/conditions/conditions.cache'
import { conditionsFor } from '../../server/features/conditions/conditions.service'
import { backfillReadings } from '../../server/features/ingest/readings.ingest'
import { ingestWeather } from '../../server/features/ingest/weather.ingest'
import { createUser, PASSWORD, testApp } from '../helpers/app'
import { createTestDb } from '../helpers/db'
import { ingestDeps, startTestFeed, type TestFeed } from '../helpers/feed'

/**
 * Two app instances on one database, as behind a load balancer, each keeping sessions, Lake reads
 * and Day plans in memory: a change made through one, or straight in the database, shows on the
 * other as soon as its notice arrives.
 */
let ctx: Awaited<ReturnType<typeof createTestDb>>
let feed: TestFeed
let one: Changes
let two: Changes
let appOne: ReturnType<typeof testApp>
let appTwo: ReturnType<typeof testApp>
let lakeId: string
let ring: Position[]

const watch = () => watchChanges(ctx.db.$client.options, pino({ level: 'silent' }), 50)

beforeAll(async () => {
  ctx = await createTestDb()
  await seedDemo(ctx.db)
  feed = await startTestFeed(new Date().toISOString())
  const [lake] = await ctx.db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
  lakeId = lake!.id
  ring = lake!.shoreline.type === 'Polygon' ? lake!.shoreline.coordinates[0]! : []
  await backfillReadings(ingestDeps(ctx.db, feed), lakeId, 20)
  await ingestWeather(ingestDeps(ctx.db, feed))
  await conditionsFor(ctx.db).refreshAll(feed.now())
  one = watch()
  two = watch()
  appOne = testApp(ctx.db, { changes: one })
  appTwo = testApp(ctx.db, { changes: two })
  await vi.waitFor(() => expect(one.live && two.live).toBe(true))
})
afterAll(async () => {
  await one.close()
  await two.close()
  await feed.close()
  await ctx.drop()
})

/** A new angler signed up through the first instance; the session cookie to send. */
async function signIn(email: string) {
  await createUser(ctx.db, email)
  const res = await request(appOne)
    .post('/api/auth/signin')
    .send({ email, password: PASSWORD })
    .expect(200)
  return res.headers['set-cookie']![0]!.split(';')[0]!
}

describe('answers kept in memory, dropped by change notices', () => {
  it('ends a session on every instance when it signs out on one, and follows a role change', async () => {
    const cookie = await signIn('notices@example.test')
    expect(
      (await request(appTwo).get('/api/me').set('Cookie', cookie).expect(200)).body.user.role,
    ).toBe('angler')
    await ctx.db.update(users).set({ role: 'guide' }).where(eq(users.email, 'notices@example.test'))
    await expect
      .poll(
        async () => (await request(appTwo).get('/api/me').set('Cookie', cookie)).body.user?.role,
      )
      .toBe('guide')
    await request(appOne).post('/api/auth/signout').set('Cookie', cookie).expect(204)
    await expect
      .poll(async () => (await request(appTwo).get('/api/me').set('Cookie', cookie)).status)
      .toBe(401)
  })

  it("serves a lake's read and an angler's plan from memory until a refresh or a bank edit", async () => {
    const cookie = await signIn('planner@example.test')
    const today = localDate(feed.now(), 'America/Chicago')
    const read = async () =>
      LakeRead.parse(
        (await request(appTwo).get('/api/lakes/quillmere/read').set('Cookie', cookie).expect(200))
          .body,
      )
    const plan = async () =>
      DayPlanResponse.parse(
        (
          await request(appTwo)
            .get(`/api/lakes/quillmere/plan/${today}`)
            .set('Cookie', cookie)
            .expect(200)
        ).body,
      )
    const before = await read()
    expect((await plan()).banksSaved).toBe(0)

    // A bank saved, renamed and deleted through the other instance.
    const names = async () => (await plan()).plan!.windows[0]!.banks.map((b) => b.name)
    const bank = { name: 'North point', points: [ring[40], ring[43]], cover: ['rock'], depthM: 3 }
    const saved = await request(appOne)
      .post('/api/lakes/quillmere/banks')
      .set('Cookie', cookie)
      .send(bank)
      .expect(201)
    await expect.poll(names).toEqual(['North point'])
    await request(appOne)
      .put(`/api/lakes/quillmere/banks/${saved.body.id}`)
      .set('Cookie', cookie)
      .send({ ...bank, name: 'North point bar' })
      .expect(200)
    await expect.poll(names).toEqual(['North point bar'])
    await request(appOne)
      .delete(`/api/lakes/quillmere/banks/${saved.body.id}`)
      .set('Cookie', cookie)
      .expect(204)
    await expect.poll(async () => (await plan()).banksSaved).toBe(0)

    // The next ingest's refresh, run by a job with no cache of its own.
    const later = new Date(feed.now().getTime() + 60_000)
    await conditionsFor(ctx.db).refresh(lakeId, later)
    await expect.poll(async () => (await plan()).computedAt).toBe(later.toISOString())
    expect((await read()).asOf).toBe(later.toISOString())
    expect(before.asOf).not.toBe(later.toISOString())
  })

  it('re-judges a kept read once when one of its values turns stale, not on every view', async () => {
    const answers = conditionsAnswers(conditionsFor(ctx.db), one)
    const stored = LakeRead.parse((await answers.read('quillmere')).data)
    expect(stored.waterTemp!.stale).toBe(false)
    // Water temperature is read every 15 minutes and counts as stale after two hours.
    const later = new Date(Date.parse(stored.waterTemp!.at) + 2 * 3_600_000 + 60_000)
    const judged = await answers.read('quillmere', later)
    const read = LakeRead.parse(JSON.parse(judged.answer.body.toString()))
    expect(read.waterTemp).toEqual({ ...stored.waterTemp, stale: true })
    // A minute on nothing else has turned: the same answer, not a new one.
    expect(await answers.read('quillmere', new Date(later.getTime() + 60_000))).toBe(judged)
  })

  it('drops the kept answers a notice names, and only those', async () => {
    const [angler] = await ctx.db.select().from(users).limit(1)
    const today = localDate(feed.now(), 'America/Chicago')
    const answers = conditionsAnswers(conditionsFor(ctx.db), one)
    const kept = async () => ({
      quillmere: await answers.read('quillmere'),
      vessandra: await answers.read('vessandra'),
      plan: await answers.plan(angler!.id, 'quillmere', today, feed.now()),
    })
    const notice = async (statement: ReturnType<typeof sql>) => {
      const seen = one.version
      await ctx.db.execute(statement)
      await vi.waitFor(() => expect(one.version).toBeGreaterThan(seen))
    }
    const before = await kept()
    // Another lake's row changed: Quillmere's read and plan stay as kept.
    await notice(sql`update lakes set name = name where slug = 'vessandra'`)
    const after = await kept()
    expect(after.quillmere).toBe(before.quillmere)
    expect(after.plan).toBe(before.plan)
    expect(after.vessandra).not.toBe(before.vessandra)
    // Another angler's banks: the plan stays too.
    await notice(sql`select pg_notify('chopline_changes', 'banks:' || gen_random_uuid())`)
    expect((await kept()).plan).toBe(before.plan)
    // Quillmere's days: its plan goes, its read stays.
    await notice(sql`update lake_days set day = day where lake_id = ${lakeId}`)
    const days = await kept()
    expect(days.quillmere).toBe(before.quillmere)
    expect(days.plan).not.toBe(before.plan)
  })

  it('makes one answer for views that ask at once, and a fresh one for a view after a notice', async () => {
    const cache = new NoticedCache<{ load: number }>(one, { max: 10 }, (_, kept) => kept.clear())
    let loads = 0
    let open!: () => void
    const gate = new Promise<void>((resolve) => (open = resolve))
    const load = async () => {
      const n = ++loads
      await gate
      return { load: n }
    }
    const a = cache.get('quillmere', load)
    await vi.waitFor(() => expect(loads).toBe(1))
    const b = cache.get('quillmere', load)
    // b's barrier was sent first, so b has joined the running load once a later one is heard.
    await one.heard()
    expect(loads).toBe(1)
    // A notice while that load runs: it may have read the row before the change.
    const seen = one.version
    await ctx.db.execute(sql`update lakes set name = name where slug = 'vessandra'`)
    await vi.waitFor(() => expect(one.version).toBeGreaterThan(seen))
    const c = cache.get('quillmere', load)
    open()
    expect(await a).toEqual({ load: 1 })
    expect(await b).toBe(await a)
    expect(await c).toEqual({ load: 2 })
    // Only the load begun after the notice was kept.
    expect(await cache.get('quillmere', load)).toBe(await c)
    expect(loads).toBe(2)
  })

  it('has heard every change committed before it is asked, so the next answer reflects it', async () => {
    // PostgreSQL NOTIFY docs: a listening session gets pending notices before a later query's result.
    for (let i = 0; i < 20; i++) {
      const seen = two.version
      await ctx.db.execute(sql`update lakes set name = name where slug = 'vessandra'`)
      await two.heard()
      expect(two.version, `edit ${i}`).toBeGreaterThan(seen)
    }
  })

  it('answers from the database while notices are down', async () => {
    const cookie = await signIn('offline@example.test')
    const down = watch()
    const app = testApp(ctx.db, { changes: down })
    await vi.waitFor(() => expect(down.live).toBe(true))
    await request(app).get('/api/me').set('Cookie', cookie).expect(200)
    await down.close()
    expect(down.live).toBe(false)
    await request(appOne).post('/api/auth/signout').set('Cookie', cookie).expect(204)
    // No notice can reach it now, and none is needed: the session row is read again.
    await request(app).get('/api/me').set('Cookie', cookie).expect(401)
  })

  it('drops everything it kept when its notices come back after a lost connection', async () => {
    const cookie = await signIn('reconnect@example.test')
    // A listener of its own, named so that only its connection is cut.
    const name = 'chopline-reconnect-test'
    const changes = watchChanges(
      { ...ctx.db.$client.options, application_name: name },
      pino({ level: 'silent' }),
      50,
    )
    const app = testApp(ctx.db, { changes })
    try {
      await vi.waitFor(() => expect(changes.live).toBe(true))
      await request(app).get('/api/me').set('Cookie', cookie).expect(200)
      // The listening connection cut (a database restart, a proxy timeout)...
      await ctx.db.execute(
        sql`select pg_terminate_backend(pid) from pg_stat_activity where application_name = ${name}`,
      )
      await vi.waitFor(() => expect(changes.live).toBe(false))
      // ...while the session ends elsewhere: its notice is never delivered to this instance.
      await request(appOne).post('/api/auth/signout').set('Cookie', cookie).expect(204)
      await vi.waitFor(() => expect(changes.live).toBe(true))
      // Live again, it answers from the database, not from the session it kept before the cut.
      await request(app).get('/api/me').set('Cookie', cookie).expect(401)
    } finally {
      await changes.close()
    }
  })
})
