import type { LakeListQuery, LakePage } from '../../../shared/schemas/lakes'
import type { LakesRepo } from './lakes.repo'

export function lakesService(repo: LakesRepo) {
  return {
    async list(query: LakeListQuery): Promise<LakePage> {
      const { rows, total } = await repo.list(query)
      const items = rows.map(({ centerLon, centerLat, ...lake }) => ({
        ...lake,
        center: [centerLon, centerLat] as [number, number],
      }))
      return { items, total, page: query.page, pageSize: query.pageSize }
    },
  }
}
export type LakesService = ReturnType<typeof lakesService>
