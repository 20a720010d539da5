import type { StationList } from '../../../shared/schemas/stations'
import type { StationsRepo } from './stations.repo'

const iso = (d: Date | null) => (d ? d.toISOString() : null)

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
              highWaterMark: iso(d.highWaterMark),
            })),
          health: {
            state: s.state,
            lastGoodAt: iso(s.lastGoodAt),
            lastRunAt: iso(s.lastRunAt),
            lastError: s.lastError,
            gapCount: s.gapCount,
            rejected24h: s.rejected24h,
            circuitOpenUntil: iso(s.circuitOpenUntil),
          },
        })),
      }
    },
  }
}
export type StationsService = ReturnType<typeof stationsService>
