import { spawn } from 'node:child_process'
import { once } from 'node:events'
import { rmSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { performance } from 'node:perf_hooks'
import { pipeline } from 'node:stream/promises'
import { Readable } from 'node:stream'
import { sql } from 'drizzle-orm'
import { pino } from 'pino'
import copyStreams from 'pg-copy-streams'
import { startCluster } from '../../server/db/cluster'
import { createDb } from '../../server/db/index'
import { migrateDb } from '../../server/db/migrate'
import { datastreams, lakes, stations } from '../../server/db/schema/index'
import { DEMO_LAKES, demoShoreline } from '../../server/db/seed/demo-lakes'
import { BENCH_NOW, BENCH_PARAMS, BENCH_UNITS, benchStations } from './bench-stations'
import { ingestReadings } from '../../server/features/ingest/readings.ingest'
import { median } from '../../shared/conditions/trend'

/**
 * One day of 15-minute readings for 500 stations x 4 parameters (192,000 rows) through the real
 * job path (the fake feed over HTTP, zod, plausibility, a transaction per page), against the same
 * rows loaded with COPY into a scratch table in the same run.
 */
const STATIONS = 500
const PARAMS = BENCH_PARAMS
const UNITS = BENCH_UNITS
const NOW = BENCH_NOW
const RUNS = 3
const dataDir = fileURLToPath(new URL('../../.tmp/pg-bench', import.meta.url))

const cluster = await startCluster({
  dataDir,
  port: 54391,
  user: 'bench',
  password: 'bench',
  database: 'bench',
  durable: false,
})
const db = createDb(cluster.url(), { max: 12 })
try {
  await migrateDb(db)
  await db.execute(sql`truncate lakes cascade`)
  const shape = DEMO_LAKES[0]!
  const [lake] = await db
    .insert(lakes)
    .values({
      slug: 'bench',
      name: 'Bench Lake',
      region: 'Bench',
      timeZone: 'UTC',
      normalPoolM: 100,
      shoreline: demoShoreline(shape),
      areaKm2: 10,
      centerLon: shape.center[0],
      centerLat: shape.center[1],
    })
    .returning()
  const feedStations = benchStations(STATIONS)
  const rows = await db
    .insert(stations)
    .values(
      feedStations.map((s) => ({ lakeId: lake!.id, name: s.name, feedThingId: String(s.thingId) })),
    )
    .returning({ id: stations.id, thing: stations.feedThingId })
  // Marks set so that, with the job's one-hour overlap, each datastream reads exactly the last day.
  const mark = new Date(NOW.getTime() - 23 * 3_600_000)
  await db.insert(datastreams).values(
    rows.flatMap((r) =>
      PARAMS.map((parameter, i) => ({
        stationId: r.id,
        parameter,
        feedDatastreamId: String(Number(r.thing) * 10 + i),
        unit: UNITS[parameter],
        highWaterMark: mark,
      })),
    ),
  )
  // The feed runs in its own process, as a hosted feed would, so its work is not counted as ours.
  const feedProcess = spawn(
    process.execPath,
    [
      '--import',
      'tsx',
      fileURLToPath(new URL('./feed-process.ts', import.meta.url)),
      String(STATIONS),
    ],
    {
      stdio: ['ignore', 'pipe', 'inherit'],
    },
  )
  const [firstLine] = (await once(feedProcess.stdout!, 'data')) as [Buffer]
  const feed = { url: firstLine.toString().trim(), close: async () => void feedProcess.kill() }

  const rssBefore = process.memoryUsage().rss
  const runJob = async () => {
    const t0 = performance.now()
    const summary = await ingestReadings({
      db,
      feedUrl: feed.url,
      log: pino({ level: 'silent' }),
      now: () => NOW,
      pageSize: 1000,
    })
    return { summary, ms: performance.now() - t0 }
  }

  // The baseline: the same rows as CSV through COPY into a scratch table with the same keys.
  const first = await runJob()
  // Read before the baseline's CSV is built in this process, so it is the job's own peak.
  const peakRssMb = process.resourceUsage().maxRSS / 1024
  const stored = await db.execute<{ line: string }>(
    sql`select concat_ws(',', station_id, parameter, to_char(observed_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"'), value, original_value, original_unit) as line from readings`,
  )
  const csv = stored.rows.map((r) => r.line).join('\n') + '\n'
  const runCopy = async () => {
    await db.execute(sql`drop table if exists readings_scratch`)
    await db.execute(sql`create table readings_scratch (like readings including all)`)
    const client = await db.$client.connect()
    const t1 = performance.now()
    await pipeline(
      Readable.from([csv]),
      client.query(
        copyStreams.from(
          'copy readings_scratch (station_id, parameter, observed_at, value, original_value, original_unit) from stdin with (format csv)',
        ),
      ),
    )
    client.release()
    return performance.now() - t1
  }

  // This machine is noisy: job and COPY run in turn, RUNS times each, and the medians are compared.
  const jobRuns = [first.ms]
  const copyRuns = [await runCopy()]
  for (let i = 1; i < RUNS; i++) {
    await db.execute(sql`truncate readings, quarantine`)
    await db.update(datastreams).set({ highWaterMark: mark })
    jobRuns.push((await runJob()).ms)
    copyRuns.push(await runCopy())
  }
  await feed.close()
  const summary = first.summary
  const jobMs = median(jobRuns)
  const copyMs = median(copyRuns)

  const ratio = jobMs / copyMs
  console.table({
    'rows ingested': summary.good,
    'rows expected': STATIONS * PARAMS.length * 96,
    quarantined: summary.quarantined,
    'job runs (ms)': jobRuns.map(Math.round).join(', '),
    'COPY runs (ms)': copyRuns.map(Math.round).join(', '),
    'job, median (ms)': Math.round(jobMs),
    'COPY, median (ms)': Math.round(copyMs),
    'job / COPY': ratio.toFixed(2),
    'rows/s (job)': Math.round(summary.good / (jobMs / 1000)),
    'peak RSS (MB)': Math.round(peakRssMb),
    'RSS at start (MB)': Math.round(rssBefore / 1048576),
    targets: 'ratio <= 3, job < 20 s, peak < 400 MB',
  })
  console.log(
    JSON.stringify({
      bench: 'ingest',
      rows: summary.good,
      jobMs: Math.round(jobMs),
      copyMs: Math.round(copyMs),
      ratioJobToCopy: Number(ratio.toFixed(2)),
      peakRssMb: Math.round(peakRssMb),
      pass: ratio <= 3 && jobMs < 20_000 && peakRssMb < 400,
    }),
  )
} finally {
  await db.$client.end()
  await cluster.stop()
  rmSync(cluster.dataDir, { recursive: true, force: true })
}
