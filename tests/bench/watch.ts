import { readdirSync, readFileSync, rmSync } from 'node:fs'
import { loadavg } from 'node:os'
import { performance } from 'node:perf_hooks'
import { fileURLToPath } from 'node:url'
import { sql } from 'drizzle-orm'
import { lakeDay, type ForecastHour } from '../../shared/conditions/day-plan'
import { exposureTable } from '../../shared/conditions/exposure'
import type { Polygon } from '../../shared/geo/types'
import type { WatchConditions } from '../../shared/schemas/watch'
import { addDays } from '../../shared/time'
import { startCluster } from '../../server/db/cluster'
import { createDb } from '../../server/db/index'
import { migrateDb } from '../../server/db/migrate'
import { insertBenchLakes } from './bench-lakes'
import { lakeDays, lakes } from '../../server/db/schema/index'
import { DEMO_LAKES, demoShoreline } from '../../server/db/seed/demo-lakes'
import { matchWatches, WATCH_PAGE } from '../../server/features/watch/watch-check'
import { watchRepo } from '../../server/features/watch/watch.repo'

/**
 * 100,000 watches (10,000 anglers × 10: on their banks and lake-wide, five kinds of conditions)
 * across 100 lakes with 7 forecast days each, judged against a fresh forecast by the real
 * matcher: every watch read in pages, every window judged, every new match claimed as an alert
 * row and every match that ended cleared. Timed on a fresh forecast after one judged before (the
 * hourly refresh), for 10,000 and then all 100,000 watches so the per-watch cost can be compared;
 * the very first run (every match new) and a run with nothing changed are shown beside it.
 * Sending is not timed here (the brief bench times the mail path).
 */
const LAKES = 100
const ANGLERS = 10_000
const WATCHES_EACH = 10
const DATE = '2026-04-10'
const DAYS = 7
const ZONE = 'America/Chicago'
/** 05:00 in Chicago on the first day: every window is still ahead. */
const NOW = new Date('2026-04-10T10:00:00Z')
const dataDir = fileURLToPath(new URL('../../.tmp/pg-bench-watch', import.meta.url))

const cluster = await startCluster({
  dataDir,
  port: 54396,
  user: 'bench',
  password: 'bench',
  database: 'bench',
  durable: false,
})
const db = createDb(cluster.url(), { max: 8 })

const KINDS: WatchConditions[] = [
  {
    wind: { onto: true, min: 8, max: 20, unit: 'mph' },
    clarity: ['stained', 'lightly-stained'],
    phases: [],
    windows: [],
    notNoGo: true,
    daysAhead: null,
  },
  {
    wind: { onto: false, min: 5, max: 12, unit: 'mph' },
    clarity: [],
    phases: ['pre-spawn'],
    windows: [],
    notNoGo: true,
    daysAhead: null,
  },
  {
    wind: { onto: true, min: 10, max: 15, unit: 'knots' },
    clarity: [],
    phases: [],
    windows: ['dawn'],
    notNoGo: true,
    daysAhead: null,
  },
  { wind: null, clarity: ['clear'], phases: [], windows: [], notNoGo: true, daysAhead: null },
  {
    wind: { onto: false, min: 0, max: 30, unit: 'kmh' },
    clarity: [],
    phases: ['spawn'],
    windows: [],
    notNoGo: false,
    daysAhead: null,
  },
]

/**
 * A lake's days from a forecast: each day's wind (1 to 11 m/s, from anywhere) set by the lake and
 * the day, rising through the day. `shiftHours` moves the weather along: an hour as the hourly
 * refresh might, a day to change every window.
 */
function forecast(shoreline: Polygon, lakeId: string, i: number, shiftHours: number) {
  const hourly: ForecastHour[] = Array.from({ length: 24 * (DAYS + 1) }, (_, hour) => {
    const h = hour + shiftHours
    const d = Math.floor(h / 24)
    const base = 1 + ((i * 7 + d * 5) % 11)
    return {
      at: new Date(Date.UTC(2026, 3, 9, 5 + hour)).toISOString(),
      windFromDeg: (i * 37 + d * 71 + h) % 360,
      windMs: base + (h % 24) / 12,
      gustMs: base * 1.4 + 1,
      airC: 18,
      relativeHumidityPct: 60,
      cloudCoverPct: 40,
      thunderstormProbabilityPct: h % 24 > 14 ? 20 : 0,
    }
  })
  return Array.from({ length: DAYS }, (_, d) => ({
    lakeId,
    date: addDays(DATE, d),
    computedAt: NOW,
    day: lakeDay({
      lake: shoreline,
      date: addDays(DATE, d),
      timeZone: ZONE,
      hourly,
      waterC: 12.5,
      secchiM: 0.5,
      phase: 'pre-spawn',
    }),
  }))
}

/** Every lake's days replaced by the forecast moved `shiftHours` along. */
async function newForecast(shiftHours: number) {
  const shoreline = demoShoreline(DEMO_LAKES[0]!) as Polygon
  const rows = await db.select({ id: lakes.id }).from(lakes).orderBy(lakes.slug)
  await db.execute(sql`truncate lake_days`)
  for (const [i, lake] of rows.entries())
    await db.insert(lakeDays).values(forecast(shoreline, lake.id, i, shiftHours))
}

async function seed() {
  await migrateDb(db)
  const { rows, shoreline, shore } = await insertBenchLakes(db, LAKES, ZONE)
  for (const [i, lake] of rows.entries()) {
    await db.insert(lakeDays).values(forecast(shoreline, lake.id, i, 0))
  }
  const banks = [10, 120, 240].map((at, k) => {
    const points = [shore[at]!, shore[at + 4]!]
    return { name: `Bank ${k + 1}`, points, exposure: exposureTable(shoreline, points) }
  })
  // Rows made by PostgreSQL, so this process's memory is the matcher's alone.
  await db.execute(sql`
    insert into users (email, password_hash, email_verified_at)
    select 'w' || g || '@bench.test', 'x', now() from generate_series(1, ${ANGLERS}) g`)
  await db.execute(sql`
    create temporary table angler_lake as
    select u.id as user_id, l.id as lake_id, u.n
    from (select id, row_number() over (order by id) - 1 as n from users) u
    join (select id, row_number() over (order by slug) - 1 as n from lakes) l on l.n = u.n % ${LAKES}`)
  for (const b of banks)
    await db.execute(sql`
      insert into banks (user_id, lake_id, name, points, cover, exposure)
      select user_id, lake_id, ${b.name}, ${JSON.stringify(b.points)}::jsonb, '{rock}',
        ${JSON.stringify(b.exposure)}::jsonb
      from angler_lake`)
  await db.execute(sql`
    insert into watches (user_id, lake_id, bank_id, name, conditions, channels)
    select a.user_id, a.lake_id,
      case when k % 2 = 0 then (select b.id from banks b where b.user_id = a.user_id
        order by b.name offset (k / 2) % 3 limit 1) end,
      'Watch ' || k, (${JSON.stringify(KINDS)}::jsonb) -> (k % ${KINDS.length}), '{email}'
    from angler_lake a cross join generate_series(0, ${WATCHES_EACH - 1}) k`)
}

/** Only the first `n` watches are active, and no alert has been claimed yet. */
async function activateFirst(n: number) {
  await db.execute(sql`truncate watch_alerts`)
  await db.execute(sql`
    update watches w set active = (r.n <= ${n}), episodes = '{}'
    from (select id, row_number() over (order by id) as n from watches) r where r.id = w.id`)
  await db.execute(sql`vacuum analyze watches`)
  await db.execute(sql`vacuum analyze watch_alerts`)
}

/**
 * CPU time PostgreSQL's processes have used (the postmaster and its children, from /proc, so
 * Linux only), in ms. With this process's own, a run's cost that does not grow when others load
 * the shared machine the way its wall time does.
 */
function postgresCpuMs() {
  const postmaster = Number(readFileSync(`${dataDir}/postmaster.pid`, 'utf8').split('\n')[0])
  let ticks = 0
  for (const pid of readdirSync('/proc')) {
    if (!/^\d+$/.test(pid)) continue
    let stat: string
    try {
      stat = readFileSync(`/proc/${pid}/stat`, 'utf8')
    } catch {
      continue // gone meanwhile
    }
    // After the command in parentheses: state, ppid, …; utime and stime are fields 14 and 15.
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ')
    if (Number(pid) === postmaster || Number(fields[1]) === postmaster)
      ticks += Number(fields[11]) + Number(fields[12])
  }
  return ticks * 10 // USER_HZ is 100 on Linux
}

async function timedRun() {
  const t0 = performance.now()
  const pg0 = postgresCpuMs()
  const cpu0 = process.cpuUsage()
  const result = await matchWatches(db, { now: NOW, leaseUntil: new Date(NOW.getTime() + 600_000) })
  const cpu = process.cpuUsage(cpu0)
  return {
    ms: performance.now() - t0,
    cpuMs: (cpu.user + cpu.system) / 1000,
    pgCpuMs: postgresCpuMs() - pg0,
    watches: result.watches,
    claimed: result.claimed.length,
    cleared: result.cleared,
    phases: result.phases,
  }
}

/**
 * The baseline, on the same machine at the same moment: every active watch read page by page
 * through the matcher's own query, and nothing judged or written. The machine is shared, so the
 * matcher is also given as a multiple of this.
 */
async function readOnly() {
  const repo = watchRepo(db)
  const t0 = performance.now()
  let after = '00000000-0000-0000-0000-000000000000'
  for (;;) {
    const page = await repo.watchPage(after, WATCH_PAGE)
    if (!page.length) break
    after = page.at(-1)!.id
  }
  return performance.now() - t0
}

try {
  console.log('Seeding 100 lakes × 7 days, 10,000 anglers, 30,000 banks and 100,000 watches…')
  await seed()
  // Each size: a first run on one forecast (every watch new), then the timed run on the next
  // forecast, as the hourly refresh brings it, then once more with nothing changed.
  await newForecast(0)
  await activateFirst(10_000)
  await timedRun()
  await newForecast(3)
  const small = await timedRun()
  await newForecast(0)
  await activateFirst(ANGLERS * WATCHES_EACH)
  const cold = await timedRun()
  await newForecast(3)
  const large = await timedRun()
  const readMs = await readOnly()
  const unchanged = await timedRun()
  await newForecast(27)
  const dayAlong = await timedRun()
  const peakRssMb = process.resourceUsage().maxRSS / 1024
  const perWatchSmall = (small.ms * 1000) / small.watches
  const perWatchLarge = (large.ms * 1000) / large.watches
  const ratio = perWatchLarge / perWatchSmall
  console.table({
    'watches judged, small run': small.watches,
    'small run (ms)': Math.round(small.ms),
    'watches judged, large run': large.watches,
    'first run ever, every watch new (ms)': Math.round(cold.ms),
    'alerts claimed, first run': cold.claimed,
    'large run, fresh forecast 3 h along (ms)': Math.round(large.ms),
    'large run, CPU: this process / PostgreSQL (ms)': `${Math.round(large.cpuMs)} / ${large.pgCpuMs}`,
    'machine load (1-minute average) at the end': loadavg()[0]!.toFixed(1),
    'baseline: reading the 100,000 watches only (ms)': Math.round(readMs),
    'large run / reading only': (large.ms / readMs).toFixed(2),
    'alerts claimed, fresh forecast': large.claimed,
    'alerts cleared, fresh forecast': large.cleared,
    'large run again, nothing changed (ms)': Math.round(unchanged.ms),
    'alerts claimed again': unchanged.claimed,
    'forecast a day along, most windows change (ms)': Math.round(dayAlong.ms),
    'alerts claimed / cleared, a day along': `${dayAlong.claimed} / ${dayAlong.cleared}`,
    'fresh run: lakes judged / watches read / bank tables / judging / writes waited (ms)': [
      large.phases.lakes,
      large.phases.read,
      large.phases.tables,
      large.phases.judge,
      large.phases.write,
    ].join(' / '),
    'µs per watch, 10,000': perWatchSmall.toFixed(1),
    'µs per watch, 100,000': perWatchLarge.toFixed(1),
    'per-watch cost, 100,000 vs 10,000': ratio.toFixed(2),
    'peak RSS (MB)': Math.round(peakRssMb),
    target: '100,000 in ≤ 5 s, cost flat per watch',
  })
  console.log(
    JSON.stringify({
      bench: 'watch',
      watches: large.watches,
      freshMs: Math.round(large.ms),
      freshPhasesMs: large.phases,
      freshCpuMs: Math.round(large.cpuMs),
      freshPgCpuMs: large.pgCpuMs,
      loadAvg1m: Number(loadavg()[0]!.toFixed(1)),
      baselineReadMs: Math.round(readMs),
      ratioFreshToRead: Number((large.ms / readMs).toFixed(2)),
      unchangedMs: Math.round(unchanged.ms),
      claimed: large.claimed,
      cleared: large.cleared,
      firstRunMs: Math.round(cold.ms),
      firstRunClaimed: cold.claimed,
      dayAlongMs: Math.round(dayAlong.ms),
      dayAlongClaimed: dayAlong.claimed,
      usPerWatch10k: Number(perWatchSmall.toFixed(1)),
      usPerWatch100k: Number(perWatchLarge.toFixed(1)),
      costRatio100kTo10k: Number(ratio.toFixed(2)),
      peakRssMb: Math.round(peakRssMb),
      pass: large.ms <= 5_000 && unchanged.claimed === 0 && ratio < 1.5,
    }),
  )
} finally {
  await db.$client.end()
  await cluster.stop()
  rmSync(cluster.dataDir, { recursive: true, force: true })
}
