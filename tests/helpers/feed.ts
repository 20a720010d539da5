import { eq, sql } from 'drizzle-orm'
import { pino } from 'pino'
import type { Db } from '../../server/db/index'
import { datastreams, quarantine, readings, stations } from '../../server/db/schema/index'
import { DEMO_STATIONS } from '../../server/db/seed/demo-stations'
import { startFeed } from '../../server/fakes/feed/index'
import type { FetchPolicy } from '../../server/features/ingest/feed-client'
import type { IngestDeps } from '../../server/features/ingest/readings.ingest'

/** Short timeouts and backoff, so fault runs finish quickly. */
export const TEST_POLICY: FetchPolicy = {
  timeoutMs: 200,
  retries: 2,
  baseDelayMs: 5,
  maxDelayMs: 20,
}

/** The fake feed with a clock the test moves by hand. */
export async function startTestFeed(start: string, seed = 7) {
  let now = new Date(start)
  const feed = await startFeed({ seed, stations: DEMO_STATIONS, now: () => now })
  return {
    ...feed,
    now: () => now,
    setNow: (iso: string | Date) => {
      now = new Date(iso)
    },
    advance: (hours: number) => {
      now = new Date(now.getTime() + hours * 3_600_000)
    },
  }
}
export type TestFeed = Awaited<ReturnType<typeof startTestFeed>>

export function ingestDeps(db: Db, feed: TestFeed, extra: Partial<IngestDeps> = {}): IngestDeps {
  return {
    db,
    feedUrl: feed.url,
    log: pino({ level: 'silent' }),
    now: feed.now,
    policy: TEST_POLICY,
    ...extra,
  }
}

/** The readings table as comparable text rows, in a stable order. */
export async function readingRows(db: Db): Promise<string[]> {
  const rows = await db
    .select({
      s: stations.feedThingId,
      p: readings.parameter,
      at: readings.observedAt,
      v: readings.value,
    })
    .from(readings)
    .innerJoin(stations, eq(stations.id, readings.stationId))
    .orderBy(stations.feedThingId, readings.parameter, readings.observedAt)
  return rows.map((r) => `${r.s}|${r.p}|${r.at.toISOString()}|${r.v.toFixed(6)}`)
}

export async function quarantineIds(db: Db): Promise<Set<string>> {
  return new Set((await db.select({ id: quarantine.feedId }).from(quarantine)).map((r) => r.id))
}

/** Forget how far ingestion got, so the next run reads its whole first window again. */
export async function resetMarks(db: Db) {
  await db.update(datastreams).set({ highWaterMark: null, backfillCursor: null })
}

export async function stationByThing(db: Db, thingId: number) {
  const [row] = await db
    .select()
    .from(stations)
    .where(eq(stations.feedThingId, String(thingId)))
  return row!
}

export const countReadings = async (db: Db) =>
  Number((await db.execute<{ n: string }>(sql`select count(*) as n from readings`)).rows[0]!.n)
