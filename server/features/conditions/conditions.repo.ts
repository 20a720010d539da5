import { and, asc, eq, gte, lt, sql } from 'drizzle-orm'
import type { ForecastHour, LakeDay } from '../../../shared/conditions/day-plan'
import type { LakeRead } from '../../../shared/schemas/lake-read'
import type { Db } from '../../db/index'
import { lakeDays, lakeReads, lakes, weatherHours } from '../../db/schema/index'

export function conditionsRepo(db: Db) {
  return {
    allLakes: () => db.select().from(lakes),

    async lake(id: string) {
      const [row] = await db.select().from(lakes).where(eq(lakes.id, id))
      if (!row) throw new Error(`lake ${id} vanished`)
      return row
    },

    /** The lake's identity and its cached read, in one query: what a Lake read page view needs. */
    async lakeWithRead(slug: string) {
      const [row] = await db
        .select({
          id: lakes.id,
          slug: lakes.slug,
          name: lakes.name,
          timeZone: lakes.timeZone,
          read: lakeReads.read,
        })
        .from(lakes)
        .leftJoin(lakeReads, eq(lakeReads.lakeId, lakes.id))
        .where(eq(lakes.slug, slug))
      return row
    },

    async saveRead(lakeId: string, read: LakeRead, computedAt: Date) {
      await db
        .insert(lakeReads)
        .values({ lakeId, read, computedAt })
        .onConflictDoUpdate({ target: lakeReads.lakeId, set: { read, computedAt } })
    },

    /** Replaces the lake's cached days from `today` on, and drops days before yesterday. */
    async saveDays(
      lakeId: string,
      today: string,
      yesterday: string,
      days: { date: string; day: LakeDay }[],
      computedAt: Date,
    ) {
      await db.transaction(async (tx) => {
        await tx.delete(lakeDays).where(and(eq(lakeDays.lakeId, lakeId), gte(lakeDays.date, today)))
        await tx
          .delete(lakeDays)
          .where(and(eq(lakeDays.lakeId, lakeId), lt(lakeDays.date, yesterday)))
        if (days.length)
          await tx.insert(lakeDays).values(days.map((d) => ({ ...d, lakeId, computedAt })))
      })
    },

    async day(lakeId: string, date: string) {
      const [row] = await db
        .select()
        .from(lakeDays)
        .where(and(eq(lakeDays.lakeId, lakeId), eq(lakeDays.date, date)))
      return row
    },

    dates: async (lakeId: string) =>
      (
        await db
          .select({ date: lakeDays.date })
          .from(lakeDays)
          .where(eq(lakeDays.lakeId, lakeId))
          .orderBy(asc(lakeDays.date))
      ).map((r) => r.date),

    /** Hourly weather in [from, to): observed where there is an observation, forecast after. */
    async hours(lakeId: string, from: Date, to: Date): Promise<ForecastHour[]> {
      const rows = await db
        .selectDistinctOn([weatherHours.at])
        .from(weatherHours)
        .where(
          and(eq(weatherHours.lakeId, lakeId), gte(weatherHours.at, from), lt(weatherHours.at, to)),
        )
        // The enum lists 'observed' before 'forecast', so an observation wins its hour.
        .orderBy(asc(weatherHours.at), sql`${weatherHours.kind} asc`)
      return rows.map((w) => ({
        at: w.at.toISOString(),
        windFromDeg: w.windFromDeg,
        windMs: w.windMs,
        gustMs: w.gustMs,
        airC: w.airC,
        relativeHumidityPct: w.relativeHumidityPct,
        cloudCoverPct: w.cloudCoverPct,
        thunderstormProbabilityPct: w.thunderProbabilityPct ?? 0,
      }))
    },
  }
}
export type ConditionsRepo = ReturnType<typeof conditionsRepo>
