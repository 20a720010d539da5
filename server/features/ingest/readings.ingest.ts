import pLimit from 'p-limit'
import { parameterForCode } from '../../../shared/readings'
import type { Db } from '../../db/index'
import type { Logger } from '../../logger'
import { DatastreamList, ObservationPage } from './feed.schemas'
import { DEFAULT_POLICY, FeedError, getJson, type FetchPolicy } from './feed-client'
import { ingestRepo, type DatastreamRow, type IngestRepo, type StationRow } from './ingest.repo'
import { validatePage } from './validate-page'

export interface IngestDeps {
  db: Db
  feedUrl: string
  log: Logger
  now?: () => Date
  policy?: FetchPolicy
  /** Stations read at once; one slow or failing station never holds up the others. */
  concurrency?: number
  pageSize?: number
}

export interface IngestSummary {
  stations: number
  failed: number
  skippedByBreaker: number
  good: number
  quarantined: number
}

export interface PageProgress {
  datastream: DatastreamRow
  latest?: Date
  good: number
  quarantined: number
}

/** Each run re-reads the last hour as well, so readings the feed publishes late are not skipped. */
const OVERLAP_MS = 3_600_000
/** How far back a new datastream's first read reaches. */
const FIRST_READ_MS = 2 * 86_400_000
/** A station with no good reading for this long is stale. */
export const STALE_AFTER_MS = 2 * 3_600_000
/** After this many failed runs in a row the breaker opens, for 5 minutes doubling to an hour. */
const BREAKER_THRESHOLD = 3

const iso = (d: Date) => d.toISOString().replace('.000Z', 'Z')

/** Observations after `from` (and at or before `until`), oldest first, through every nextLink. */
async function readDatastream(
  repo: IngestRepo,
  deps: Required<Pick<IngestDeps, 'feedUrl' | 'policy' | 'pageSize'>>,
  ds: DatastreamRow,
  window: { from: Date; until?: Date; backfill?: boolean },
  onPage?: (progress: PageProgress) => void,
): Promise<{ good: number; quarantined: number; latest?: Date }> {
  const filter = [
    `phenomenonTime gt ${iso(window.from)}`,
    ...(window.until ? [`phenomenonTime le ${iso(window.until)}`] : []),
  ]
  const query = new URLSearchParams({
    $filter: filter.join(' and '),
    $orderby: 'phenomenonTime asc',
    $top: String(deps.pageSize),
  })
  let url: string | undefined =
    `${deps.feedUrl}/v1.1/Datastreams(${ds.feedDatastreamId})/Observations?${query}`
  let previous = await repo.lastGood(ds.stationId, ds.parameter, window.from)
  const totals: { good: number; quarantined: number; latest?: Date } = { good: 0, quarantined: 0 }
  while (url) {
    const page = ObservationPage.safeParse(await getJson(deps.feedUrl, url, deps.policy))
    if (!page.success)
      throw new FeedError('shape', `Observations page from ${url} has the wrong shape`)
    const verdict = validatePage(ds.parameter, ds.unit, page.data.value, previous)
    const mark =
      verdict.latest &&
      (window.backfill ? { backfillCursor: verdict.latest } : { highWaterMark: verdict.latest })
    await repo.commitPage(ds, verdict.good, verdict.bad, mark ?? {})
    previous = verdict.previous
    totals.good += verdict.good.length
    totals.quarantined += verdict.bad.length
    totals.latest = verdict.latest ?? totals.latest
    onPage?.({
      datastream: ds,
      latest: verdict.latest,
      good: verdict.good.length,
      quarantined: verdict.bad.length,
    })
    url = page.data['@iot.nextLink']
  }
  return totals
}

/** The station's datastreams as the feed lists them now, matched to our parameters by observed property. */
async function discover(
  repo: IngestRepo,
  deps: Required<Pick<IngestDeps, 'feedUrl' | 'policy'>>,
  station: StationRow,
) {
  const url = `${deps.feedUrl}/v1.1/Things(${station.feedThingId})/Datastreams?$expand=ObservedProperty`
  const list = DatastreamList.safeParse(await getJson(deps.feedUrl, url, deps.policy))
  if (!list.success)
    throw new FeedError('shape', `Datastreams of Thing ${station.feedThingId} have the wrong shape`)
  const found = list.data.value.flatMap((d) => {
    const parameter = parameterForCode(d.ObservedProperty['@iot.id'])
    return parameter ? [{ feedId: d['@iot.id'], parameter, unit: d.unitOfMeasurement.symbol }] : []
  })
  return repo.syncDatastreams(station.id, found)
}

/** Health from what is in the database after the run, and the breaker from how the run went. */
async function recordHealth(
  repo: IngestRepo,
  station: StationRow,
  now: Date,
  error: string | null,
) {
  const facts = await repo.stationHealthFacts(station.id, now)
  const failures = error ? station.consecutiveFailures + 1 : 0
  const opens = failures >= BREAKER_THRESHOLD
  const restMin = Math.min(60, 5 * 2 ** (failures - BREAKER_THRESHOLD))
  const stale = !facts.lastGoodAt || now.getTime() - facts.lastGoodAt.getTime() > STALE_AFTER_MS
  await repo.updateStation(station.id, {
    ...facts,
    lastRunAt: now,
    lastError: error,
    consecutiveFailures: failures,
    circuitOpenUntil: opens ? new Date(now.getTime() + restMin * 60_000) : null,
    state: error ? 'failing' : stale ? 'stale' : 'ok',
  })
}

/** One pass of `ingest-readings` over every due station. */
export async function ingestReadings(
  deps: IngestDeps,
  scope: { lakeId?: string } = {},
): Promise<IngestSummary> {
  const repo = ingestRepo(deps.db)
  const now = (deps.now ?? (() => new Date()))()
  const opts = {
    feedUrl: deps.feedUrl,
    policy: deps.policy ?? DEFAULT_POLICY,
    pageSize: deps.pageSize ?? 500,
  }
  const due = await repo.dueStations(now, scope.lakeId)
  const summary: IngestSummary = {
    stations: due.length,
    failed: 0,
    skippedByBreaker: 0,
    good: 0,
    quarantined: 0,
  }
  const limit = pLimit(deps.concurrency ?? 4)
  await Promise.all(
    due.map((station) =>
      limit(async () => {
        let error: string | null = null
        try {
          for (const ds of await discover(repo, opts, station)) {
            const from = ds.highWaterMark
              ? new Date(ds.highWaterMark.getTime() - OVERLAP_MS)
              : new Date(now.getTime() - FIRST_READ_MS)
            const got = await readDatastream(repo, opts, ds, { from })
            summary.good += got.good
            summary.quarantined += got.quarantined
          }
        } catch (err) {
          if (!(err instanceof FeedError)) throw err
          error = err.message
          summary.failed++
          deps.log.warn({ station: station.name, err: err.message }, 'station failed this run')
        }
        await recordHealth(repo, station, now, error)
      }),
    ),
  )
  return summary
}

/**
 * History for one lake's stations, from `days` ago up to where regular ingestion began. Progress is
 * kept per datastream in backfill_cursor, so an interrupted backfill resumes where it stopped.
 */
export async function backfillReadings(
  deps: IngestDeps,
  lakeId: string,
  days: number,
  onPage?: (progress: PageProgress & { from: Date; until: Date }) => void,
): Promise<{ good: number; quarantined: number }> {
  const totals = { good: 0, quarantined: 0 }
  const repo = ingestRepo(deps.db)
  const now = (deps.now ?? (() => new Date()))()
  const opts = {
    feedUrl: deps.feedUrl,
    policy: deps.policy ?? DEFAULT_POLICY,
    pageSize: deps.pageSize ?? 1000,
  }
  const start = new Date(now.getTime() - days * 86_400_000)
  for (const station of await repo.dueStations(now, lakeId)) {
    for (const ds of await discover(repo, opts, station)) {
      const until = ds.highWaterMark ?? now
      const from = ds.backfillCursor && ds.backfillCursor > start ? ds.backfillCursor : start
      if (from >= until) continue
      const got = await readDatastream(repo, opts, ds, { from, until, backfill: true }, (p) =>
        onPage?.({ ...p, from, until }),
      )
      // Once history meets live data, live ingestion continues from the last reading seen.
      if (!ds.highWaterMark && got.latest)
        await repo.commitPage(ds, [], [], { highWaterMark: got.latest })
      totals.good += got.good
      totals.quarantined += got.quarantined
    }
    await recordHealth(repo, station, now, null)
  }
  return totals
}
