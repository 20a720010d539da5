import { isoOrNull } from '../../../shared/time'
import type { StationList } from '../../../shared/schemas/stations'
import type { StationsRepo } from './stations.repo'

export function stationsService(repo: StationsRepo) {
  return {
    async list(): Promise<StationList> {
      const { rows, streams } = await repo.listWithLakes()
      return {
        items: rows.map(({ station: s, lake }) => ({
          id: s.id,
          name: s.name,
          feedThingId: s.feedThingId,
          active: s.active,
          lake,
          parameters: streams
            .filter((d) => d.stationId === s.id)
            .map((d) => ({
              parameter: d.parameter,
              unit: d.unit,
              highWaterMark: isoOrNull(d.highWaterMark),
            })),
          health: {
            state: s.state,
            lastGoodAt: isoOrNull(s.lastGoodAt),
            lastRunAt: isoOrNull(s.lastRunAt),
            lastError: s.lastError,
            gapCount: s.gapCount,
            rejected24h: s.rejected24h,
            circuitOpenUntil: isoOrNull(s.circuitOpenUntil),
          },
        })),
      }
    },
  }
}
export type StationsService = ReturnType<typeof stationsService>
