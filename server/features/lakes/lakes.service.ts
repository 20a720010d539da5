import { clarityClass, secchiFromTurbidity } from '../../../shared/conditions/clarity'
import { isStale } from '../../../shared/readings'
import type { LakeShape } from '../../../shared/schemas/lake-read'
import type { LakeListQuery, LakePage } from '../../../shared/schemas/lakes'
import { HttpError } from '../../http/errors'
import type { LakesRepo } from './lakes.repo'

const DAY = 86_400_000

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
        // A Secchi disk reading from the last week beats the turbidity estimate.
        const disk =
          t?.secchi != null && t.secchi_at && now.getTime() - Date.parse(t.secchi_at) < 7 * DAY
        const secchiM = disk
          ? t!.secchi!
          : t?.turbidity != null
            ? secchiFromTurbidity(t.turbidity)
            : null
        const times = [t?.water_at, t?.turbidity_at]
          .filter((x): x is string => !!x)
          .map((x) => Date.parse(x))
        const last = times.length ? new Date(Math.max(...times)) : null
        return {
          ...lake,
          center: [centerLon, centerLat] as [number, number],
          subscribed: t?.subscribed ?? false,
          lastReadingAt: last?.toISOString() ?? null,
          stale: !last || isStale('water_temp', last, now),
          today: {
            waterC: t?.water_c ?? null,
            clarity: secchiM === null ? null : clarityClass(secchiM),
            windMs: t?.wind_ms ?? null,
            windFromDeg: t?.wind_from ?? null,
          },
        }
      })
      return { items, total, page: query.page, pageSize: query.pageSize }
    },

    async shape(slug: string): Promise<LakeShape> {
      const shoreline = await repo.shoreline(slug)
      if (!shoreline) throw new HttpError(404, 'not_found', 'No such lake.')
      return { shoreline }
    },

    async setSubscription(userId: string, slug: string, following: boolean) {
      const lakeId = await repo.lakeId(slug)
      if (!lakeId) throw new HttpError(404, 'not_found', 'No such lake.')
      await (following ? repo.subscribe(userId, lakeId) : repo.unsubscribe(userId, lakeId))
    },
  }
}
export type LakesService = ReturnType<typeof lakesService>
