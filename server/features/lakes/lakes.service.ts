import { isStale } from '../../../shared/readings'
import type { LakeShape } from '../../../shared/schemas/lake-read'
import type { LakeListQuery, LakeNames, LakePage } from '../../../shared/schemas/lakes'
import { notFound } from '../../http/errors'
import type { LakesRepo } from './lakes.repo'

export function lakesService(repo: LakesRepo) {
  return {
    async list(query: LakeListQuery, userId: string, now = new Date()): Promise<LakePage> {
      const { rows, total } = await repo.list(query)
      const today = new Map(
        (
          await repo.today(
            rows.map((r) => r.id),
            userId,
          )
        ).map((t) => [t.lake_id, t]),
      )
      const items = rows.map(({ centerLon, centerLat, ...lake }) => {
        const t = today.get(lake.id)
        const last = t?.last_reading_at ? new Date(t.last_reading_at) : null
        return {
          ...lake,
          center: [centerLon, centerLat] as [number, number],
          subscribed: t?.subscribed ?? false,
          lastReadingAt: last?.toISOString() ?? null,
          stale: !last || isStale('water_temp', last, now),
          today: {
            waterC: t?.water_c ?? null,
            clarity: t?.clarity ?? null,
            windMs: t?.wind_ms ?? null,
            windFromDeg: t?.wind_from ?? null,
            verdict: t?.verdict ?? null,
          },
        }
      })
      return { items, total, page: query.page, pageSize: query.pageSize }
    },

    names: async (): Promise<LakeNames> => ({ items: await repo.names() }),

    async shape(slug: string): Promise<LakeShape> {
      const shoreline = await repo.shoreline(slug)
      if (!shoreline) throw notFound('lake')
      return { shoreline }
    },

    async setSubscription(userId: string, slug: string, following: boolean) {
      const lakeId = await repo.lakeId(slug)
      if (!lakeId) throw notFound('lake')
      await (following ? repo.subscribe(userId, lakeId) : repo.unsubscribe(userId, lakeId))
    },
  }
}
export type LakesService = ReturnType<typeof lakesService>
