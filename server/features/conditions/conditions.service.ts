import { lakeDay, planForBanks } from '../../../shared/conditions/day-plan'
import type { DayPlanResponse } from '../../../shared/schemas/day-plan'
import type { LakeRead } from '../../../shared/schemas/lake-read'
import { addDays, localDate, localDayBounds } from '../../../shared/time'
import type { Db } from '../../db/index'
import { HttpError } from '../../http/errors'
import { banksRepo, type BanksRepo } from '../banks/banks.repo'
import { lakeReadRepo, type LakeRow } from '../lakes/lake-read.repo'
import { lakeReadService, withStaleFlags, type LakeReadService } from '../lakes/lake-read.service'
import { conditionsRepo, type ConditionsRepo } from './conditions.repo'

/** Plans cover today and the days the 7-day forecast reaches. */
export const PLAN_DAYS = 7

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
  banks: BanksRepo
}) {
  const { repo, reads, banks } = deps

  /** Computes a lake's read and its days from what is stored, and caches both. */
  async function refreshLake(lake: LakeRow, now: Date) {
    const read = await reads.compute(lake, now)
    await repo.saveRead(lake.id, read, now)
    const today = localDate(now, lake.timeZone)
    const days = []
    if (!missingForPlan(read)) {
      for (let i = 0; i < PLAN_DAYS; i++) {
        const date = addDays(today, i)
        const hourly = await repo.hours(lake.id, ...localDayBounds(date, lake.timeZone))
        if (!hourly.length) break
        const day = lakeDay({
          lake: lake.shoreline,
          date,
          timeZone: lake.timeZone,
          hourly,
          waterC: read.waterTemp!.valueC,
          secchiM: read.clarity!.secchiM,
          phase: read.phase!.phase,
        })
        days.push({ date, day })
      }
    }
    await repo.saveDays(lake.id, today, addDays(today, -1), days, now)
    return read
  }

  /** The lake and its cached read, computing the read first when the lake has never had one. */
  async function lakeAndRead(slug: string, now: Date) {
    const row = await repo.lakeWithRead(slug)
    if (!row) throw new HttpError(404, 'not_found', 'No such lake.')
    return { lake: row, read: row.read ?? (await refreshLake(await repo.lake(row.id), now)) }
  }

  return {
    /** After each ingest: every lake's read and days recomputed once, for all page views. */
    async refreshAll(now = new Date()) {
      const lakes = await repo.allLakes()
      for (const lake of lakes) await refreshLake(lake, now)
      return { lakes: lakes.length }
    },

    refreshLake,

    async read(slug: string, now = new Date()): Promise<LakeRead> {
      return withStaleFlags((await lakeAndRead(slug, now)).read, now)
    },

    /** The Day plan: the lake's cached day with this angler's banks ranked in it. */
    async plan(
      userId: string,
      slug: string,
      date: string,
      now = new Date(),
    ): Promise<DayPlanResponse> {
      const { lake: row, read } = await lakeAndRead(slug, now)
      const today = localDate(now, row.timeZone)
      if (date < addDays(today, -1) || date >= addDays(today, PLAN_DAYS)) {
        throw new HttpError(
          404,
          'no_plan_for_date',
          `Plans cover yesterday, today and the next ${PLAN_DAYS - 1} days.`,
        )
      }
      const [cached, dates, saved] = await Promise.all([
        repo.day(row.id, date),
        repo.dates(row.id),
        banks.list(userId, row.id),
      ])
      const plan = cached
        ? planForBanks(
            cached.day,
            saved.map((b) => ({ ...b, depthM: b.depthM ?? undefined })),
          )
        : null
      return {
        lake: { slug: row.slug, name: row.name, timeZone: row.timeZone },
        date,
        dates,
        computedAt: cached?.computedAt.toISOString() ?? null,
        banksSaved: saved.length,
        unavailable: plan
          ? null
          : (missingForPlan(read) ?? 'The forecast does not reach this date yet.'),
        plan,
      }
    },
  }
}
export type ConditionsService = ReturnType<typeof conditionsService>

/** The service wired to its repositories: for the app and for the jobs. */
export function conditionsFor(db: Db): ConditionsService {
  return conditionsService({
    repo: conditionsRepo(db),
    reads: lakeReadService(lakeReadRepo(db)),
    banks: banksRepo(db),
  })
}
