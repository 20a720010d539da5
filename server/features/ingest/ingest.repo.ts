import { isoOrNull } from '../../../shared/time'
import { and, eq, getTableColumns, inArray, isNull, lte, or, sql } from 'drizzle-orm'
import type { Parameter, QuarantineReason } from '../../../shared/readings'
import type { Db } from '../../db/index'
import { datastreams, lakes, quarantine, stations, weatherHours } from '../../db/schema/index'

export interface GoodRow {
  observedAt: Date
  value: number
  originalValue: number
}

export interface QuarantineRow {
  feedId: string
  observedAt: Date | null
  raw: unknown
  reason: QuarantineReason
  detail: string
}

export type DatastreamRow = typeof datastreams.$inferSelect

export interface PageCommit {
  ds: DatastreamRow
  good: GoodRow[]
  bad: QuarantineRow[]
  mark: { highWaterMark?: Date; backfillCursor?: Date }
}

export interface StationHealthUpdate {
  id: string
  state: 'ok' | 'stale' | 'failing'
  lastGoodAt: Date | null
  lastError: string | null
  gapCount: number
  rejected24h: number
  consecutiveFailures: number
  circuitOpenUntil: Date | null
}
export type StationRow = typeof stations.$inferSelect
export type WeatherRow = typeof weatherHours.$inferInsert

const snake = (key: string) => key.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`)
/** Every forecast column but the key, taken from the incoming row. */
const FORECAST_UPDATE = Object.fromEntries(
  Object.keys(getTableColumns(weatherHours))
    .filter((key) => !['lakeId', 'kind', 'at'].includes(key))
    .map((key) => [key, sql.raw(`excluded.${snake(key)}`)]),
)

/** A PostgreSQL array literal of values that never need quoting: finite numbers, ISO instants. */
const plainArray = (values: (number | string)[]) => `{${values.join(',')}}`

const isUniqueViolation = (err: unknown) =>
  err instanceof Error && (err.cause as { code?: string } | undefined)?.code === '23505'

/** Good rows as plain array literals: pg's per-element quoting of big arrays cost more than the insert. */
class GoodArrays {
  page: number[] = []
  at: string[] = []
  value: number[] = []
  original: number[] = []

  push(page: number, g: GoodRow) {
    this.page.push(page)
    this.at.push(g.observedAt.toISOString())
    this.value.push(g.value)
    this.original.push(g.originalValue)
  }

  /** The rows with their page's station, parameter and unit (joined from the `page` CTE). */
  select() {
    return sql`select p.station_id, p.parameter, r.observed_at, r.value, r.original_value, p.unit
      from unnest(${plainArray(this.page)}::int[], ${plainArray(this.at)}::timestamptz[],
                  ${plainArray(this.value)}::float8[], ${plainArray(this.original)}::float8[])
           as r(i, observed_at, value, original_value)
      join page p using (i)`
  }
}

/**
 * Good rows go in two sets, in one pass: rows after the page's datastream mark (new to us, a
 * plain insert) and the rest (the re-read overlap, ON CONFLICT); with `guardAll`, every row is in
 * the second set.
 */
function commitStatement(pages: PageCommit[], guardAll: boolean) {
  const bad = pages.flatMap((p) => p.bad.map((b) => ({ ...b, ds: p.ds })))
  const arr = <T>(rows: T[], f: (row: T) => unknown) => sql.param(rows.map(f))
  const fresh = new GoodArrays()
  const overlap = new GoodArrays()
  pages.forEach((p, i) => {
    const mark = guardAll ? undefined : p.ds.highWaterMark
    for (const g of p.good) (mark && g.observedAt > mark ? fresh : overlap).push(i + 1, g)
  })
  return sql`
    with page as (
      select * from unnest(${arr(pages, (p) => p.ds.id)}::uuid[], ${arr(pages, (p) => p.ds.stationId)}::uuid[],
                           ${arr(pages, (p) => p.ds.parameter)}::parameter[], ${arr(pages, (p) => p.ds.unit)}::text[],
                           ${arr(pages, (p) => isoOrNull(p.mark.highWaterMark))}::timestamptz[],
                           ${arr(pages, (p) => isoOrNull(p.mark.backfillCursor))}::timestamptz[])
        with ordinality as p(id, station_id, parameter, unit, hwm, cursor, i)
    ), fresh as (
      insert into readings (station_id, parameter, observed_at, value, original_value, original_unit)
      ${fresh.select()}
    ), overlap as (
      insert into readings (station_id, parameter, observed_at, value, original_value, original_unit)
      ${overlap.select()}
      on conflict do nothing
    ), bad as (
      insert into quarantine (station_id, parameter, feed_id, observed_at, raw, reason, detail)
      select * from unnest(${arr(bad, (b) => b.ds.stationId)}::uuid[], ${arr(bad, (b) => b.ds.parameter)}::text[],
                           ${arr(bad, (b) => b.feedId)}::text[], ${arr(bad, (b) => isoOrNull(b.observedAt))}::timestamptz[],
                           ${arr(bad, (b) => JSON.stringify(b.raw))}::jsonb[], ${arr(bad, (b) => b.reason)}::text[],
                           ${arr(bad, (b) => b.detail)}::text[])
      on conflict do nothing
    )
    update datastreams d
    set high_water_mark = coalesce(p.hwm, d.high_water_mark), backfill_cursor = coalesce(p.cursor, d.backfill_cursor)
    from page p
    where d.id = p.id`
}

export function ingestRepo(db: Db) {
  return {
    /**
     * Stations to read now: active, and not resting behind an open circuit breaker, unless one
     * station is asked for by name (an admin's "run now" tries it even with the breaker open).
     */
    dueStations: (now: Date, scope: { lakeId?: string; stationId?: string } = {}) =>
      db
        .select()
        .from(stations)
        .where(
          and(
            eq(stations.active, true),
            scope.stationId
              ? eq(stations.id, scope.stationId)
              : or(isNull(stations.circuitOpenUntil), lte(stations.circuitOpenUntil, now)),
            scope.lakeId ? eq(stations.lakeId, scope.lakeId) : undefined,
          ),
        ),

    /**
     * Records the datastreams the feed lists for each station and returns them all. Only new ones
     * and ones whose unit or feed id changed are written: most runs write nothing.
     */
    async syncDatastreams(
      found: { stationId: string; feedId: string; parameter: Parameter; unit: string }[],
    ) {
      if (!found.length) return []
      const stationIds = [...new Set(found.map((d) => d.stationId))]
      const known = await db
        .select()
        .from(datastreams)
        .where(inArray(datastreams.stationId, stationIds))
      const byKey = new Map(known.map((d) => [`${d.stationId}/${d.parameter}`, d]))
      const changed = found.filter((d) => {
        const stored = byKey.get(`${d.stationId}/${d.parameter}`)
        return !stored || stored.unit !== d.unit || stored.feedDatastreamId !== d.feedId
      })
      if (!changed.length) return known
      const written = await db
        .insert(datastreams)
        .values(
          changed.map((d) => ({
            stationId: d.stationId,
            parameter: d.parameter,
            feedDatastreamId: d.feedId,
            unit: d.unit,
          })),
        )
        .onConflictDoUpdate({
          target: [datastreams.stationId, datastreams.parameter],
          set: { unit: sql`excluded.unit`, feedDatastreamId: sql`excluded.feed_datastream_id` },
        })
        .returning()
      for (const d of written) byKey.set(`${d.stationId}/${d.parameter}`, d)
      return [...byKey.values()]
    },

    /** One station's datastreams. */
    datastreamsOf: (stationId: string) =>
      db.select().from(datastreams).where(eq(datastreams.stationId, stationId)),

    /**
     * For each datastream, the last good reading at or before `from(ds)`: what a new reading's rate
     * of change is judged against. One query for the whole run.
     */
    async lastGoodBefore(marks: { ds: DatastreamRow; from: Date }[]) {
      if (!marks.length) return new Map<string, { value: number; at: Date }>()
      const { rows } = await db.execute<{ id: string; value: number; at: string }>(sql`
        select m.id, r.value, r.observed_at as at
        from unnest(${sql.param(marks.map((m) => m.ds.id))}::uuid[],
                    ${sql.param(marks.map((m) => m.from.toISOString()))}::timestamptz[]) as m(id, since)
        join datastreams d on d.id = m.id
        cross join lateral (
          select value, observed_at from readings
          where station_id = d.station_id and parameter = d.parameter and observed_at <= m.since
          order by observed_at desc limit 1) r`)
      return new Map(rows.map((r) => [r.id, { value: r.value, at: new Date(r.at) }]))
    },

    /**
     * Pages as one statement: good rows, quarantined rows and each datastream's progress mark
     * commit together, so a crash leaves all of them or none. Repeats change nothing.
     *
     * Rows after a datastream's high-water mark are new to us and go in as a plain insert; only the
     * re-read overlap pays for ON CONFLICT. Should another writer have stored one of those rows
     * (a readings import, a backfill), the statement fails whole and is run again fully guarded.
     */
    async commitPages(pages: PageCommit[]) {
      try {
        await db.execute(commitStatement(pages, false))
      } catch (err) {
        if (!isUniqueViolation(err)) throw err
        await db.execute(commitStatement(pages, true))
      }
    },

    /**
     * Health facts for many stations in one query: last good reading, quarantined rows in the last
     * day, and missing quarter hours in the last day for the parameters read every 15 minutes.
     */
    async healthFacts(stationIds: string[], now: Date) {
      if (!stationIds.length)
        return new Map<string, { lastGoodAt: Date | null; rejected24h: number; gapCount: number }>()
      const dayAgo = new Date(now.getTime() - 86_400_000).toISOString()
      const { rows } = await db.execute<{
        id: string
        last_good_at: string | null
        rejected: number
        missing: number
      }>(sql`
        select s.id,
          (select max(observed_at) from readings r where r.station_id = s.id) as last_good_at,
          (select count(*)::int from quarantine q where q.station_id = s.id and q.received_at >= ${dayAgo}::timestamptz) as rejected,
          (select coalesce(sum(greatest(0, floor(extract(epoch from (${now.toISOString()}::timestamptz
                    - greatest(${dayAgo}::timestamptz, first_at))) / 900)::int + 1 - got)), 0)::int
             from (select min(r.observed_at) as first_at, count(*)::int as got
                   from readings r
                   where r.station_id = s.id and r.parameter <> 'secchi' and r.observed_at > ${dayAgo}::timestamptz
                   group by r.parameter) per_parameter) as missing
        from unnest(${sql.param(stationIds)}::uuid[]) as s(id)`)
      return new Map(
        rows.map((r) => [
          r.id,
          {
            lastGoodAt: r.last_good_at ? new Date(r.last_good_at) : null,
            rejected24h: r.rejected,
            gapCount: r.missing,
          },
        ]),
      )
    },

    /** Writes every station's health in one statement. */
    async updateHealth(now: Date, health: StationHealthUpdate[]) {
      if (!health.length) return
      const col = <K extends keyof StationHealthUpdate>(k: K) =>
        sql.param(health.map((h) => h[k] ?? null))
      const isoCol = (k: 'lastGoodAt' | 'circuitOpenUntil') =>
        sql.param(health.map((h) => h[k]?.toISOString() ?? null))
      await db.execute(sql`
        update stations s set
          state = u.state::station_state, last_good_at = u.last_good_at, last_error = u.last_error,
          gap_count = u.gap_count, rejected24h = u.rejected, consecutive_failures = u.failures,
          circuit_open_until = u.open_until, last_run_at = ${now.toISOString()}::timestamptz, updated_at = now()
        from unnest(${col('id')}::uuid[], ${col('state')}::text[], ${isoCol('lastGoodAt')}::timestamptz[],
                    ${col('lastError')}::text[], ${col('gapCount')}::int[], ${col('rejected24h')}::int[],
                    ${col('consecutiveFailures')}::int[], ${isoCol('circuitOpenUntil')}::timestamptz[])
             as u(id, state, last_good_at, last_error, gap_count, rejected, failures, open_until)
        where s.id = u.id`)
    },

    lakesWithSlugs: () => db.select({ id: lakes.id, slug: lakes.slug }).from(lakes),

    async weatherCursor(lakeId: string) {
      const [row] = await db
        .select({ at: sql<string | null>`max(${weatherHours.at})` })
        .from(weatherHours)
        .where(and(eq(weatherHours.lakeId, lakeId), eq(weatherHours.kind, 'observed')))
      return row?.at ? new Date(row.at) : null
    },

    /** Observations are facts (first write wins); a newer forecast replaces the older one hour by hour. */
    async commitWeather(
      rows: WeatherRow[],
      bad: (QuarantineRow & { lakeId: string })[],
      kind: 'observed' | 'forecast',
      now: Date,
    ) {
      await db.transaction(async (tx) => {
        if (rows.length) {
          const insert = tx.insert(weatherHours).values(rows)
          if (kind === 'observed') await insert.onConflictDoNothing()
          else {
            await insert.onConflictDoUpdate({
              target: [weatherHours.lakeId, weatherHours.kind, weatherHours.at],
              set: FORECAST_UPDATE,
            })
            // Forecast hours now in the past are superseded by observations.
            await tx
              .delete(weatherHours)
              .where(and(eq(weatherHours.kind, 'forecast'), lte(weatherHours.at, now)))
          }
        }
        if (bad.length)
          await tx
            .insert(quarantine)
            .values(bad.map((b) => ({ ...b, parameter: 'weather' })))
            .onConflictDoNothing()
      })
    },
  }
}
export type IngestRepo = ReturnType<typeof ingestRepo>
