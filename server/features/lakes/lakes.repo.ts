import { and, asc, count, eq, ilike, or, sql } from 'drizzle-orm'
import type { ClarityClass } from '../../../shared/conditions/clarity'
import type { Verdict } from '../../../shared/conditions/safety'
import type { LakeListQuery } from '../../../shared/schemas/lakes'
import type { Db } from '../../db/index'
import { lakes, subscriptions } from '../../db/schema/index'
import { escapeLike } from '../../db/like'

export function lakesRepo(db: Db) {
  return {
    async list(query: LakeListQuery) {
      const pattern = query.q && `%${escapeLike(query.q)}%`
      const where = pattern
        ? or(ilike(lakes.name, pattern), ilike(lakes.region, pattern))
        : undefined
      const columns = {
        id: lakes.id,
        slug: lakes.slug,
        name: lakes.name,
        region: lakes.region,
        timeZone: lakes.timeZone,
        normalPoolM: lakes.normalPoolM,
        areaKm2: lakes.areaKm2,
        centerLon: lakes.centerLon,
        centerLat: lakes.centerLat,
      }
      const [rows, [total]] = await Promise.all([
        db
          .select(columns)
          .from(lakes)
          .where(where)
          .orderBy(asc(lakes.name))
          .limit(query.pageSize)
          .offset((query.page - 1) * query.pageSize),
        db.select({ n: count() }).from(lakes).where(where),
      ])
      return { rows, total: total?.n ?? 0 }
    },

    names: () =>
      db.select({ slug: lakes.slug, name: lakes.name }).from(lakes).orderBy(asc(lakes.name)),

    /**
     * For a page of lakes: my subscriptions and each lake's one-line read, taken from the cached
     * Lake read (the ingest jobs refresh it), so the list repeats none of its gauge logic.
     */
    async today(lakeIds: string[], userId: string) {
      if (!lakeIds.length) return []
      const { rows } = await db.execute<{
        lake_id: string
        subscribed: boolean
        water_c: number | null
        clarity: ClarityClass | null
        last_reading_at: string | null
        wind_ms: number | null
        wind_from: number | null
        verdict: Verdict | null
      }>(sql`
        select l.id as lake_id,
          exists (select 1 from subscriptions s where s.lake_id = l.id and s.user_id = ${userId}) as subscribed,
          (r.read -> 'waterTemp' ->> 'valueC')::float8 as water_c,
          r.read -> 'clarity' ->> 'class' as clarity,
          r.read ->> 'lastReadingAt' as last_reading_at,
          (r.read -> 'windNow' ->> 'windMs')::float8 as wind_ms,
          (r.read -> 'windNow' ->> 'windFromDeg')::float8 as wind_from,
          r.read -> 'verdict' ->> 'verdict' as verdict
        from unnest(${sql.param(lakeIds)}::uuid[]) as l(id)
        left join lake_reads r on r.lake_id = l.id`)
      return rows
    },

    async shoreline(slug: string) {
      const [row] = await db
        .select({ shoreline: lakes.shoreline })
        .from(lakes)
        .where(eq(lakes.slug, slug))
      return row?.shoreline
    },
    async lakeId(slug: string) {
      const [row] = await db.select({ id: lakes.id }).from(lakes).where(eq(lakes.slug, slug))
      return row?.id
    },

    subscribe: (userId: string, lakeId: string) =>
      db.insert(subscriptions).values({ userId, lakeId }).onConflictDoNothing(),

    unsubscribe: (userId: string, lakeId: string) =>
      db
        .delete(subscriptions)
        .where(and(eq(subscriptions.userId, userId), eq(subscriptions.lakeId, lakeId))),
  }
}

export type LakesRepo = ReturnType<typeof lakesRepo>
