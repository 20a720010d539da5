import { planForBanks } from '../../../shared/conditions/day-plan'
import type { ExposureTable } from '../../../shared/conditions/exposure'
import {
  compileWatch,
  judgeWindow,
  meetsLakeConditions,
  tripAlarm,
  type CompiledWatch,
  type TripAlarm,
  type WatchedWindow,
} from '../../../shared/conditions/watch'
import { addDays, localDate } from '../../../shared/time'
import type { Db } from '../../db/index'
import { watchRepo, type AlertKey, type WatchRepo, type WatchRow } from './watch.repo'

/** Watches read per round trip; a run's memory stays flat however many there are. */
export const WATCH_PAGE = 10_000

interface LakeWindows {
  /** Each with its episode key, `date/window`. */
  windows: (WatchedWindow & { key: string })[]
  /** Each stored date's alarm for a trip on it, or null when the day is fine. */
  days: Map<string, TripAlarm | null>
}

/**
 * Each lake's windows still ahead, judged once per lake, not per watch: the verdict is the
 * lake-wide one (no banks), whose waves are those of the longest open water, so a bank's own
 * waves never make it worse.
 */
function lakeWindows(rows: Awaited<ReturnType<WatchRepo['lakeDays']>>, now: Date) {
  const lakes = new Map<string, LakeWindows>()
  for (const { lakeId, date, day } of rows) {
    let lake = lakes.get(lakeId)
    if (!lake) lakes.set(lakeId, (lake = { windows: [], days: new Map() }))
    const plan = planForBanks(day, [])
    lake.days.set(date, tripAlarm({ verdict: plan.verdict.verdict, cautions: plan.cautions }))
    for (const w of plan.windows)
      if (Date.parse(w.end) > now.getTime())
        lake.windows.push({
          key: `${date}/${w.id}`,
          date,
          id: w.id,
          clarity: day.clarity,
          phase: day.phase,
          weather: w.weather,
          verdict: w.verdict?.verdict ?? null,
        })
  }
  return lakes
}

/** What one page of watches changes: alerts to claim and to clear, and the episodes to store. */
export interface PageDiff {
  fresh: (AlertKey & { match: object })[]
  gone: AlertKey[]
  changed: { id: string; episodes: Record<string, number> }[]
}

/**
 * Judges a page of watches against the lakes' windows and compares the result with each watch's
 * episodes: a window that begins matching opens the next episode, one that stops closes it.
 * Episodes of dates before `fromDate` are dropped. `tables` holds the banks' exposure tables.
 */
export function diffPage(
  page: WatchRow[],
  lakes: Map<string, LakeWindows>,
  tables: Map<string, ExposureTable>,
  fromDate: string,
  compiled_: Map<WatchRow, CompiledWatch> = new Map(),
): PageDiff {
  const diff: PageDiff = { fresh: [], gone: [], changed: [] }
  for (const watch of page) {
    const lake = lakes.get(watch.lakeId)
    if (!lake) continue
    const episodes: Record<string, number> = {}
    let changed = false
    for (const [key, n] of Object.entries(watch.episodes))
      if (key.slice(0, 10) >= fromDate) episodes[key] = n
      else changed = true
    const judged = (key: string, date: string, windowId: string, match: object | null) => {
      const last = episodes[key] ?? 0
      if (match && last <= 0) {
        episodes[key] = -last + 1
        diff.fresh.push({ watchId: watch.id, date, windowId, episode: -last + 1, match })
        changed = true
      } else if (!match && last > 0) {
        episodes[key] = -last
        diff.gone.push({ watchId: watch.id, date, windowId, episode: last })
        changed = true
      }
    }
    if (watch.kind === 'trip') {
      // The trip's day is judged while the forecast holds it; a past day is left as it was.
      if (watch.tripDate && lake.days.has(watch.tripDate))
        judged(
          `${watch.tripDate}/day`,
          watch.tripDate,
          'day',
          lake.days.get(watch.tripDate) ?? null,
        )
    } else {
      const compiled = compiled_.get(watch) ?? compileWatch(watch.conditions)
      const bank = watch.bankId ? (tables.get(watch.bankId) ?? null) : null
      for (const w of lake.windows) judged(w.key, w.date, w.id, judgeWindow(compiled, w, bank))
    }
    if (changed) diff.changed.push({ id: watch.id, episodes })
  }
  return diff
}

/** The banks whose tables a page needs: those of watches whose other conditions hold somewhere. */
function banksNeeded(
  page: WatchRow[],
  lakes: Map<string, LakeWindows>,
  compiled_: Map<WatchRow, CompiledWatch>,
): string[] {
  const ids = new Set<string>()
  for (const watch of page) {
    if (!watch.bankId || watch.kind === 'trip' || ids.has(watch.bankId)) continue
    const windows = lakes.get(watch.lakeId)?.windows ?? []
    const compiled = compileWatch(watch.conditions)
    compiled_.set(watch, compiled)
    // A window with an open episode must be judged whole too, to tell when it stops.
    if (
      windows.some((w) => meetsLakeConditions(compiled, w)) ||
      Object.values(watch.episodes).some((n) => n > 0)
    )
      ids.add(watch.bankId)
  }
  return [...ids]
}

/**
 * Judges every active watch against the lakes' stored days and records what changed: a window
 * that begins matching is claimed as an alert (a row inserted before anything is sent, its key
 * taken once across runners), one that stops matching is cleared. Returns the claimed alerts.
 * Each page's writes go on while the next page is read and judged.
 */
export async function matchWatches(
  db: Db,
  opts: { now: Date; leaseUntil: Date; pageSize?: number },
): Promise<{ watches: number; claimed: AlertKey[]; cleared: number }> {
  const repo = watchRepo(db)
  const { now } = opts
  // Trips and episodes from yesterday on (UTC): every lake's local today is inside.
  const fromDate = addDays(localDate(now, 'UTC'), -1)
  await repo.ensureTripWatches(fromDate)
  const lakes = lakeWindows(await repo.lakeDays(now), now)
  const claimed: AlertKey[] = []
  let cleared = 0
  let watches = 0
  let writing: Promise<void> = Promise.resolve()
  let after = '00000000-0000-0000-0000-000000000000'
  for (;;) {
    const page = await repo.watchPage(after, opts.pageSize ?? WATCH_PAGE)
    if (!page.length) break
    watches += page.length
    after = page.at(-1)!.id
    const compiled = new Map<WatchRow, CompiledWatch>()
    const needed = banksNeeded(page, lakes, compiled)
    const tables = new Map(
      needed.length ? (await repo.bankTables(needed)).map((b) => [b.id, b.exposure]) : [],
    )
    const { fresh, gone, changed } = diffPage(page, lakes, tables, fromDate, compiled)
    const previous = writing
    writing = (async () => {
      // Claims first: an episode is stored only once its alert row exists (or another runner's does).
      const [won, ended] = await Promise.all([
        fresh.length ? repo.claimNew(fresh, now, opts.leaseUntil) : [],
        gone.length ? repo.clear(gone, now).then((r) => r.rowCount ?? 0) : 0,
      ])
      if (changed.length) await repo.saveEpisodes(changed)
      await previous
      claimed.push(...won)
      cleared += ended
    })()
  }
  await writing
  return { watches, claimed, cleared }
}
