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

    parametersOf: (stationId: string) =>
      db
        .select({ parameter: datastreams.parameter })
        .from(datastreams)
        .where(eq(datastreams.stationId, stationId)),
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
    async history(id: string, now: Date, days: number) {
      const { rows } = await db.execute<{ date: string; stored: number; rejected: number }>(sql`
        select d::date::text as date,
          (select count(*)::int from readings r where r.station_id = ${id}
             and r.observed_at >= d and r.observed_at < d + interval '1 day') as stored,
          (select count(*)::int from quarantine q where q.station_id = ${id}
             and q.received_at >= d and q.received_at < d + interval '1 day') as rejected
        from generate_series(date_trunc('day', ${now.toISOString()}::timestamptz at time zone 'UTC') - ${days - 1} * interval '1 day',
                             date_trunc('day', ${now.toISOString()}::timestamptz at time zone 'UTC'), interval '1 day') as d
        order by d`)
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
