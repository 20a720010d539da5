import { rmSync } from 'node:fs'
import { createServer, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { fileURLToPath } from 'node:url'
import { and, eq, gt, inArray, isNotNull, isNull, sql, type SQL } from 'drizzle-orm'
import type { Polygon, Position } from 'geojson'
import { pino } from 'pino'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { localDate } from '../../shared/time'
import { startCluster, type Cluster, type ClusterOptions } from '../../server/db/cluster'
import { createDb, type Db } from '../../server/db/index'
import { migrateDb } from '../../server/db/migrate'
import {
  banks,
  briefSends,
  briefSettings,
  jobRuns,
  lakes,
  subscriptions,
  users,
} from '../../server/db/schema/index'
import { DEMO_PASSWORD, DEMO_USERS, seedDemo } from '../../server/db/seed/index'
import { DEMO_FEED_SEED, DEMO_STATIONS } from '../../server/db/seed/demo-stations'
import { createFeed } from '../../server/fakes/feed/app'
import { startMailServer, type MailServer } from '../../server/fakes/mail/index'
import { conditionsFor } from '../../server/features/conditions/conditions.service'
import { backfillReadings } from '../../server/features/ingest/readings.ingest'
import { ingestWeather } from '../../server/features/ingest/weather.ingest'
import { freePort } from '../setup/postgres'
import {
  apiClient,
  startServerProcess,
  until,
  type ApiClient,
  type ServerProcess,
} from '../helpers/servers'

/*
 * Two processes of the production entry (server/index.ts) on one PostgreSQL of their own (part d
 * restarts it), with the fake feed and the SMTP stand-in, and the jobs scheduled in both at the
 * same seconds.
 */

const ORIGIN = 'http://app.test'
const SECRET = 'two-servers-secret-long-enough-for-hs256-keys'
const ANGLER = DEMO_USERS.find((u) => u.role === 'angler')!.email
/** Every 4 s, and briefs 2 s after, in both servers: the same slots fire in both at once. */
const JOB_ENV = {
  INGEST_READINGS_CRON: '*/4 * * * * *',
  SEND_BRIEFS_CRON: '2-59/4 * * * * *',
  INGEST_WEATHER_CRON: '0 0 1 1 *',
}

let cluster: Cluster
let clusterOpts: ClusterOptions
let db: Db
let mail: MailServer
let feedServer: Server
let feed: ReturnType<typeof createFeed>
/** When each listing of the feed's stations (one per readings ingest) was asked for. */
const listings: number[] = []
let env: Record<string, string>
const servers: ServerProcess[] = []
let api: ApiClient
let shore: Position[]
let today: string
/** A date whose plan has a window that ranks banks. */
let planDate: string

const [a, b] = [() => servers[0]!, () => servers[1]!]

/** The `job_runs` rows that meet every condition, oldest slot first. */
const runsWhere = (...where: SQL[]) =>
  db
    .select()
    .from(jobRuns)
    .where(and(...where))
    .orderBy(jobRuns.slot)

/** A point a few metres off a shoreline vertex toward the lake's centre. */
function nearShore(i: number, centre: Position): Position {
  const [lon, lat] = shore[i]!
  return [lon! + (centre[0]! - lon!) * 0.002, lat! + (centre[1]! - lat!) * 0.002]
}
const bankInput = (name: string, at = 10) => {
  const centre = [-88.214, 34.872]
  return {
    name,
    points: [nearShore(at, centre), nearShore(at + 3, centre)],
    cover: ['rock'],
    depthM: 3,
    slope: 'steep',
    notes: '',
  }
}

interface Plan {
  banksSaved: number
  dates: string[]
  plan: {
    windows: { weather: unknown; verdict: { verdict: string } | null; banks: { name: string }[] }[]
  } | null
}
/** The angler's Day plan through one server: how many banks it counts, which it ranks. */
async function planThrough(server: ServerProcess, date = planDate) {
  const res = await api(server, 'GET', `/api/lakes/quillmere/plan/${date}`)
  expect(res.status).toBe(200)
  const plan = res.body as Plan
  // A no-go window ranks no banks.
  const windows =
    plan.plan?.windows.filter((w) => w.weather && w.verdict?.verdict !== 'no-go') ?? []
  const names = new Set(windows.flatMap((w) => w.banks.map((x) => x.name)))
  return { saved: plan.banksSaved, names, windows: windows.length, dates: plan.dates }
}

/** The scheduler's "job run" lines of one job in both servers, by slot. */
function runsBySlot(job: string) {
  const bySlot = new Map<string, { server: string; skipped: boolean }[]>()
  for (const server of servers)
    for (const line of server.logs()) {
      if (line.msg !== 'job run' || line.job !== job || typeof line.slot !== 'string') continue
      const result = line.result as { skipped: boolean; ingest?: { skipped: boolean } }
      const list = bySlot.get(line.slot) ?? []
      list.push({ server: server.name, skipped: (result.ingest ?? result).skipped })
      bySlot.set(line.slot, list)
    }
  return bySlot
}

async function startServers(names: string[]) {
  return Promise.all(names.map((name) => startServerProcess(name, env)))
}

beforeAll(async () => {
  clusterOpts = {
    dataDir: fileURLToPath(new URL(`../../.tmp/pg-two-servers-${process.pid}`, import.meta.url)),
    port: await freePort(),
    user: 'chopline_two',
    password: 'throwaway',
    database: 'chopline_two',
    durable: false,
  }
  cluster = await startCluster(clusterOpts)
  db = createDb(cluster.url(), { max: 4 })
  await migrateDb(db)
  await seedDemo(db)

  feed = createFeed({ seed: DEMO_FEED_SEED, stations: DEMO_STATIONS, recordTruth: false })
  feedServer = createServer((req, res) => {
    if (req.url?.startsWith('/v1.1/Things?')) listings.push(Date.now())
    feed.app(req, res)
  })
  await new Promise<void>((resolve) => feedServer.listen(0, '127.0.0.1', resolve))
  const feedUrl = `http://127.0.0.1:${(feedServer.address() as AddressInfo).port}`
  mail = await startMailServer()

  // The two weeks of water temperatures a plan needs, and the lakes' reads and days computed.
  const [quillmere] = await db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
  const deps = { db, feedUrl, log: pino({ level: 'silent' }) }
  await backfillReadings(deps, quillmere!.id, 15)
  await ingestWeather(deps)
  await conditionsFor(db).refreshAll()
  shore = (quillmere!.shoreline as Polygon).coordinates[0]!
  today = localDate(new Date(), quillmere!.timeZone)
  planDate = today

  env = {
    DATABASE_URL: cluster.url(),
    SESSION_SECRET: SECRET,
    FEED_URL: feedUrl,
    SMTP_URL: mail.url,
    APP_ORIGIN: ORIGIN,
    LOG_LEVEL: 'info',
    ...JOB_ENV,
  }
  servers.push(...(await startServers(['A', 'B'])))
  api = apiClient(ORIGIN)
  expect(
    (await api(a(), 'POST', '/api/auth/signin', { email: ANGLER, password: DEMO_PASSWORD })).status,
  ).toBe(200)
}, 120_000)

afterAll(async () => {
  await Promise.all(servers.map((s) => s.kill('SIGKILL')))
  await db?.$client.end()
  await mail?.close()
  feedServer?.closeAllConnections()
  await new Promise((resolve) => feedServer?.close(resolve))
  await cluster?.stop()
  if (cluster) rmSync(cluster.dataDir, { recursive: true, force: true })
})

describe('two servers on one database', () => {
  it('a) a bank saved, renamed or deleted through one server is in the other’s answers on the very next request', async () => {
    for (const date of (await planThrough(b(), today)).dates)
      if ((await planThrough(b(), date)).windows > 0) {
        planDate = date
        break
      }
    const first = await planThrough(b())
    expect(first.saved).toBe(0)
    const made = await api(a(), 'POST', '/api/lakes/quillmere/banks', bankInput('Quiet cove'))
    expect(made.status).toBe(201)
    const id = (made.body as { id: string }).id
    await until('B to see the new bank', async () => (await planThrough(b())).saved === 1)
    // B keeps its answers (change notices live): an edit no notice tells of stays unseen there,
    // so what follows is the notices at work, not every answer read afresh.
    await db.execute(sql`alter table banks disable trigger banks_notify`)
    await db.update(banks).set({ name: 'Unnoticed' }).where(eq(banks.id, id))
    await db.execute(sql`alter table banks enable trigger banks_notify`)
    const kept = await planThrough(b())
    expect(kept.names).toContain('Quiet cove')
    expect(kept.names).not.toContain('Unnoticed')
    expect((await api(a(), 'DELETE', `/api/lakes/quillmere/banks/${id}`)).status).toBe(204)

    // Each edit through one server, read through the other: seen on the very next request.
    for (let i = 0; i < 6; i++) {
      const [writer, reader] = i % 2 ? [b(), a()] : [a(), b()]
      expect((await planThrough(reader)).saved, `${i}: none`).toBe(0)
      const created = await api(
        writer,
        'POST',
        '/api/lakes/quillmere/banks',
        bankInput(`Cove ${i}`),
      )
      expect(created.status).toBe(201)
      const bank = created.body as { id: string }
      expect((await planThrough(reader)).names, `${i}: the new bank`).toContain(`Cove ${i}`)
      const renamed = await api(
        writer,
        'PUT',
        `/api/lakes/quillmere/banks/${bank.id}`,
        bankInput(`Point ${i}`),
      )
      expect(renamed.status).toBe(200)
      const after = await planThrough(reader)
      expect(after.names, `${i}: the new name`).toContain(`Point ${i}`)
      expect(after.names).not.toContain(`Cove ${i}`)
      expect((await api(writer, 'DELETE', `/api/lakes/quillmere/banks/${bank.id}`)).status).toBe(
        204,
      )
      expect((await planThrough(reader)).saved, `${i}: deleted`).toBe(0)
    }
  }, 60_000)

  it('b) each scheduled ingest and each morning brief runs once with the jobs in both servers', async () => {
    const since = new Date()
    // Subscribers whose brief is due from midnight UTC: the next briefs slot sends them.
    const emails = ['early@example.test', 'dawn@example.test', 'first@example.test']
    const [quillmere] = await db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
    for (const email of emails) {
      const [user] = await db
        .insert(users)
        .values({ email, passwordHash: 'x', emailVerifiedAt: new Date() })
        .returning()
      await db
        .insert(briefSettings)
        .values({ userId: user!.id, sendTime: '00:00', timeZone: 'UTC' })
      await db.insert(subscriptions).values({ userId: user!.id, lakeId: quillmere!.id })
    }
    const ids = (await db.select().from(users).where(inArray(users.email, emails))).map((u) => u.id)

    // Three readings slots after now that both servers fired, and the briefs sent.
    const both = (job: string) =>
      [...runsBySlot(job)].filter(
        ([slot, runs]) => new Date(slot) > since && new Set(runs.map((r) => r.server)).size === 2,
      )
    await until(
      'three readings slots fired in both servers',
      () => both('ingest-readings').length >= 3,
      {
        timeoutMs: 40_000,
      },
    )
    await until(
      'the briefs sent',
      async () =>
        (
          await db
            .select()
            .from(briefSends)
            .where(and(inArray(briefSends.userId, ids), eq(briefSends.status, 'sent')))
        ).length === emails.length,
    )

    for (const job of ['ingest-readings', 'send-briefs']) {
      const slots = both(job)
      expect(slots.length).toBeGreaterThan(0)
      for (const [slot, runs] of slots) {
        expect(
          runs.filter((r) => !r.skipped),
          `${job} ${slot}`,
        ).toHaveLength(1)
        expect(runs).toHaveLength(2)
      }
    }

    // The feed saw one listing of its stations per readings run, none from a second runner.
    const rows = await runsWhere(eq(jobRuns.job, 'ingest-readings'), gt(jobRuns.slot, since))
    const done = rows.filter((r) => r.finishedAt)
    expect(done.length).toBeGreaterThanOrEqual(3)
    for (const r of done) expect(r.attempts).toBe(1)
    const from = done[0]!.startedAt.getTime()
    const to = done.at(-1)!.finishedAt!.getTime()
    expect(listings.filter((t) => t >= from && t <= to)).toHaveLength(done.length)

    // One brief per subscriber caught by the SMTP stand-in.
    for (const email of emails)
      expect(
        mail.messages().filter((m) => m.to.includes(email)),
        email,
      ).toHaveLength(1)
  }, 60_000)

  it('c) a server killed in the middle of an ingest leaves the other to finish that run', async () => {
    // A slow feed: each answer takes most of a second, so a run lasts a few seconds.
    feed.controls.setPlan({ latencyMs: 700 })
    try {
      const since = new Date()
      const running = await until(
        'a readings run in flight',
        async () =>
          (
            await runsWhere(
              eq(jobRuns.job, 'ingest-readings'),
              gt(jobRuns.slot, since),
              isNull(jobRuns.finishedAt),
            )
          )[0],
        { timeoutMs: 20_000, everyMs: 50 },
      )
      const holder = servers.find((s) => running.runner.endsWith(`:${s.pid}`))!
      const other = servers.find((s) => s !== holder)!
      await holder.kill('SIGKILL')

      const finished = await until(
        'the other server to finish the run',
        async () =>
          (
            await runsWhere(
              eq(jobRuns.job, running.job),
              eq(jobRuns.slot, running.slot),
              isNotNull(jobRuns.finishedAt),
            )
          )[0],
        { timeoutMs: 30_000, everyMs: 200 },
      )
      expect(finished.runner.endsWith(`:${other.pid}`)).toBe(true)
      expect(finished.attempts).toBe(2)
      // The server that was killed comes back for the next part.
      servers[servers.indexOf(holder)] = (await startServers([holder.name]))[0]!
    } finally {
      feed.controls.setPlan({ latencyMs: 0 })
    }
  }, 90_000)

  it('d) a PostgreSQL restart under load loses no write the client saw succeed, and both servers recover', async () => {
    const pids = servers.map((s) => s.pid)
    const ok: string[] = []
    const failed: { name: string; status: number | string }[] = []
    let n = 0
    let stop = false
    const after = { restarted: 0, ok: new Set<string>() }
    const worker = async (server: () => ServerProcess) => {
      while (!stop) {
        const name = `Load ${String(n++).padStart(4, '0')}`
        const res = await api(
          server(),
          'POST',
          '/api/lakes/quillmere/banks',
          bankInput(name, n % 40),
        ).catch((err: unknown) => ({ status: String(err), body: null }))
        if (res.status === 201) {
          ok.push(name)
          if (after.restarted && Date.now() > after.restarted) after.ok.add(server().name)
        } else failed.push({ name, status: res.status })
      }
    }
    const load = Promise.all([worker(a), worker(b), worker(a), worker(b)])
    try {
      await until('writes through both servers', () => ok.length >= 8, { timeoutMs: 20_000 })
      await cluster.stop()
      await until('writes to fail while the database is down', () => failed.length >= 4)
      cluster = await startCluster(clusterOpts)
      after.restarted = Date.now()
      await until('writes through both servers again', () => after.ok.size === 2, {
        timeoutMs: 30_000,
      })
    } finally {
      stop = true
      await load
    }

    const stored = new Set(
      (await db.select({ name: banks.name }).from(banks)).map((row) => row.name),
    )
    expect(ok.filter((name) => !stored.has(name))).toEqual([])
    // Every failure was told as such: 503 (try again) while the database was out of reach.
    expect(failed.length).toBeGreaterThan(0)
    for (const f of failed) expect(f.status).toBe(503)
    expect(servers.map((s) => s.pid)).toEqual(pids)
    for (const s of servers) expect(s.exited()).toBe(false)

    // B listens again and keeps answers: a bank deleted with no notice still counts there...
    const count = async () => (await db.select().from(banks)).length
    await until(
      'B to keep answers again',
      async () => {
        const before = await count()
        expect((await planThrough(b())).saved).toBe(before)
        const [gone] = await db.select().from(banks).limit(1)
        await db.execute(sql`alter table banks disable trigger banks_notify`)
        await db.delete(banks).where(eq(banks.id, gone!.id))
        await db.execute(sql`alter table banks enable trigger banks_notify`)
        return (await planThrough(b())).saved === before
      },
      { timeoutMs: 20_000, everyMs: 500 },
    )
    // ...and an edit through A is in B's next answer.
    const made = await api(a(), 'POST', '/api/lakes/quillmere/banks', bankInput('After', 60))
    expect(made.status).toBe(201)
    expect((await planThrough(b())).saved).toBe(await count())
  }, 90_000)
})
