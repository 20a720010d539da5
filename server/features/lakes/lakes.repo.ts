import { and, asc, count, eq, ilike, or, sql } from 'drizzle-orm'
import type { LakeListQuery } from '../../../shared/schemas/lakes'
import type { Db } from '../../db/index'
import { lakes, subscriptions } from '../../db/schema/index'
import { escapeLike } from '../users/users.repo'

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

    /** For a page of lakes: my subscriptions and each lake's latest gauge values and wind. */
    async today(lakeIds: string[], userId: string) {
      if (!lakeIds.length) return []
      const { rows } = await db.execute<{
        lake_id: string
        subscribed: boolean
        water_c: number | null
        water_at: string | null
        turbidity: number | null
        turbidity_at: string | null
        secchi: number | null
        secchi_at: string | null
        wind_ms: number | null
        wind_from: number | null
      }>(sql`
        select l.id as lake_id,
          exists (select 1 from subscriptions s where s.lake_id = l.id and s.user_id = ${userId}) as subscribed,
          w.value as water_c, w.observed_at as water_at,
          t.value as turbidity, t.observed_at as turbidity_at,
          d.value as secchi, d.observed_at as secchi_at,
          wx.wind_ms, wx.wind_from_deg as wind_from
        from unnest(${sql.param(lakeIds)}::uuid[]) as l(id)
        left join lateral (select id from stations where lake_id = l.id and active order by name limit 1) g on true
        ${latest('water_temp', 'w')}
        ${latest('turbidity', 't')}
        ${latest('secchi', 'd')}
        left join lateral (
          select wind_ms, wind_from_deg from weather_hours
          where lake_id = l.id and kind = 'observed' order by at desc limit 1) wx on true`)
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

/** The latest reading of one parameter at the lake's gauge, as a lateral join aliased `alias`. */
function latest(parameter: string, alias: string) {
  return sql.raw(`left join lateral (
          select value, observed_at from readings
          where station_id = g.id and parameter = '${parameter}' order by observed_at desc limit 1) ${alias} on true`)
}
export type LakesRepo = ReturnType<typeof lakesRepo>
