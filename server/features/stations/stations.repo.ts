import { and, asc, eq, inArray, ne } from 'drizzle-orm'
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
    update: (id: string, values: StationValues, tx: Pick<Db, 'update'> = db) =>
      tx.update(stations).set(values).where(eq(stations.id, id)),
  }
}

export type StationValues = Pick<
  typeof stations.$inferInsert,
  'name' | 'lakeId' | 'feedThingId' | 'active'
>
export type StationsRepo = ReturnType<typeof stationsRepo>
