import { and, asc, eq, gt, gte, inArray, lte } from 'drizzle-orm'
import type { Parameter } from '../../../shared/readings'
import type { Db } from '../../db/index'
import { lakes, readings, stations, weatherHours } from '../../db/schema/index'

export function lakeReadRepo(db: Db) {
  return {
    async lakeBySlug(slug: string) {
      const [row] = await db.select().from(lakes).where(eq(lakes.slug, slug))
      return row
    },
    async gauge(lakeId: string) {
      const [row] = await db
        .select()
        .from(stations)
        .where(and(eq(stations.lakeId, lakeId), eq(stations.active, true)))
        .orderBy(asc(stations.name))
        .limit(1)
      return row
    },
    series: (stationId: string, parameters: Parameter[], since: Date) =>
      db
        .select({ parameter: readings.parameter, at: readings.observedAt, value: readings.value })
        .from(readings)
        .where(
          and(
            eq(readings.stationId, stationId),
            inArray(readings.parameter, parameters),
            gte(readings.observedAt, since),
          ),
        )
        .orderBy(asc(readings.observedAt)),
    weather: (lakeId: string, kind: 'observed' | 'forecast', from: Date, to: Date) =>
      db
        .select()
        .from(weatherHours)
        .where(
          and(
            eq(weatherHours.lakeId, lakeId),
            eq(weatherHours.kind, kind),
            gt(weatherHours.at, from),
            lte(weatherHours.at, to),
          ),
        )
        .orderBy(asc(weatherHours.at)),
  }
}
export type LakeReadRepo = ReturnType<typeof lakeReadRepo>
