import { lakeDay, PLAN_DAYS, planForBanks } from '../../../shared/conditions/day-plan'
import { withYourLog, type LogCatch } from '../../../shared/journal/feedback'
import type { DayPlanResponse } from '../../../shared/schemas/day-plan'
import type { LakeRead } from '../../../shared/schemas/lake-read'
import { addDays, localDate, localDayBounds, zonedMidnight } from '../../../shared/time'
import type { Db } from '../../db/index'
import { HttpError, notFound } from '../../http/errors'
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
 * When a date stops having a plan: a date has one from when it is the last day the forecast
 * reaches until the day after it ends, in the lake's time zone (plans cover yesterday, today and
 * the next days).
 */
function plannableUntil(date: string, timeZone: string, now: Date): Date {
  const from = zonedMidnight(addDays(date, 1 - PLAN_DAYS), timeZone)
  const until = zonedMidnight(addDays(date, 2), timeZone)
  if (now < from || now >= until) {
    throw new HttpError(
      404,
      'no_plan_for_date',
      `Plans cover yesterday, today and the next ${PLAN_DAYS - 1} days.`,
    )
  }
  return until
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
  /** The angler's catches in a day's clarity and phase, for the log's line beside the tackle. */
  logOf?: (userId: string, day: { clarity: string; phase: string }) => Promise<LogCatch[]>
}) {
  const { repo, reads } = deps

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
    const read = (await repo.read(slug))?.read
    return (read && missingForPlan(read)) ?? 'The forecast does not reach this date yet.'
  }

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
     * The Lake read as last refreshed, with its lake's id and until when its stale flags hold
     * (null: for good). Until then the stored read is right as it is; after that its values are
     * re-judged against the clock, so a value that has turned stale says so.
     */
    async read(slug: string, now = new Date()) {
      const row = await repo.read(slug)
      if (!row) throw notFound('lake')
      // A lake no ingest has reached yet is read now, and cached like any other.
      const stored = row.read ?? (await refreshLake(await repo.lake(row.id), now))
      const read =
        row.flagsHoldUntil && now >= row.flagsHoldUntil ? withStaleFlags(stored, now) : stored
      return { lakeId: row.id, read, holdsUntil: flagsHoldUntil(read, now) }
    },

    /**
     * The Day plan for an angler, lake and date: the lake's cached day with this angler's banks
     * ranked in it, with the lake's id and when the date stops being plannable.
     */
    async plan(userId: string, slug: string, date: string, now = new Date()) {
      let view = await repo.planView(slug, date, userId)
      if (!view) throw notFound('lake')
      const until = plannableUntil(date, view.timeZone, now)
      if (!view.hasRead) {
        // A lake no ingest has reached yet is read now, and cached like any other.
        await refreshLake(await repo.lake(view.id), now)
        view = (await repo.planView(slug, date, userId))!
      }
      const banks = view.banks.map((b) => ({ ...b, depthM: b.depthM ?? undefined }))
      const planned = view.day ? planForBanks(view.day, banks) : null
      const ranked =
        planned && deps.logOf ? withYourLog(planned, await deps.logOf(userId, planned)) : planned
      const plan: DayPlanResponse = {
        lake: { slug: view.slug, name: view.name, timeZone: view.timeZone },
        date,
        dates: view.dates,
        computedAt: view.computedAt?.toISOString() ?? null,
        banksSaved: banks.length,
        unavailable: ranked ? null : await whyNoPlan(slug),
        plan: ranked,
      }
      return { lakeId: view.id, plan, plannableUntil: until }
    },
  }
}
export type ConditionsService = ReturnType<typeof conditionsService>

/** The service wired to its repositories: for the app and for the jobs. */
export function conditionsFor(db: Db): ConditionsService {
  return conditionsService({
    repo: conditionsRepo(db),
    reads: lakeReadService(lakeReadRepo(db)),
    logOf: async (userId, day) => (await logCatches(db, [userId], day)).get(userId) ?? [],
  })
}
