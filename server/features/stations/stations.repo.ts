import { and, asc, eq, inArray, ne, sql } from 'drizzle-orm'
import type { Db } from '../../db/index'
import { datastreams, lakes, stations } from '../../db/schema/index'

export function stationsRepo(db: Db) {
  return {
    async listWithLakes() {
      const rows = await db
        .select({ station: stations, lake: { slug: lakes.slug, name: lakes.name } })
        .from(stations)
        .innerJoin(lakes, eq(lakes.id, stations.lakeId))
        .orderBy(asc(lakes.name), asc(stations.name))
      const streams = rows.length
        ? await db
            .select()
            .from(datastreams)
            .where(
              inArray(
                datastreams.stationId,
                rows.map((r) => r.station.id),
              ),
            )
            .orderBy(asc(datastreams.parameter))
        : []
      return { rows, streams }
    },

    allParameters: () =>
      db
        .select({ stationId: datastreams.stationId, parameter: datastreams.parameter })
        .from(datastreams),
    lakeId: async (slug: string) =>
      (await db.select({ id: lakes.id }).from(lakes).where(eq(lakes.slug, slug)))[0]?.id,
    async byId(id: string) {
      const [row] = await db.select().from(stations).where(eq(stations.id, id))
      return row
    },
    /** Inserts unless the feed identifier is taken; undefined then. */
    async create(values: StationValues, tx: Pick<Db, 'insert'> = db) {
      const [row] = await tx
        .insert(stations)
        .values(values)
        .onConflictDoNothing({ target: stations.feedThingId })
        .returning()
      return row
    },
    async feedIdTaken(feedThingId: string, exceptId: string) {
      const [row] = await db
        .select({ id: stations.id })
        .from(stations)
        .where(and(eq(stations.feedThingId, feedThingId), ne(stations.id, exceptId)))
      return !!row
    },
    /** Per UTC day over the last `days`: readings stored (by observation time) and rows refused. */
    /** Readings stored and refused per station and UTC day, over the last `days` days to `now`. */
    async histories(now: Date, days: number) {
      const { rows } = await db.execute<{
        station_id: string
        date: string
        stored: number
        rejected: number
      }>(sql`
        with days as (
          select (${now.toISOString()}::timestamptz at time zone 'UTC')::date - g as day
          from generate_series(0, ${days - 1}::int) as g),
        since as (select min(day)::timestamp at time zone 'UTC' as at from days),
        stored as (
          select station_id, (observed_at at time zone 'UTC')::date as day, count(*)::int as n
          from readings where observed_at >= (select at from since)
          group by 1, 2),
        rejected as (
          select station_id, (received_at at time zone 'UTC')::date as day, count(*)::int as n
          from quarantine where received_at >= (select at from since)
          group by 1, 2)
        select s.id as station_id, d.day::text as date,
          coalesce(st.n, 0) as stored, coalesce(rj.n, 0) as rejected
        from stations s cross join days d
        left join stored st on st.station_id = s.id and st.day = d.day
        left join rejected rj on rj.station_id = s.id and rj.day = d.day
        order by s.id, d.day`)
      return rows
    },
    update: (id: string, values: StationValues, tx: Pick<Db, 'update'> = db) =>
      tx.update(stations).set(values).where(eq(stations.id, id)),
  }
}

export type StationValues = Pick<
  typeof stations.$inferInsert,
  'name' | 'lakeId' | 'feedThingId' | 'active'
>
export type StationsRepo = ReturnType<typeof stationsRepo>
