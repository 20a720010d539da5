import { asc, count, ilike, or } from 'drizzle-orm'
import type { LakeListQuery } from '../../../shared/schemas/lakes'
import type { Db } from '../../db/index'
import { lakes } from '../../db/schema/index'
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
  }
}
export type LakesRepo = ReturnType<typeof lakesRepo>
