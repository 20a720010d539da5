import { isoOrNull } from '../../../shared/time'
import type { User } from '../../../shared/schemas/auth'
import type {
  StationHistories,
  StationInput,
  StationList,
  StationRunResult,
} from '../../../shared/schemas/stations'
import { PARAMETERS } from '../../../shared/readings'
import type { Db } from '../../db/index'
import { conflict, invalid, notFound, unavailable } from '../../http/errors'
import type { Logger } from '../../logger'
import { audit } from '../audit/audit.repo'
import { ingestReadings } from '../ingest/readings.ingest'
import { importReadingsCsv } from './readings-import'
import type { StationsRepo, StationValues } from './stations.repo'

type Actor = Pick<User, 'id' | 'email'>
type StationRow = NonNullable<Awaited<ReturnType<StationsRepo['byId']>>>

const health = (s: StationRow) => ({
  state: s.state,
  lastGoodAt: isoOrNull(s.lastGoodAt),
  lastRunAt: isoOrNull(s.lastRunAt),
  lastError: s.lastError,
  gapCount: s.gapCount,
  rejected24h: s.rejected24h,
  circuitOpenUntil: isoOrNull(s.circuitOpenUntil),
})
const fields = (s: StationValues) => ({
  name: s.name,
  lakeId: s.lakeId,
  feedThingId: s.feedThingId,
  active: s.active,
})
const taken = () =>
  conflict('feed_id_taken', 'Another station has that feed identifier.', 'feedThingId')

/** The gauge desk's stations: health, create, edit or deactivate, and a run of ingestion now. */
export function stationsService(
  repo: StationsRepo,
  deps: { db: Db; log: Logger; feedUrl?: string },
) {
  async function values(input: StationInput): Promise<StationValues> {
    const lakeId = await repo.lakeId(input.lakeSlug)
    if (!lakeId) throw invalid('lakeSlug', 'No such lake.')
    return { name: input.name, lakeId, feedThingId: input.feedThingId, active: input.active }
  }
  async function station(id: string) {
    const row = await repo.byId(id)
    if (!row) throw notFound('station')
    return row
  }

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
          health: health(s),
        })),
      }
    },

    async create(actor: Actor, input: StationInput) {
      const v = await values(input)
      return deps.db.transaction(async (tx) => {
        const row = await repo.create(v, tx)
        if (!row) throw taken()
        await audit(tx, actor, {
          action: 'station.create',
          targetType: 'station',
          targetId: row.id,
          before: null,
          after: fields(v),
        })
        return { id: row.id }
      })
    },

    async edit(actor: Actor, id: string, input: StationInput) {
      const before = await station(id)
      const v = await values(input)
      if (await repo.feedIdTaken(v.feedThingId, id)) throw taken()
      await deps.db.transaction(async (tx) => {
        await repo.update(id, v, tx)
        await audit(tx, actor, {
          action: before.active && !v.active ? 'station.deactivate' : 'station.edit',
          targetType: 'station',
          targetId: id,
          before: fields(before),
          after: fields(v),
        })
      })
      return { id }
    },

    /** Each station's last days against its datastreams' cadence (the desk's small charts). */
    async histories(days: number): Promise<StationHistories> {
      const [streams, rows] = await Promise.all([
        repo.allParameters(),
        repo.histories(new Date(), days),
      ])
      const perDay = new Map<string, number>()
      for (const d of streams) {
        const n = Math.round(1440 / PARAMETERS[d.parameter].cadenceMin)
        perDay.set(d.stationId, (perDay.get(d.stationId) ?? 0) + n)
      }
      const items = new Map<string, StationHistories['items'][number]>()
      for (const { station_id: stationId, ...day } of rows) {
        let item = items.get(stationId)
        if (!item) items.set(stationId, (item = { stationId, days: [] }))
        item.days.push({ ...day, expected: perDay.get(stationId) ?? 0 })
      }
      return { items: [...items.values()] }
    },

    /** Historical readings from a CSV: a preview, or stored and quarantined as ingestion would. */
    async importReadings(actor: Actor, id: string, csv: string, commit: boolean) {
      await station(id)
      const report = await importReadingsCsv(deps.db, id, csv, commit)
      if (commit)
        await audit(deps.db, actor, {
          action: 'station.import',
          targetType: 'station',
          targetId: id,
          before: null,
          after: {
            stored: report.stored,
            quarantined: report.quarantined,
            invalid: report.invalid,
          },
        })
      return report
    },

    /** Reads the station's new observations now, as the job would, and reports what it did. */
    async runNow(actor: Actor, id: string): Promise<StationRunResult> {
      const row = await station(id)
      if (!row.active)
        throw conflict('station_inactive', 'This station is deactivated; activate it first.')
      if (!deps.feedUrl) throw unavailable('no_feed', 'This server has no feed to read from.')
      const summary = await ingestReadings(
        { db: deps.db, feedUrl: deps.feedUrl, log: deps.log },
        { stationId: id },
      )
      const after = await station(id)
      await audit(deps.db, actor, {
        action: 'station.run',
        targetType: 'station',
        targetId: id,
        before: null,
        after: { good: summary.good, quarantined: summary.quarantined, failed: summary.failed },
      })
      return {
        good: summary.good,
        quarantined: summary.quarantined,
        failed: summary.failed > 0,
        health: health(after),
      }
    },
  }
}
export type StationsService = ReturnType<typeof stationsService>
