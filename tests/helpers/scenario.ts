import { and, asc, eq, gte, lt } from 'drizzle-orm'
import { afterAll, beforeAll, describe } from 'vitest'
import {
  lakeDays,
  lakes,
  readings,
  stations,
  users,
  weatherHours,
} from '../../server/db/schema/index'
import { DEMO_USERS, seedDemo } from '../../server/db/seed/index'
import { SCENARIOS, scenarioClock, type ScenarioName } from '../../server/fakes/feed/scenarios'
import { banksRepo } from '../../server/features/banks/banks.repo'
import { banksService } from '../../server/features/banks/banks.service'
import { conditionsRepo } from '../../server/features/conditions/conditions.repo'
import { conditionsFor } from '../../server/features/conditions/conditions.service'
import { backfillReadings, ingestReadings } from '../../server/features/ingest/readings.ingest'
import { ingestWeather } from '../../server/features/ingest/weather.ingest'
import type { WindowId } from '../../shared/conditions/day-plan'
import type { Cover } from '../../shared/conditions/tackle-rules'
import { fetchLength } from '../../shared/geo/fetch'
import { lakeCenter } from '../../shared/geo/polygon'
import { destination } from '../shared/geo/fixtures'
import type { Parameter } from '../../shared/readings'
import type { DayPlanResponse } from '../../shared/schemas/day-plan'
import type { LakeRead } from '../../shared/schemas/lake-read'
import { addDays, localDayBounds } from '../../shared/time'
import { createTestDb } from './db'
import { ingestDeps, startTestFeed } from './feed'

const DEMO_ANGLER_EMAIL = DEMO_USERS.find((u) => u.role === 'angler')!.email

/**
 * A database as the ingest jobs leave it on a scenario's morning: the demo data, the scenario's
 * lake backfilled through the real jobs (30 days and more of readings), the weather observed over
 * the last two days and the latest forecast, and the conditions cache refreshed. The feed's clock
 * stands at the scenario's clock (05:00 local on its day).
 */
export async function startScenario(name: ScenarioName) {
  const scenario = SCENARIOS[name]
  const ctx = await createTestDb()
  await seedDemo(ctx.db)
  const feed = await startTestFeed(scenarioClock(scenario).toISOString())
  feed.controls.setScenario(name)
  const [lake] = await ctx.db.select().from(lakes).where(eq(lakes.slug, scenario.lake))
  const deps = ingestDeps(ctx.db, feed)
  await backfillReadings(deps, lake!.id, scenario.backfillDays)
  await ingestWeather(deps)
  const conditions = conditionsFor(ctx.db)
  await conditions.refreshAll(feed.now())
  let date = scenario.day
  /** A local date: an offset in days from the scenario's day, or the date itself. */
  const dateOf = (day: number | string) =>
    typeof day === 'number' ? addDays(scenario.day, day) : day

  const anglerId = async () =>
    (await ctx.db.select().from(users).where(eq(users.email, DEMO_ANGLER_EMAIL)))[0]!.id

  /** The stored day of the lake for a date. */
  async function lakeDay(day: number | string = 0) {
    const [row] = await ctx.db
      .select()
      .from(lakeDays)
      .where(and(eq(lakeDays.lakeId, lake!.id), eq(lakeDays.date, dateOf(day))))
    return row?.day ?? null
  }

  return {
    ...ctx,
    feed,
    scenario,
    lake: lake!,
    conditions,
    dateOf,
    lakeDay,
    /** The local date the clock stands on: the scenario's day until `moveTo`. */
    get date() {
      return date
    },
    /**
     * Moves the clock to the scenario's hour `days` after its day (never before the last run),
     * and runs the jobs as they would have run since: readings, weather, the cache refresh.
     */
    async moveTo(days: number) {
      date = dateOf(days)
      feed.setNow(scenarioClock(scenario, date))
      await ingestReadings(deps)
      await ingestWeather(deps)
      await conditions.refreshAll(feed.now())
      return date
    },
    /**
     * The weather hours inside one window of a stored lake day, as the service read them to make
     * it (an observed hour wins over its forecast).
     */
    async windowHours(day: number | string, window: WindowId) {
      const w = (await lakeDay(day))?.windows.find((x) => x.id === window)
      if (!w) return []
      return conditionsRepo(ctx.db).hours(lake!.id, new Date(w.start), new Date(w.end))
    },
    /** Stored weather hours of one local day (observed, forecast or both), oldest first. */
    async weatherOn(day: number | string, kind?: 'observed' | 'forecast') {
      const [from, to] = localDayBounds(dateOf(day), scenario.timeZone)
      return ctx.db
        .select()
        .from(weatherHours)
        .where(
          and(
            eq(weatherHours.lakeId, lake!.id),
            gte(weatherHours.at, from),
            lt(weatherHours.at, to),
            ...(kind ? [eq(weatherHours.kind, kind)] : []),
          ),
        )
        .orderBy(asc(weatherHours.at), asc(weatherHours.kind))
    },
    /** The lake's stored readings of one parameter from an instant on, oldest first (SI units). */
    async readingsOf(parameter: Parameter, since: Date) {
      return ctx.db
        .select({ at: readings.observedAt, value: readings.value })
        .from(readings)
        .innerJoin(stations, eq(stations.id, readings.stationId))
        .where(
          and(
            eq(stations.lakeId, lake!.id),
            eq(readings.parameter, parameter),
            gte(readings.observedAt, since),
          ),
        )
        .orderBy(asc(readings.observedAt))
    },
    /** The Lake read as the app sends it at the feed's clock. */
    async read(): Promise<LakeRead> {
      return (await conditions.read(lake!.slug, feed.now())).read
    },
    /**
     * Saves a bank for the demo angler where the shore lies `bearingDeg` from the lake's centre:
     * two points on the shore 4° apart as seen from the centre, so it faces back across the lake.
     */
    async saveBank(name: string, bearingDeg: number, cover: Cover[], depthM = 3) {
      const center = lakeCenter(lake!.shoreline)
      const onShore = (deg: number) =>
        destination(center, deg, fetchLength(lake!.shoreline, center, deg) - 1)
      return banksService(banksRepo(ctx.db)).create(await anglerId(), lake!.slug, {
        name,
        points: [onShore(bearingDeg - 2), onShore(bearingDeg + 2)],
        cover,
        depthM,
        slope: null,
        notes: '',
      })
    },
    /** The demo angler's Day plan for a date, as the app sends it at the feed's clock. */
    async plan(day: number | string = 0): Promise<DayPlanResponse> {
      return (await conditions.plan(await anglerId(), lake!.slug, dateOf(day), feed.now())).plan
    },
    close: async () => {
      await feed.close()
      await ctx.drop()
    },
  }
}
export type ScenarioWorld = Awaited<ReturnType<typeof startScenario>>

/** A describe block that starts a scenario once for its tests and closes it after them. */
export function describeScenario(name: ScenarioName, body: (get: () => ScenarioWorld) => void) {
  describe(name, () => {
    let w: ScenarioWorld
    beforeAll(async () => {
      w = await startScenario(name)
    }, 30_000)
    afterAll(async () => {
      await w?.close()
    })
    body(() => w)
  })
}
