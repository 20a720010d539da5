import { asc, eq, inArray } from 'drizzle-orm'
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
  }
}
export type StationsRepo = ReturnType<typeof stationsRepo>
