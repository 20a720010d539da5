import pLimit from 'p-limit'
import { parameterForCode, STALE_AFTER_MS } from '../../../shared/readings'
import type { Db } from '../../db/index'
import type { Logger } from '../../logger'
import { ObservationPage, StationObservations, ThingList } from './feed.schemas'
import { DEFAULT_POLICY, FeedError, getJson, type FetchPolicy } from './feed-client'
import {
  ingestRepo,
  type DatastreamRow,
  type IngestRepo,
  type StationHealthUpdate,
  type StationRow,
} from './ingest.repo'
import { groupCommit } from './group-commit'
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
/** After this many failed runs in a row the breaker opens, for 5 minutes doubling to an hour. */
const BREAKER_THRESHOLD = 3

const iso = (d: Date) => d.toISOString().replace('.000Z', 'Z')

/** Where read pages are committed: the repository itself, or a group commit in front of it. */
type Committer = Pick<IngestRepo, 'commitPages'>
type Feed = Required<Pick<IngestDeps, 'feedUrl' | 'policy' | 'pageSize'>>
type Previous = { value: number; at: Date } | undefined
type Totals = { good: number; quarantined: number; latest?: Date }

function add(totals: Totals, more: Totals) {
  totals.good += more.good
  totals.quarantined += more.quarantined
  totals.latest = more.latest ?? totals.latest
}

const counts = (v: { good: unknown[]; bad: unknown[]; latest?: Date }): Totals => ({
  good: v.good.length,
  quarantined: v.bad.length,
  latest: v.latest,
})

/** Pages of one datastream from `url` on through every nextLink, each committed as it arrives. */
async function followPages(
  repo: Committer,
  deps: Feed,
  ds: DatastreamRow,
  url: string | undefined,
  state: { previous: Previous; backfill?: boolean },
  onPage?: (progress: PageProgress) => void,
): Promise<Totals> {
  const totals: Totals = { good: 0, quarantined: 0 }
  let previous = state.previous
  while (url) {
    const page = ObservationPage.safeParse(await getJson(deps.feedUrl, url, deps.policy))
    if (!page.success)
      throw new FeedError('shape', `Observations page from ${url} has the wrong shape`)
    const verdict = validatePage(ds.parameter, ds.unit, page.data.value, previous)
    const mark =
      verdict.latest &&
      (state.backfill ? { backfillCursor: verdict.latest } : { highWaterMark: verdict.latest })
    await repo.commitPages([{ ds, good: verdict.good, bad: verdict.bad, mark: mark ?? {} }])
    previous = verdict.previous ?? previous
    add(totals, counts(verdict))
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

function observationsFilter(from: Date, until?: Date): string {
  return [
    `phenomenonTime gt ${iso(from)}`,
    ...(until ? [`phenomenonTime le ${iso(until)}`] : []),
  ].join(' and ')
}

/** One datastream's observations after `from` (and at or before `until`), oldest first. */
function readDatastream(
  repo: Committer,
  deps: Feed,
  ds: DatastreamRow,
  window: { from: Date; until?: Date; backfill?: boolean },
  previous: Previous,
  onPage?: (progress: PageProgress) => void,
): Promise<Totals> {
  const query = new URLSearchParams({
    $filter: observationsFilter(window.from, window.until),
    $orderby: 'phenomenonTime asc',
    $top: String(deps.pageSize),
  })
  const url = `${deps.feedUrl}/v1.1/Datastreams(${ds.feedDatastreamId})/Observations?${query}`
  return followPages(repo, deps, ds, url, { previous, backfill: window.backfill }, onPage)
}

/**
 * A station's new observations: the first page of every datastream in one request
 * ($expand=Observations), committed together, then each datastream's further pages on their own.
 */
async function readStation(
  repo: Committer,
  deps: Feed,
  station: StationRow,
  windows: { ds: DatastreamRow; from: Date; previous: Previous }[],
): Promise<Totals> {
  const totals: Totals = { good: 0, quarantined: 0 }
  if (!windows.length) return totals
  const since = windows[0]!.from
  const inner = `$filter=${observationsFilter(since)};$orderby=phenomenonTime asc;$top=${deps.pageSize}`
  const query = new URLSearchParams({ $expand: `Observations(${inner})` })
  const url = `${deps.feedUrl}/v1.1/Things(${station.feedThingId})/Datastreams?${query}`
  const doc = StationObservations.safeParse(await getJson(deps.feedUrl, url, deps.policy))
  if (!doc.success)
    throw new FeedError(
      'shape',
      `Observations of Thing ${station.feedThingId} have the wrong shape`,
    )
  const pages = windows.map((w) => {
    const entry = doc.data.value.find((d) => d['@iot.id'] === w.ds.feedDatastreamId)
    return {
      w,
      entry,
      verdict: validatePage(w.ds.parameter, w.ds.unit, entry?.Observations ?? [], w.previous),
    }
  })
  await repo.commitPages(
    pages.map(({ w, verdict }) => ({
      ds: w.ds,
      good: verdict.good,
      bad: verdict.bad,
      mark: verdict.latest ? { highWaterMark: verdict.latest } : {},
    })),
  )
  for (const { w, entry, verdict } of pages) {
    add(totals, counts(verdict))
    const rest = entry?.['Observations@iot.nextLink']
    if (rest) {
      const more = await followPages(repo, deps, w.ds, rest, {
        previous: verdict.previous ?? w.previous,
      })
      add(totals, more)
    }
  }
  return totals
}

/**
 * Every Thing the feed lists, with its datastreams matched to our parameters by observed property:
 * one request per run. A station missing from the list has gone from the feed.
 */
async function discover(deps: Required<Pick<IngestDeps, 'feedUrl' | 'policy'>>) {
  const url = `${deps.feedUrl}/v1.1/Things?$expand=Datastreams($expand=ObservedProperty)`
  const list = ThingList.safeParse(await getJson(deps.feedUrl, url, deps.policy))
  if (!list.success) throw new FeedError('shape', 'The Things list has the wrong shape')
  return new Map(
    list.data.value.map((thing) => [
      thing['@iot.id'],
      (thing.Datastreams ?? []).flatMap((d) => {
        const parameter = parameterForCode(d.ObservedProperty['@iot.id'])
        return parameter
          ? [{ feedId: d['@iot.id'], parameter, unit: d.unitOfMeasurement.symbol }]
          : []
      }),
    ]),
  )
}

type Listing = Awaited<ReturnType<typeof discover>>

/**
 * The due stations' datastreams, synced from the listing, each with where its read starts. A
 * station's datastreams all start where the earliest of them does, so that one request serves them
 * all; re-reading what is stored changes nothing.
 */
async function plan(
  repo: IngestRepo,
  stations: StationRow[],
  listing: Listing,
  start: (ds: DatastreamRow) => Date,
) {
  const found = stations.flatMap((s) =>
    (listing.get(s.feedThingId) ?? []).map((d) => ({ ...d, stationId: s.id })),
  )
  const all = await repo.syncDatastreams(found)
  const since = new Map<string, number>()
  for (const ds of all)
    since.set(ds.stationId, Math.min(since.get(ds.stationId) ?? Infinity, start(ds).getTime()))
  const streams = all.map((ds) => ({ ds, from: new Date(since.get(ds.stationId)!) }))
  const previous = await repo.lastGoodBefore(streams)
  return (station: StationRow) =>
    streams
      .filter((w) => w.ds.stationId === station.id)
      .map((w) => ({ ...w, previous: previous.get(w.ds.id) }))
}

/** Health from what is in the database after the run, and the breaker from how the run went. */
async function recordHealth(
  repo: IngestRepo,
  stations: StationRow[],
  now: Date,
  errors: Map<string, string>,
) {
  const facts = await repo.healthFacts(
    stations.map((s) => s.id),
    now,
  )
  await repo.updateHealth(
    now,
    stations.map((station): StationHealthUpdate => {
      const f = facts.get(station.id) ?? { lastGoodAt: null, rejected24h: 0, gapCount: 0 }
      const error = errors.get(station.id) ?? null
      const failures = error ? station.consecutiveFailures + 1 : 0
      const restMin = Math.min(60, 5 * 2 ** (failures - BREAKER_THRESHOLD))
      const stale = !f.lastGoodAt || now.getTime() - f.lastGoodAt.getTime() > STALE_AFTER_MS
      return {
        id: station.id,
        ...f,
        lastError: error,
        consecutiveFailures: failures,
        circuitOpenUntil:
          failures >= BREAKER_THRESHOLD ? new Date(now.getTime() + restMin * 60_000) : null,
        state: error ? 'failing' : stale ? 'stale' : 'ok',
      }
    }),
  )
}

/** Runs `read` for each station with bounded concurrency; a FeedError fails that station alone. */
async function perStation(
  stations: StationRow[],
  deps: IngestDeps,
  listing: Listing | FeedError,
  read: (station: StationRow) => Promise<void>,
): Promise<Map<string, string>> {
  const errors = new Map<string, string>()
  const limit = pLimit(deps.concurrency ?? 16)
  await Promise.all(
    stations.map((station) =>
      limit(async () => {
        try {
          if (listing instanceof FeedError) throw listing
          if (!listing.has(station.feedThingId)) {
            throw new FeedError('not_found', `Thing ${station.feedThingId} is not in the feed`)
          }
          await read(station)
        } catch (err) {
          if (!(err instanceof FeedError)) throw err
          errors.set(station.id, err.message)
          deps.log.warn({ station: station.name, err: err.message }, 'station failed this run')
        }
      }),
    ),
  )
  return errors
}

async function listOrError(
  deps: Required<Pick<IngestDeps, 'feedUrl' | 'policy'>>,
): Promise<Listing | FeedError> {
  try {
    return await discover(deps)
  } catch (err) {
    if (err instanceof FeedError) return err
    throw err
  }
}

/** One pass of `ingest-readings` over every due station. */
export async function ingestReadings(
  deps: IngestDeps,
  scope: { lakeId?: string; stationId?: string } = {},
): Promise<IngestSummary> {
  const repo = ingestRepo(deps.db)
  const now = (deps.now ?? (() => new Date()))()
  const opts = {
    feedUrl: deps.feedUrl,
    policy: deps.policy ?? DEFAULT_POLICY,
    pageSize: deps.pageSize ?? 500,
  }
  const due = await repo.dueStations(now, scope)
  const summary: IngestSummary = { stations: due.length, failed: 0, good: 0, quarantined: 0 }
  const listing = await listOrError(opts)
  const reads =
    listing instanceof FeedError
      ? () => []
      : await plan(repo, due, listing, (ds) =>
          ds.highWaterMark
            ? new Date(ds.highWaterMark.getTime() - OVERLAP_MS)
            : new Date(now.getTime() - FIRST_READ_MS),
        )
  const committer = { commitPages: groupCommit(repo.commitPages) }
  const errors = await perStation(due, deps, listing, async (station) => {
    const got = await readStation(committer, opts, station, reads(station))
    summary.good += got.good
    summary.quarantined += got.quarantined
  })
  summary.failed = errors.size
  await recordHealth(repo, due, now, errors)
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
  const stations = await repo.dueStations(now, { lakeId })
  const listing = await discover(opts)
  const reads = await plan(repo, stations, listing, (ds) =>
    ds.backfillCursor && ds.backfillCursor > start ? ds.backfillCursor : start,
  )
  const errors = await perStation(
    stations,
    { ...deps, concurrency: 1 },
    listing,
    async (station) => {
      for (const { ds, from, previous } of reads(station)) {
        const until = ds.highWaterMark ?? now
        if (from >= until) continue
        const got = await readDatastream(
          repo,
          opts,
          ds,
          { from, until, backfill: true },
          previous,
          (p) => onPage?.({ ...p, from, until }),
        )
        // Once history meets live data, live ingestion continues from the last reading seen.
        if (!ds.highWaterMark && got.latest)
          await repo.commitPages([{ ds, good: [], bad: [], mark: { highWaterMark: got.latest } }])
        totals.good += got.good
        totals.quarantined += got.quarantined
      }
    },
  )
  await recordHealth(repo, stations, now, errors)
  return totals
}
