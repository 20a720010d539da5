import { lakeDay, PLAN_DAYS, planForBanks } from '../../../shared/conditions/day-plan'
import { withYourLog, type LogCatch } from '../../../shared/journal/feedback'
import type { DayPlanResponse } from '../../../shared/schemas/day-plan'
import type { LakeRead } from '../../../shared/schemas/lake-read'
import { addDays, localDate, localDayBounds, zonedMidnight } from '../../../shared/time'
import { NoticedCache, type Changes } from '../../db/changes'
import type { Db } from '../../db/index'
import { HttpError, notFound } from '../../http/errors'
import { prepareJson, type PreparedJson } from '../../http/prepared-json'
import { lakeReadRepo, type LakeRow } from '../lakes/lake-read.repo'
import {
  flagsHoldUntil,
  lakeReadService,
  withStaleFlags,
  type LakeReadService,
} from '../lakes/lake-read.service'
import { logCatches } from '../journal/your-log'
import { conditionsRepo, type ConditionsRepo } from './conditions.repo'

export { PLAN_DAYS }

/**
 * The instants between which a date has a plan: from when it is the last day the forecast reaches
 * until the day after it ends, in the lake's time zone (plans cover yesterday, today and the next
 * days). Kept with a plan, so a repeat view checks two numbers, not the calendar.
 */
function plannableFrom(date: string, timeZone: string): [number, number] {
  return [
    zonedMidnight(addDays(date, 1 - PLAN_DAYS), timeZone).getTime(),
    zonedMidnight(addDays(date, 2), timeZone).getTime(),
  ]
}

function assertPlannable([from, until]: [number, number], now: Date) {
  if (now.getTime() < from || now.getTime() >= until) {
    throw new HttpError(
      404,
      'no_plan_for_date',
      `Plans cover yesterday, today and the next ${PLAN_DAYS - 1} days.`,
    )
  }
}

/** What a lake's read lacks for a day plan, in words; null when nothing is missing. */
function missingForPlan(read: LakeRead): string | null {
  const missing = [
    !read.waterTemp && 'a water temperature',
    !read.clarity && 'a clarity reading',
    !read.phase && 'two weeks of water temperatures for the seasonal phase',
  ].filter(Boolean)
  return missing.length ? `This lake needs ${missing.join(', ')} before it can be planned.` : null
}

export function conditionsService(deps: {
  repo: ConditionsRepo
  reads: LakeReadService
  changes?: Changes
  /** The angler's catches in a day's clarity and phase, for the log's line beside the tackle. */
  logOf?: (userId: string, day: { clarity: string; phase: string }) => Promise<LogCatch[]>
}) {
  const { repo, reads, changes } = deps

  /** Computes a lake's read and its days from what is stored, and caches both. */
  async function refreshLake(lake: LakeRow, now: Date) {
    const read = await reads.compute(lake, now)
    await repo.saveRead(lake.id, read, now, flagsHoldUntil(read))
    const today = localDate(now, lake.timeZone)
    const days = []
    if (!missingForPlan(read)) {
      const dates = Array.from({ length: PLAN_DAYS }, (_, i) => addDays(today, i))
      // One read of the weather for all the days; each window takes the hours inside it, and
      // the day before it for telling a front that passed in the night.
      const hourly = await repo.hours(
        lake.id,
        localDayBounds(addDays(today, -1), lake.timeZone)[0],
        localDayBounds(dates.at(-1)!, lake.timeZone)[1],
      )
      for (const date of dates) {
        const day = lakeDay({
          lake: lake.shoreline,
          date,
          timeZone: lake.timeZone,
          hourly,
          waterC: read.waterTemp!.valueC,
          secchiM: read.clarity!.secchiM,
          phase: read.phase!.phase,
        })
        // The forecast ends here.
        if (day.windows.every((w) => !w.weather)) break
        days.push({ date, day })
      }
    }
    await repo.saveDays(lake.id, today, addDays(today, -1), days, now)
    return read
  }

  /** Why a lake has no plan for a date: something the read lacks, or a forecast that ends sooner. */
  async function whyNoPlan(slug: string) {
    const text = (await repo.readBySlug(slug))?.text
    const read = text ? (JSON.parse(text) as LakeRead) : null
    return (read && missingForPlan(read)) ?? 'The forecast does not reach this date yet.'
  }

  /**
   * The Day plan for an angler, lake and date, built from the cache the ingest jobs refresh, with
   * the window in which its date can be planned.
   */
  async function plan(
    userId: string,
    slug: string,
    date: string,
    now: Date,
  ): Promise<{ window: [number, number]; response: DayPlanResponse }> {
    let view = await repo.planView(slug, date, userId)
    if (!view) throw notFound('lake')
    const window = plannableFrom(date, view.time_zone)
    assertPlannable(window, now)
    if (!view.has_read) {
      // A lake no ingest has reached yet is read now, and cached like any other.
      await refreshLake(await repo.lake(view.id), now)
      view = (await repo.planView(slug, date, userId))!
    }
    const banks = view.banks.map((b) => ({ ...b, depthM: b.depthM ?? undefined }))
    const planned = view.day ? planForBanks(view.day, banks) : null
    const ranked =
      planned && deps.logOf ? withYourLog(planned, await deps.logOf(userId, planned)) : planned
    const response: DayPlanResponse = {
      lake: { slug: view.slug, name: view.name, timeZone: view.time_zone },
      date,
      dates: view.dates,
      computedAt: view.computed_at?.toISOString() ?? null,
      banksSaved: banks.length,
      unavailable: ranked ? null : await whyNoPlan(slug),
      plan: ranked,
    }
    return { window, response }
  }

  // Answers as sent, dropped on a change notice about what they were made from.
  const refreshed = new Set(['lakes', 'lake_reads', 'lake_days'])
  const readRows = new NoticedCache<{
    row: Awaited<ReturnType<ConditionsRepo['readBySlug']>>
    /** The read ready to send: as stored, then as last re-judged against the clock. */
    answer: PreparedJson | null
    /** Until when the answer's stale flags hold; null until the next refresh. */
    holdUntil: Date | null
  }>(changes, { max: 1_000 }, (change, kept) => refreshed.has(change.table) && kept.clear())
  const plans = new NoticedCache<{ window: [number, number]; answer: PreparedJson }>(
    changes,
    { maxSize: 32 * 2 ** 20, sizeCalculation: (kept) => kept.answer.body.length },
    (change, kept) => {
      if (refreshed.has(change.table)) kept.clear()
      // Keys start with the angler's id: a bank or catch notice names its angler (the log's line).
      else if (change.table === 'banks' || change.table === 'catches')
        for (const key of kept.keys()) if (key.startsWith(`${change.key} `)) kept.delete(key)
    },
  )

  return {
    /** One lake's read and days recomputed, after its outline changes. */
    async refresh(lakeId: string, now = new Date()) {
      await refreshLake(await repo.lake(lakeId), now)
    },

    /** After each ingest: every lake's read and days recomputed once, for all page views. */
    async refreshAll(now = new Date()) {
      const lakes = await repo.allLakes()
      for (const lake of lakes) await refreshLake(lake, now)
      return { lakes: lakes.length }
    },

    /**
     * The Lake read, ready to send. While its stale flags still hold it goes out exactly as stored;
     * when a value turns stale it is re-judged against the clock, and that answer is kept until
     * the next value does.
     */
    async readAnswer(slug: string, now = new Date()): Promise<PreparedJson> {
      const kept = await readRows.get(slug, async () => {
        const found = await repo.readBySlug(slug)
        return {
          row: found,
          answer: found?.text ? prepareJson(found.text) : null,
          holdUntil: found?.holdUntil ?? null,
        }
      })
      const { row } = kept
      if (!row) throw notFound('lake')
      if (!kept.answer)
        return prepareJson(JSON.stringify(await refreshLake(await repo.lake(row.id), now)))
      if (kept.holdUntil && now >= kept.holdUntil) {
        const read = withStaleFlags(JSON.parse(row.text!) as LakeRead, now)
        kept.answer = prepareJson(JSON.stringify(read))
        kept.holdUntil = flagsHoldUntil(read, now)
      }
      return kept.answer
    },

    /**
     * The Day plan, ready to send: the lake's cached day with this angler's banks ranked in it.
     * With change notices live it is made once per angler, lake and date, and again after an
     * ingest refreshes the lake or the angler edits a bank.
     */
    async planAnswer(
      userId: string,
      slug: string,
      date: string,
      now = new Date(),
    ): Promise<PreparedJson> {
      const kept = await plans.get(`${userId} ${slug} ${date}`, async () => {
        const { window, response } = await plan(userId, slug, date, now)
        return { window, answer: prepareJson(JSON.stringify(response)) }
      })
      // A kept plan's date may have left the window since (midnight passed).
      assertPlannable(kept.window, now)
      return kept.answer
    },
  }
}
export type ConditionsService = ReturnType<typeof conditionsService>

/** The service wired to its repositories: for the app and for the jobs. */
export function conditionsFor(db: Db, changes?: Changes): ConditionsService {
  return conditionsService({
    repo: conditionsRepo(db),
    reads: lakeReadService(lakeReadRepo(db)),
    changes,
    logOf: async (userId, day) => (await logCatches(db, [userId], day)).get(userId) ?? [],
  })
}
