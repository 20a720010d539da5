import { parseArgs } from 'node:util'
import cliProgress from 'cli-progress'
import { eq } from 'drizzle-orm'
import { createDb } from '../server/db/index'
import { lakes } from '../server/db/schema/index'
import { localConnection } from '../server/cli/local-config'
import { loadEnv } from '../server/env'
import { backfillReadings } from '../server/features/ingest/readings.ingest'
import { createLogger } from '../server/logger'

/**
 * `npm run backfill -- --lake <slug> --days 365 [--until <ISO>]`: a lake's history through the same
 * validation as live ingestion, with a progress bar, next to npm start (or with DATABASE_URL and
 * FEED_URL). Ctrl-C is safe: a rerun resumes from the last committed page.
 */
const { values } = parseArgs({
  options: {
    lake: { type: 'string' },
    days: { type: 'string', default: '365' },
    until: { type: 'string' },
  },
})
const env = loadEnv()
const days = Number(values.days)
// History up to this instant (default now), so a rerun covers exactly the same window.
const until = values.until ? new Date(values.until) : new Date()
if (
  !values.lake ||
  !Number.isFinite(days) ||
  days <= 0 ||
  days > 3650 ||
  Number.isNaN(until.getTime())
) {
  console.error('Usage: npm run backfill -- --lake <slug> --days <1-3650> [--until <ISO instant>]')
  process.exit(2)
}
const { databaseUrl, feedUrl } = localConnection(env)
const db = createDb(databaseUrl, { max: 4 })
const [lake] = await db.select().from(lakes).where(eq(lakes.slug, values.lake))
if (!lake) {
  console.error(`No lake with slug "${values.lake}".`)
  process.exit(2)
}
const bar = new cliProgress.SingleBar(
  {
    format:
      '{bar} {percentage}% | {rows} rows, {quarantined} quarantined | {rate} rows/s | ETA {eta_formatted}',
  },
  cliProgress.Presets.shades_classic,
)
const started = Date.now()
let rows = 0
let quarantined = 0
bar.start(100, 0, { rows, quarantined, rate: 0 })
const result = await backfillReadings(
  { db, feedUrl, log: createLogger('warn'), now: () => until },
  lake.id,
  days,
  (p) => {
    rows += p.good
    quarantined += p.quarantined
    const span = p.until.getTime() - p.from.getTime()
    const done = p.latest ? (p.latest.getTime() - p.from.getTime()) / span : 0
    const rate = Math.round(rows / Math.max(1, (Date.now() - started) / 1000))
    bar.update(Math.min(100, Math.round(done * 100)), { rows, quarantined, rate })
  },
)
bar.update(100)
bar.stop()
console.log(
  `Backfilled ${result.good} readings (${result.quarantined} quarantined) for ${lake.name}.`,
)
await db.$client.end()
