import { planForBanks, skyFromCloud } from '../../../shared/conditions/day-plan'
import { bankExposure, type ExposureTable } from '../../../shared/conditions/exposure'
import { skyDay } from '../../../shared/conditions/sky'
import type { CatchConditions } from '../../../shared/schemas/journal'
import { HOUR_MS, localDate } from '../../../shared/time'
import { and, asc, eq, gte, lte, sql } from 'drizzle-orm'
import type { Db } from '../../db/index'
import { lakeDays, weatherHours } from '../../db/schema/index'
import { lakeReadRepo, type LakeRow } from '../lakes/lake-read.repo'
import { lakeReadService, withStaleFlags } from '../lakes/lake-read.service'

/** The weather hour nearest a catch counts when it is at most this far off. */
const NEAREST_HOUR_MS = 90 * 60_000

/** Which part of the day a moment falls in, by the sun at the lake (the Day plan's windows). */
export function timeOfDay(
  at: Date,
  lake: Pick<LakeRow, 'centerLat' | 'centerLon' | 'timeZone'>,
): CatchConditions['timeOfDay'] {
  const sky = skyDay(lake.centerLat, lake.centerLon, localDate(at, lake.timeZone), lake.timeZone)
  const t = at.getTime()
  const ms = (iso: string | null, fallback: number) => (iso ? Date.parse(iso) : fallback)
  const sunrise = ms(sky.sunrise, NaN)
  const sunset = ms(sky.sunset, NaN)
  if (Number.isNaN(sunrise) || Number.isNaN(sunset)) return 'midday'
  const dawn = ms(sky.civilDawn, sunrise - HOUR_MS / 2)
  const dusk = ms(sky.civilDusk, sunset + HOUR_MS / 2)
  if (t < dawn || t >= dusk) return 'night'
  if (t < sunrise + 3 * HOUR_MS) return 'dawn'
  if (t < sunset - 3 * HOUR_MS) return 'midday'
  return 'afternoon'
}

/**
 * The conditions at a catch's time and place, from what is stored: the Lake read computed for
 * that moment (water, clarity and its trend, phase, wind, pressure), the weather hour nearest it
 * (sky), the bank's exposure table against that wind, and the day's verdict from the cached day.
 */
export function catchConditionsFor(db: Db) {
  const reads = lakeReadService(lakeReadRepo(db))

  async function nearestHour(lakeId: string, at: Date) {
    const [row] = await db
      .select()
      .from(weatherHours)
      .where(
        and(
          eq(weatherHours.lakeId, lakeId),
          gte(weatherHours.at, new Date(at.getTime() - NEAREST_HOUR_MS)),
          lte(weatherHours.at, new Date(at.getTime() + NEAREST_HOUR_MS)),
        ),
      )
      // What was observed beats what was forecast, then the nearer hour.
      .orderBy(
        sql`${weatherHours.kind} = 'forecast'`,
        sql`abs(extract(epoch from ${weatherHours.at} - ${at.toISOString()}::timestamptz))`,
        asc(weatherHours.at),
      )
      .limit(1)
    return row
  }

  async function cachedDay(lakeId: string, date: string) {
    const [row] = await db
      .select({ day: lakeDays.day })
      .from(lakeDays)
      .where(and(eq(lakeDays.lakeId, lakeId), eq(lakeDays.date, date)))
    return row?.day
  }

  return async function conditionsAt(
    lake: LakeRow,
    at: Date,
    bank: { exposure: ExposureTable } | null,
  ): Promise<CatchConditions> {
    const date = localDate(at, lake.timeZone)
    const [read, hour, day] = await Promise.all([
      reads.compute(lake, at).then((r) => withStaleFlags(r, at)),
      nearestHour(lake.id, at),
      cachedDay(lake.id, date),
    ])
    const wind =
      read.windNow ??
      (hour && { windMs: hour.windMs, gustMs: hour.gustMs, windFromDeg: hour.windFromDeg })
    const clarity = read.clarity && !read.clarity.stale ? read.clarity : null
    const verdict = day ? planForBanks(day, []).verdict.verdict : read.verdict.verdict
    return {
      waterC: read.waterTemp && !read.waterTemp.stale ? read.waterTemp.valueC : null,
      clarity: clarity && {
        class: clarity.class,
        secchiM: clarity.secchiM,
        trend: clarity.trend?.label ?? null,
      },
      phase: read.phase?.phase ?? null,
      wind: wind ? { ms: wind.windMs, gustMs: wind.gustMs, fromDeg: wind.windFromDeg } : null,
      bankExposure:
        bank && wind ? bankExposure(bank.exposure, wind.windFromDeg, wind.windMs).exposure : null,
      sky: hour ? skyFromCloud(hour.cloudCoverPct) : null,
      cloudCoverPct: hour?.cloudCoverPct ?? null,
      airC: read.airC ?? hour?.airC ?? null,
      pressure: read.pressure && {
        hPa: read.pressure.hPa,
        changeHpa3h: read.pressure.changeHpa3h,
        label: read.pressure.label,
      },
      verdict,
      timeOfDay: timeOfDay(at, lake),
      localDate: date,
      computedAt: new Date().toISOString(),
    }
  }
}
