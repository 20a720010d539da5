import { spawn } from 'node:child_process'
import { once } from 'node:events'
import { rmSync } from 'node:fs'
import { performance } from 'node:perf_hooks'
import { fileURLToPath } from 'node:url'
import { sql } from 'drizzle-orm'
import { pino } from 'pino'
import { lakeDay, type ForecastHour } from '../../shared/conditions/day-plan'
import { exposureTable } from '../../shared/conditions/exposure'
import { startCluster } from '../../server/db/cluster'
import { createDb } from '../../server/db/index'
import { migrateDb } from '../../server/db/migrate'
import { insertBenchLakes } from './bench-lakes'
import { lakeDays, lakeReads } from '../../server/db/schema/index'
import { tokenKey } from '../../server/features/auth/auth.tokens'
import { smtpMailer, type Mailer } from '../../server/features/mail/mailer'
import { sendBriefs } from '../../server/features/brief/send-briefs'
import { sampleRead } from '../helpers/lake-read-fixture'

/**
 * 10,000 subscribers across 100 lakes, 3 saved banks each: every brief composed from the cached
 * days and rendered (HTML and text) by the real job, with the SMTP send replaced by a counter;
 * once for 1,000 subscribers and once for all 10,000, so the per-brief cost can be compared.
 * Then 1,000 sent through the SMTP stand-in, which runs in a process of its own.
 */
const LAKES = 100
const SUBSCRIBERS = 10_000
const DATE = '2026-04-10'
const ZONE = 'America/Chicago'
/** 07:00 in Chicago: every 05:00 brief is due. */
const NOW = new Date('2026-04-10T12:00:00Z')
const dataDir = fileURLToPath(new URL('../../.tmp/pg-bench-brief', import.meta.url))

const cluster = await startCluster({
  dataDir,
  port: 54395,
  user: 'bench',
  password: 'bench',
  database: 'bench',
  durable: false,
})
const db = createDb(cluster.url(), { max: 12 })
const log = pino({ level: 'silent' })
const linkKey = tokenKey('bench-secret-that-is-long-enough-for-hs256-keys')

/** The lakes, their cached reads and days (the wind turning a little from lake to lake), and the subscribers. */
async function seed() {
  await migrateDb(db)
  const { rows, shoreline, center, shore } = await insertBenchLakes(db, LAKES, ZONE)
  for (const [i, lake] of rows.entries()) {
    const hourly: ForecastHour[] = Array.from({ length: 24 }, (_, h) => ({
      at: new Date(Date.UTC(2026, 3, 10, 5 + h)).toISOString(),
      windFromDeg: (i * 3.6 + h * 5) % 360,
      windMs: 3 + (h % 6),
      gustMs: 6 + (h % 6),
      airC: 18,
      relativeHumidityPct: 60,
      cloudCoverPct: 40,
      thunderstormProbabilityPct: h > 14 ? 30 : 0,
    }))
    const day = lakeDay({
      lake: shoreline,
      date: DATE,
      timeZone: ZONE,
      hourly,
      waterC: 12.5,
      secchiM: 0.5,
      phase: 'pre-spawn',
    })
    const summary = {
      id: lake.id,
      slug: lake.slug,
      name: lake.name,
      region: lake.region,
      timeZone: ZONE,
      normalPoolM: 100,
      areaKm2: 10,
      center,
    }
    await db
      .insert(lakeReads)
      .values({ lakeId: lake.id, read: sampleRead(summary), computedAt: NOW, flagsHoldUntil: null })
    await db.insert(lakeDays).values({ lakeId: lake.id, date: DATE, day, computedAt: NOW })
  }
  // Three bank shapes, each with its stored exposure table; every subscriber saves all three.
  const banks = [10, 120, 240].map((at, k) => {
    const points = [shore[at]!, shore[at + 4]!]
    return { name: `Bank ${k + 1}`, points, exposure: exposureTable(shoreline, points) }
  })
  // The rows themselves are made by PostgreSQL, so this process's memory is the job's alone.
  await db.execute(sql`
    insert into users (email, password_hash, email_verified_at)
    select 'sub' || g || '@bench.test', 'x', now() from generate_series(1, ${SUBSCRIBERS}) g`)
  await db.execute(sql`
    insert into brief_settings (user_id, time_zone) select id, ${ZONE} from users`)
  await db.execute(sql`
    with u as (select id, row_number() over (order by id) - 1 as n from users),
         l as (select id, row_number() over (order by slug) - 1 as n from lakes)
    insert into subscriptions (user_id, lake_id) select u.id, l.id from u join l on l.n = u.n % ${LAKES}`)
  for (const [k, b] of banks.entries())
    await db.execute(sql`
      insert into banks (user_id, lake_id, name, points, cover, depth_m, exposure)
      select user_id, lake_id, ${b.name}, ${JSON.stringify(b.points)}::jsonb,
        ${k === 0 ? '{rock,sparse-grass}' : k === 1 ? '{wood}' : '{docks}'}::text[], 3,
        ${JSON.stringify(b.exposure)}::jsonb
      from subscriptions`)
}

/** Only the first `n` subscribers take the brief, and nothing has been sent yet. */
async function enableFirst(n: number) {
  await db.execute(sql`delete from brief_sends`)
  await db.execute(sql`
    update brief_settings b set enabled = (r.n <= ${n})
    from (select id, row_number() over (order by id) as n from users) r where r.id = b.user_id`)
}

/** A mailer that takes each rendered brief and keeps nothing but its size. */
function countingMailer() {
  const seen = { briefs: 0, bytes: 0 }
  const mailer: Mailer = {
    send: async (mail) => {
      seen.briefs++
      seen.bytes += mail.html.length + mail.text.length
      return { messageId: mail.messageId ?? '' }
    },
    close: () => undefined,
  }
  return { mailer, seen }
}

/** The job as the schedule runs it, for the first `n` subscribers, timed. */
async function timedRun(n: number, mailer: Mailer) {
  await enableFirst(n)
  const t0 = performance.now()
  const result = await sendBriefs({
    db,
    log,
    mail: { mailer, origin: 'https://chopline.example' },
    linkKey,
    now: () => NOW,
  })
  return { result, ms: performance.now() - t0 }
}

async function composeRun(n: number) {
  const { mailer, seen } = countingMailer()
  const { result, ms } = await timedRun(n, mailer)
  if (result.sent !== n) throw new Error(`expected ${n} briefs, sent ${result.sent}`)
  return { ms, perSecond: n / (ms / 1000), kbPerBrief: seen.bytes / seen.briefs / 1024 }
}

let smtpProcess: ReturnType<typeof spawn> | undefined
try {
  console.log('Seeding 100 lakes, 10,000 subscribers and 30,000 banks…')
  await seed()
  const rssStart = process.memoryUsage().rss
  const small = await composeRun(1_000)
  const large = await composeRun(SUBSCRIBERS)
  const peakRssMb = process.resourceUsage().maxRSS / 1024

  smtpProcess = spawn(
    process.execPath,
    ['--import', 'tsx', fileURLToPath(new URL('./mail-process.ts', import.meta.url))],
    { stdio: ['ignore', 'pipe', 'inherit'] },
  )
  const [line] = (await once(smtpProcess.stdout!, 'data')) as [Buffer]
  const mailer = smtpMailer(line.toString().trim(), 'Chopline <brief@chopline.example>')
  const { result: sent, ms: smtpMs } = await timedRun(1_000, mailer)
  mailer.close()

  const growth = small.perSecond / large.perSecond
  console.table({
    'briefs/s, 1,000 subscribers': Math.round(small.perSecond),
    'briefs/s, 10,000 subscribers': Math.round(large.perSecond),
    'per-brief cost, 10,000 vs 1,000': growth.toFixed(2),
    'all 10,000 composed and rendered (s)': (large.ms / 1000).toFixed(1),
    'brief size, HTML + text (kB)': large.kbPerBrief.toFixed(1),
    'peak RSS (MB)': Math.round(peakRssMb),
    'RSS before the runs (MB)': Math.round(rssStart / 1048576),
    'sent through SMTP': sent.sent,
    'briefs/s through SMTP': Math.round(sent.sent / (smtpMs / 1000)),
    targets: '10,000 in < 20 s, peak < 512 MB, cost flat with count',
  })
  console.log(
    JSON.stringify({
      bench: 'brief',
      briefsPerSecond1k: Math.round(small.perSecond),
      briefsPerSecond10k: Math.round(large.perSecond),
      costRatio10kTo1k: Number(growth.toFixed(2)),
      composeAll10kMs: Math.round(large.ms),
      peakRssMb: Math.round(peakRssMb),
      smtpSent: sent.sent,
      smtpBriefsPerSecond: Math.round(sent.sent / (smtpMs / 1000)),
      pass: large.ms < 20_000 && peakRssMb < 512 && sent.sent === 1_000,
    }),
  )
} finally {
  smtpProcess?.kill()
  await db.$client.end()
  await cluster.stop()
  rmSync(cluster.dataDir, { recursive: true, force: true })
}
