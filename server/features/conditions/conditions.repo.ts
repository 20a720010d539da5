import { and, asc, eq, gte, lt, notExists, sql } from 'drizzle-orm'
import type { ForecastHour, LakeDay } from '../../../shared/conditions/day-plan'
import type { Bank } from '../../../shared/conditions/ranking'
import type { LakeRead } from '../../../shared/schemas/lake-read'
import type { Db } from '../../db/index'
import { banks, lakeDays, lakeReads, lakes, trips, weatherHours } from '../../db/schema/index'

/** A bank as the Day plan ranks it; depth comes back as null when it was not given. */
type PlanBank = Omit<Bank, 'depthM'> & { depthM: number | null }

export function conditionsRepo(db: Db) {
  // The Lake read's one query, by the lake's unique slug: planned once per pool connection.
  const readOf = db
    .select({
      id: lakes.id,
      read: lakeReads.read,
      computedAt: lakeReads.computedAt,
      flagsHoldUntil: lakeReads.flagsHoldUntil,
    })
    .from(lakes)
    .leftJoin(lakeReads, eq(lakeReads.lakeId, lakes.id))
    .where(eq(lakes.slug, sql.placeholder('slug')))
    .prepare('conditions_read')

  // The Day plan's one query: the lake, its cached day for the date, the dates it has days for,
  // and this angler's banks with their stored exposure tables. The two lists are subqueries the
  // builder cannot say.
  const planViewOf = db
    .select({
      id: lakes.id,
      slug: lakes.slug,
      name: lakes.name,
      timeZone: lakes.timeZone,
      hasRead: sql<boolean>`${lakeReads.lakeId} is not null`,
      day: lakeDays.day,
      computedAt: lakeDays.computedAt,
      dates: sql<string[]>`(select coalesce(array_agg(x.date::text order by x.date), '{}')
        from ${lakeDays} x where x.lake_id = ${lakes.id})`,
      banks: sql<PlanBank[]>`(select coalesce(json_agg(json_build_object('id', b.id,
          'name', b.name, 'points', b.points, 'cover', b.cover, 'depthM', b.depth_m,
          'exposure', b.exposure) order by b.name), '[]')
        from ${banks} b where b.user_id = ${sql.placeholder('userId')} and b.lake_id = ${lakes.id})`,
    })
    .from(lakes)
    .leftJoin(lakeReads, eq(lakeReads.lakeId, lakes.id))
    .leftJoin(
      lakeDays,
      and(eq(lakeDays.lakeId, lakes.id), eq(lakeDays.date, sql.placeholder('date'))),
    )
    .where(eq(lakes.slug, sql.placeholder('slug')))
    .prepare('conditions_plan_view')

  return {
    allLakes: () => db.select().from(lakes),

    async lake(id: string) {
      const [row] = await db.select().from(lakes).where(eq(lakes.id, id))
      if (!row) throw new Error(`lake ${id} vanished`)
      return row
    },

    /** Everything the Day plan needs, in one round trip; undefined for a lake that is not there. */
    async planView(slug: string, date: string, userId: string) {
      const [row] = await planViewOf.execute({ slug, date, userId })
      return row
    },

    /** The lake's cached read; `read` is null before the first one. */
    async read(slug: string) {
      const [row] = await readOf.execute({ slug })
      return row
    },

    async saveRead(lakeId: string, read: LakeRead, computedAt: Date, flagsHoldUntil: Date | null) {
      const values = { read, computedAt, flagsHoldUntil }
      await db
        .insert(lakeReads)
        .values({ lakeId, ...values })
        .onConflictDoUpdate({ target: lakeReads.lakeId, set: values })
    },

    /**
     * Replaces the lake's cached days from `today` on, and drops days before yesterday, except a
     * day a guide's trip is on: its plan stays as it last stood, for the trip's page.
     */
    async saveDays(
      lakeId: string,
      today: string,
      yesterday: string,
      days: { date: string; day: LakeDay }[],
      computedAt: Date,
    ) {
      await db.transaction(async (tx) => {
        // One replacement of a lake's days at a time (an ingest and a desk edit may overlap):
        // without the lock, both delete, then the second insert meets the first one's rows.
        await tx
          .select({ id: lakes.id })
          .from(lakes)
          .where(eq(lakes.id, lakeId))
          .for('no key update')
        await tx.delete(lakeDays).where(and(eq(lakeDays.lakeId, lakeId), gte(lakeDays.date, today)))
        await tx.delete(lakeDays).where(
          and(
            eq(lakeDays.lakeId, lakeId),
            lt(lakeDays.date, yesterday),
            notExists(
              tx
                .select({ id: trips.id })
                .from(trips)
                .where(and(eq(trips.lakeId, lakeId), eq(trips.date, lakeDays.date))),
            ),
          ),
        )
        if (days.length)
          await tx.insert(lakeDays).values(days.map((d) => ({ ...d, lakeId, computedAt })))
      })
    },

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
        pressureHpa: w.pressureHpa,
      }))
    },
  }
}
export type ConditionsRepo = ReturnType<typeof conditionsRepo>
