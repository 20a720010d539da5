import { and, asc, eq, gt, gte, inArray, lt, lte, sql } from 'drizzle-orm'
import type { PhaseState } from '../../../shared/conditions/season'
import type { Parameter } from '../../../shared/readings'
import type { Db } from '../../db/index'
import { lakePhases, lakes, readings, stations, weatherHours } from '../../db/schema/index'

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
    /** Observed rain at a lake, hour by hour, after `from` up to `to` (for the clarity trend). */
    rainfall: (lakeId: string, from: Date, to: Date) =>
      db
        .select({ at: weatherHours.at, mm: weatherHours.precipitationMm })
        .from(weatherHours)
        .where(
          and(
            eq(weatherHours.lakeId, lakeId),
            eq(weatherHours.kind, 'observed'),
            gt(weatherHours.at, from),
            lte(weatherHours.at, to),
          ),
        )
        .orderBy(asc(weatherHours.at)),
    /** The lake's stored seasonal phase state, or undefined before its first phase. */
    async phaseState(lakeId: string): Promise<PhaseState | undefined> {
      const [row] = await db.select().from(lakePhases).where(eq(lakePhases.lakeId, lakeId))
      return (
        row && {
          phase: row.phase,
          since: row.since,
          pending: row.pendingPhase,
          pendingDays: row.pendingDays,
          lastDay: row.lastDay,
          meanC: row.meanC,
          trendCPerDay: row.trendCPerDay,
        }
      )
    },
    /**
     * Stores the phase state; a state judged up to an earlier day than the stored one (a slower
     * refresh finishing after a faster one) does not overwrite it. `replace` lets a restarted state
     * (a month without readings) overwrite whatever is stored.
     */
    async savePhaseState(lakeId: string, state: PhaseState, replace = false) {
      const row = {
        phase: state.phase,
        since: state.since,
        pendingPhase: state.pending,
        pendingDays: state.pendingDays,
        lastDay: state.lastDay,
        meanC: state.meanC,
        trendCPerDay: state.trendCPerDay,
      }
      await db
        .insert(lakePhases)
        .values({ lakeId, ...row })
        .onConflictDoUpdate({
          target: lakePhases.lakeId,
          set: row,
          setWhere: replace ? undefined : lt(lakePhases.lastDay, state.lastDay),
        })
    },
    /** Hourly means of a station's readings and of a lake's observed weather since `since`. */
    async hourly(stationId: string | null, lakeId: string, since: Date) {
      const readingsByHour = stationId
        ? await db.execute<{ hour: string; parameter: string; value: number }>(sql`
            select date_trunc('hour', observed_at) as hour, parameter::text as parameter, avg(value) as value
            from readings where station_id = ${stationId} and observed_at >= ${since.toISOString()}::timestamptz
              and parameter in ('water_temp', 'turbidity', 'gauge_height')
            group by 1, 2`)
        : { rows: [] }
      const weather = await db
        .select({
          at: weatherHours.at,
          windMs: weatherHours.windMs,
          gustMs: weatherHours.gustMs,
          precipitationMm: weatherHours.precipitationMm,
        })
        .from(weatherHours)
        .where(
          and(
            eq(weatherHours.lakeId, lakeId),
            eq(weatherHours.kind, 'observed'),
            gte(weatherHours.at, since),
          ),
        )
      return { readings: readingsByHour.rows, weather }
    },
  }
}
export type LakeReadRepo = ReturnType<typeof lakeReadRepo>
export type LakeRow = typeof lakes.$inferSelect
