import { and, count, desc, eq, getTableColumns, gte, isNull, lte, or, sql } from 'drizzle-orm'
import type { Parameter } from '../../../shared/readings'
import type { Db } from '../../db/index'
import {
  datastreams,
  lakes,
  quarantine,
  readings,
  stations,
  weatherHours,
} from '../../db/schema/index'

export interface GoodRow {
  observedAt: Date
  value: number
  originalValue: number
}

export interface QuarantineRow {
  feedId: string
  observedAt: Date | null
  raw: unknown
  reason: string
  detail: string
}

export type DatastreamRow = typeof datastreams.$inferSelect
export type StationRow = typeof stations.$inferSelect
export type WeatherRow = typeof weatherHours.$inferInsert

const snake = (key: string) => key.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`)
/** Every forecast column but the key, taken from the incoming row. */
const FORECAST_UPDATE = Object.fromEntries(
  Object.keys(getTableColumns(weatherHours))
    .filter((key) => !['lakeId', 'kind', 'at'].includes(key))
    .map((key) => [key, sql.raw(`excluded.${snake(key)}`)]),
)

export function ingestRepo(db: Db) {
  return {
    /** Stations to read now: active, and not resting behind an open circuit breaker. */
    dueStations: (now: Date, lakeId?: string) =>
      db
        .select()
        .from(stations)
        .where(
          and(
            eq(stations.active, true),
            or(isNull(stations.circuitOpenUntil), lte(stations.circuitOpenUntil, now)),
            lakeId ? eq(stations.lakeId, lakeId) : undefined,
          ),
        ),

    async syncDatastreams(
      stationId: string,
      found: { feedId: string; parameter: Parameter; unit: string }[],
    ) {
      if (!found.length) return []
      await db
        .insert(datastreams)
        .values(
          found.map((d) => ({
            stationId,
            parameter: d.parameter,
            feedDatastreamId: d.feedId,
            unit: d.unit,
          })),
        )
        .onConflictDoUpdate({
          target: [datastreams.stationId, datastreams.parameter],
          set: { unit: sql`excluded.unit`, feedDatastreamId: sql`excluded.feed_datastream_id` },
        })
      return db.select().from(datastreams).where(eq(datastreams.stationId, stationId))
    },

    /** The last good reading at or before `at`, which a new reading's rate of change is judged against. */
    async lastGood(stationId: string, parameter: Parameter, at: Date | null) {
      const [row] = await db
        .select({ value: readings.value, at: readings.observedAt })
        .from(readings)
        .where(
          and(
            eq(readings.stationId, stationId),
            eq(readings.parameter, parameter),
            at ? lte(readings.observedAt, at) : undefined,
          ),
        )
        .orderBy(desc(readings.observedAt))
        .limit(1)
      return row
    },

    /**
     * One page in one transaction: good rows, quarantined rows and the datastream's progress mark
     * move together, so a crash leaves the whole page or none of it. Repeats change nothing.
     */
    async commitPage(
      ds: DatastreamRow,
      good: GoodRow[],
      bad: QuarantineRow[],
      mark: { highWaterMark?: Date; backfillCursor?: Date },
    ) {
      await db.transaction(async (tx) => {
        if (good.length) {
          await tx.execute(sql`
            insert into readings (station_id, parameter, observed_at, value, original_value, original_unit)
            -- One array parameter per column: a page is one statement, however long.
            select ${ds.stationId}::uuid, ${ds.parameter}::parameter, t, v, o, ${ds.unit}
            from unnest(${sql.param(good.map((g) => g.observedAt.toISOString()))}::timestamptz[],
                        ${sql.param(good.map((g) => g.value))}::float8[],
                        ${sql.param(good.map((g) => g.originalValue))}::float8[]) as u(t, v, o)
            on conflict do nothing`)
        }
        if (bad.length) {
          await tx
            .insert(quarantine)
            .values(bad.map((b) => ({ ...b, stationId: ds.stationId, parameter: ds.parameter })))
            .onConflictDoNothing()
        }
        const set: Partial<DatastreamRow> = {}
        if (mark.highWaterMark) set.highWaterMark = mark.highWaterMark
        if (mark.backfillCursor) set.backfillCursor = mark.backfillCursor
        if (Object.keys(set).length)
          await tx.update(datastreams).set(set).where(eq(datastreams.id, ds.id))
      })
    },

    async stationHealthFacts(stationId: string, now: Date) {
      const dayAgo = new Date(now.getTime() - 86_400_000)
      const [last] = await db
        .select({
          at: sql<Date | null>`max(${readings.observedAt})`.mapWith((v) =>
            v ? new Date(v) : null,
          ),
        })
        .from(readings)
        .where(eq(readings.stationId, stationId))
      const [rejected] = await db
        .select({ n: count() })
        .from(quarantine)
        .where(and(eq(quarantine.stationId, stationId), gte(quarantine.receivedAt, dayAgo)))
      // Missing quarter hours in the last day, for the parameters read every 15 minutes.
      const [gaps] = await db
        .execute<{ missing: number }>(
          sql`
        select coalesce(sum(greatest(0, expected - got)), 0)::int as missing from (
          select d.parameter,
                 floor(extract(epoch from (${now.toISOString()}::timestamptz -
                   greatest(${dayAgo.toISOString()}::timestamptz, min(r.observed_at)))) / 900)::int + 1 as expected,
                 count(r.observed_at)::int as got
          from datastreams d
          join readings r on r.station_id = d.station_id and r.parameter = d.parameter
           and r.observed_at > ${dayAgo.toISOString()}::timestamptz
          where d.station_id = ${stationId} and d.parameter <> 'secchi'
          group by d.parameter) per_parameter`,
        )
        .then((r) => r.rows)
      return {
        lastGoodAt: last?.at ?? null,
        rejected24h: rejected?.n ?? 0,
        gapCount: gaps?.missing ?? 0,
      }
    },

    updateStation: (id: string, set: Partial<StationRow>) =>
      db.update(stations).set(set).where(eq(stations.id, id)),

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
