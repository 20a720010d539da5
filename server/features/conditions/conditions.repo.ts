import { and, asc, eq, gte, lt, notExists, sql } from 'drizzle-orm'
import type { ForecastHour, LakeDay } from '../../../shared/conditions/day-plan'
import type { Bank } from '../../../shared/conditions/ranking'
import type { LakeRead } from '../../../shared/schemas/lake-read'
import type { Db } from '../../db/index'
import { lakeDays, lakeReads, lakes, trips, weatherHours } from '../../db/schema/index'

/** The Day plan's one query: $1 slug, $2 date, $3 the angler. */
const PLAN_VIEW = `
  select l.id, l.slug, l.name, l.time_zone, r.lake_id is not null as has_read, d.day, d.computed_at,
    (select coalesce(array_agg(x.date::text order by x.date), '{}') from lake_days x where x.lake_id = l.id) as dates,
    (select coalesce(json_agg(json_build_object('id', b.id, 'name', b.name, 'points', b.points,
              'cover', b.cover, 'depthM', b.depth_m, 'exposure', b.exposure) order by b.name), '[]')
       from banks b where b.user_id = $3 and b.lake_id = l.id) as banks
  from lakes l
  left join lake_reads r on r.lake_id = l.id
  left join lake_days d on d.lake_id = l.id and d.date = $2
  where l.slug = $1`

interface PlanViewRow {
  id: string
  slug: string
  name: string
  time_zone: string
  has_read: boolean
  day: LakeDay | null
  computed_at: Date | null
  dates: string[]
  /** depth_m comes back as null when it was not given. */
  banks: (Omit<Bank, 'depthM'> & { depthM: number | null })[]
}

export function conditionsRepo(db: Db) {
  // The Lake read's one query, built once and planned once per pool connection.
  const readText = db
    .select({
      id: lakes.id,
      text: sql<string | null>`${lakeReads.read}::text`,
      holdUntil: lakeReads.flagsHoldUntil,
    })
    .from(lakes)
    .leftJoin(lakeReads, eq(lakeReads.lakeId, lakes.id))
    .where(eq(lakes.slug, sql.placeholder('slug')))
    .prepare('conditions_read_text')

  return {
    allLakes: () => db.select().from(lakes),

    async lake(id: string) {
      const [row] = await db.select().from(lakes).where(eq(lakes.id, id))
      if (!row) throw new Error(`lake ${id} vanished`)
      return row
    },

    /**
     * Everything the Day plan needs in one round trip: the lake, its cached day for `date`, the
     * dates it has days for, and this angler's banks with their stored exposure tables.
     */
    async planView(slug: string, date: string, userId: string) {
      // A named statement: each pool connection plans it once, not on every page view.
      const { rows } = await db.$client.query<PlanViewRow>({
        name: 'conditions_plan_view',
        text: PLAN_VIEW,
        values: [slug, date, userId],
      })
      return rows[0]
    },

    /** The lake's cached read as stored JSON text, nothing parsed; text is null before the first read. */
    async readBySlug(slug: string) {
      const [row] = await readText.execute({ slug })
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
