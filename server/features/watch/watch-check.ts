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
  type WatchMatch,
} from '../../../shared/conditions/watch'
import type { WatchConditions } from '../../../shared/schemas/watch'
import { addDays, localDate } from '../../../shared/time'
import type { Db } from '../../db/index'
import { watchRepo, type AlertKey, type WatchRepo, type WatchRow } from './watch.repo'

/** Watches read per round trip; a run's memory stays flat however many there are. */
export const WATCH_PAGE = 10_000

interface LakeWindows {
  /** The lake's local today: a watch's `daysAhead` counts from it. */
  today: string
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
  for (const { lakeId, timeZone, date, day } of rows) {
    let lake = lakes.get(lakeId)
    if (!lake)
      lakes.set(lakeId, (lake = { today: localDate(now, timeZone), windows: [], days: new Map() }))
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

/**
 * One set of conditions judged on one lake's windows, once per run however many watches share
 * it: whether each window meets everything but the bank, and the match of a lake-wide watch.
 */
interface ConditionsOnLake {
  compiled: CompiledWatch
  /** Per window of the lake: the bank-free conditions and the watch's days ahead hold. */
  holds: boolean[]
  /** Per window: the match of a watch on the whole lake. */
  lakeMatch: (WatchMatch | null)[]
  anyHolds: boolean
}

/**
 * The judging of a run: each distinct set of conditions (by its stored text) is compiled and
 * judged on each lake once, so a run's cost is the watches' episodes plus a bank's table where a
 * bank-free condition holds, not every watch against every window.
 */
export class RunJudge {
  /** Lake id → conditions text → the judging; two levels, so a watch's text is hashed once. */
  private readonly groups = new Map<string, Map<string, ConditionsOnLake>>()

  constructor(readonly lakes: Map<string, LakeWindows>) {}

  on(lakeId: string, conditions: string): ConditionsOnLake | undefined {
    let onLake = this.groups.get(lakeId)
    if (!onLake) this.groups.set(lakeId, (onLake = new Map()))
    const found = onLake.get(conditions)
    if (found) return found
    const lake = this.lakes.get(lakeId)
    if (!lake) return undefined
    const parsed = JSON.parse(conditions) as WatchConditions
    const compiled = compileWatch(parsed)
    const until = parsed.daysAhead ? addDays(lake.today, parsed.daysAhead) : null
    const holds = lake.windows.map(
      (w) => (!until || w.date < until) && meetsLakeConditions(compiled, w),
    )
    const group = {
      compiled,
      holds,
      lakeMatch: lake.windows.map((w, i) => (holds[i] ? judgeWindow(compiled, w, null) : null)),
      anyHolds: holds.includes(true),
    }
    onLake.set(conditions, group)
    return group
  }
}

/**
 * The match of a bank watch that does not ask for wind onto its bank: the bank only colours the
 * alert's words (its exposure), so its table is read only for the windows this run claims.
 */
const BANK_WORDS_LATER = Object.freeze({})

/** What one page of watches changes: alerts to claim and to clear, and the episodes to store. */
export interface PageDiff {
  fresh: (AlertKey & { match: object })[]
  gone: AlertKey[]
  changed: { id: string; episodes: Record<string, number> }[]
  /** Fresh alerts whose match waits for their bank's table (`BANK_WORDS_LATER`). */
  later: {
    alert: AlertKey & { match: object }
    bankId: string
    compiled: CompiledWatch
    window: WatchedWindow
  }[]
}

/**
 * Judges a page of watches against the lakes' windows and compares the result with each watch's
 * episodes: a window that begins matching opens the next episode, one that stops closes it.
 * Episodes of dates before `fromDate` are dropped. `tables` holds the exposure tables of the
 * banks whose watches ask for wind onto them.
 */
export function diffPage(
  page: WatchRow[],
  judge: RunJudge,
  tables: Map<string, ExposureTable>,
  fromDate: string,
): PageDiff {
  const diff: PageDiff = { fresh: [], gone: [], changed: [], later: [] }
  for (const watch of page) {
    const lake = judge.lakes.get(watch.lakeId)
    if (!lake) continue
    // The row's own object, freshly parsed: changed in place. `date/window` keys sort by date.
    const episodes = watch.episodes
    let changed = false
    for (const key in episodes)
      if (key < fromDate) {
        delete episodes[key]
        changed = true
      }
    /** Compares a window's match with its last episode; true when it opened a new one. */
    const judged = (key: string, date: string, windowId: string, match: object | null) => {
      const last = episodes[key] ?? 0
      if (match && last <= 0) {
        episodes[key] = -last + 1
        diff.fresh.push({ watchId: watch.id, date, windowId, episode: -last + 1, match })
        changed = true
        return true
      }
      if (!match && last > 0) {
        episodes[key] = -last
        diff.gone.push({ watchId: watch.id, date, windowId, episode: last })
        changed = true
      }
      return false
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
      const { compiled, holds, lakeMatch } = judge.on(watch.lakeId, watch.conditions)!
      const { bankId } = watch
      const onto = compiled.wind?.onto ?? false
      lake.windows.forEach((w, i) => {
        const match = !holds[i]
          ? null
          : !bankId
            ? lakeMatch[i]!
            : onto
              ? judgeWindow(compiled, w, tables.get(bankId) ?? null)
              : BANK_WORDS_LATER
        if (judged(w.key, w.date, w.id, match) && match === BANK_WORDS_LATER)
          diff.later.push({ alert: diff.fresh.at(-1)!, bankId: bankId!, compiled, window: w })
      })
    }
    if (changed) diff.changed.push({ id: watch.id, episodes })
  }
  return diff
}

/**
 * The banks whose tables a page needs to judge: those of watches asking for wind onto the bank
 * whose other conditions hold somewhere.
 */
function banksNeeded(page: WatchRow[], judge: RunJudge): string[] {
  const ids = new Set<string>()
  for (const watch of page) {
    if (!watch.bankId || watch.kind === 'trip' || ids.has(watch.bankId)) continue
    const group = judge.on(watch.lakeId, watch.conditions)
    if (!group?.compiled.wind?.onto) continue
    // A window with an open episode must be judged whole too, to tell when it stops.
    if (group.anyHolds || Object.values(watch.episodes).some((n) => n > 0)) ids.add(watch.bankId)
  }
  return [...ids]
}

/** Where a run's time went, in milliseconds (reading and writing overlap). */
export interface MatchPhases {
  lakes: number
  read: number
  tables: number
  judge: number
  write: number
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
): Promise<{ watches: number; claimed: AlertKey[]; cleared: number; phases: MatchPhases }> {
  const repo = watchRepo(db)
  const { now } = opts
  const phases: MatchPhases = { lakes: 0, read: 0, tables: 0, judge: 0, write: 0 }
  let at = performance.now()
  const lap = (phase: keyof MatchPhases) => {
    const t = performance.now()
    phases[phase] += t - at
    at = t
  }
  // Trips and episodes from yesterday on (UTC): every lake's local today is inside.
  const fromDate = addDays(localDate(now, 'UTC'), -1)
  await repo.ensureTripWatches(fromDate)
  const judge = new RunJudge(lakeWindows(await repo.lakeDays(now), now))
  lap('lakes')
  const claimed: AlertKey[] = []
  let cleared = 0
  let watches = 0
  let writing: Promise<void> = Promise.resolve()
  let after = '00000000-0000-0000-0000-000000000000'
  for (;;) {
    const page = await repo.watchPage(after, opts.pageSize ?? WATCH_PAGE)
    lap('read')
    if (!page.length) break
    watches += page.length
    after = page.at(-1)!.id
    const needed = banksNeeded(page, judge)
    lap('judge')
    const tables = new Map(
      needed.length ? (await repo.bankTables(needed)).map((b) => [b.id, b.exposure]) : [],
    )
    lap('tables')
    const { fresh, gone, changed, later } = diffPage(page, judge, tables, fromDate)
    lap('judge')
    const more = [...new Set(later.map((l) => l.bankId))].filter((id) => !tables.has(id))
    if (more.length) for (const b of await repo.bankTables(more)) tables.set(b.id, b.exposure)
    lap('tables')
    // The window holds without the bank, so it matches with it: the bank adds its exposure.
    for (const l of later)
      l.alert.match = judgeWindow(l.compiled, l.window, tables.get(l.bankId) ?? null)!
    lap('judge')
    const previous = writing
    writing = (async () => {
      // Claims first: an episode is stored only once its alert row exists (or another runner's does).
      const [won, ended] = await Promise.all([
        fresh.length ? repo.claimNew(fresh, now, opts.leaseUntil) : [],
        gone.length ? repo.clear(gone, now) : 0,
      ])
      if (changed.length) await repo.saveEpisodes(changed)
      await previous
      claimed.push(...won)
      cleared += ended
    })()
  }
  await writing
  lap('write')
  for (const k of Object.keys(phases) as (keyof MatchPhases)[]) phases[k] = Math.round(phases[k])
  return { watches, claimed, cleared, phases }
}
