import {
  carlsonTsi,
  clarityClass,
  clarityTrend,
  secchiFromTurbidity,
} from '../../../shared/conditions/clarity'
import { openWaterWaveM } from '../../../shared/conditions/exposure'
import { cautions, verdictOf, worstOf } from '../../../shared/conditions/safety'
import {
  advancePhase,
  phaseView,
  seasonalPhase,
  STALE_STATE_DAYS,
  startPhase,
  type SeasonalPhaseResult,
} from '../../../shared/conditions/season'
import { skyDay } from '../../../shared/conditions/sky'
import { median, theilSen } from '../../../shared/conditions/trend'
import { pressureTendency } from '../../../shared/conditions/weather'
import { DomainError } from '../../../shared/errors'
import { isStale, staleAfterMs, type Parameter } from '../../../shared/readings'
import type { LakeRead, WindHour } from '../../../shared/schemas/lake-read'
import type { LakeSeries } from '../../../shared/schemas/lake-series'
import { addDays, localDate } from '../../../shared/time'
import { notFound } from '../../http/errors'
import type { LakeReadRepo, LakeRow } from './lake-read.repo'

const DAY = 86_400_000
type Point = { at: Date; value: number }

const iso = (d: Date) => d.toISOString()

/** Daily means by local date, oldest first, for the days that have readings; gaps end the run. */
function dailyMeans(points: Point[], timeZone: string): { days: number[]; lastDay: string } | null {
  const byDay = new Map<string, number[]>()
  for (const p of points) {
    const day = localDate(p.at, timeZone)
    byDay.set(day, [...(byDay.get(day) ?? []), p.value])
  }
  const days = [...byDay.keys()].sort()
  const lastDay = days.at(-1)
  if (!lastDay) return null
  // Only an unbroken run of days ending on the last one makes a series.
  const run: number[] = []
  for (let d = lastDay; byDay.has(d); d = addDays(d, -1)) {
    const v = byDay.get(d)!
    run.unshift(v.reduce((a, b) => a + b, 0) / v.length)
  }
  return { days: run, lastDay }
}

/** A computation over a series, or null when the series is too short for it (a DomainError). */
function unlessTooFew<T>(compute: () => T): T | null {
  try {
    return compute()
  } catch (err) {
    if (err instanceof DomainError) return null
    throw err
  }
}

function trendPerDay(points: Point[], now: Date): number | null {
  const recent = points.filter((p) => now.getTime() - p.at.getTime() <= 3 * DAY)
  const line = theilSen(
    recent.map((p) => ({ t: (p.at.getTime() - now.getTime()) / DAY, y: p.value })),
  )
  return recent.length >= 3 && line ? line.slope : null
}

const GAUGE_KEYS = ['waterTemp', 'clarity', 'level'] as const

/** The parameter whose age decides whether a gauge value of the read is stale. */
function parameterOf(read: LakeRead, key: (typeof GAUGE_KEYS)[number]): Parameter {
  if (key === 'waterTemp') return 'water_temp'
  if (key === 'level') return 'gauge_height'
  return read.clarity?.source === 'secchi' ? 'secchi' : 'turbidity'
}

/** Marks each gauge value stale or not by its age at `now`; a cached read is re-judged this way. */
export function withStaleFlags(read: LakeRead, now: Date): LakeRead {
  const out = { ...read }
  for (const key of GAUGE_KEYS) {
    const value = read[key]
    if (value)
      Object.assign(out, {
        [key]: { ...value, stale: isStale(parameterOf(read, key), new Date(value.at), now) },
      })
  }
  return out
}

/**
 * Until when a read's stale flags all hold, judged at `judgedAt` (by default when the read was
 * made): the first later moment one of its fresh values turns stale; null when none is fresh, as
 * nothing can then turn stale before the next refresh.
 */
export function flagsHoldUntil(read: LakeRead, judgedAt = new Date(read.asOf)): Date | null {
  const flips = GAUGE_KEYS.flatMap((key) => {
    const value = read[key]
    const flip = value ? Date.parse(value.at) + staleAfterMs(parameterOf(read, key)) : NaN
    return flip > judgedAt.getTime() ? [flip] : []
  })
  return flips.length ? new Date(Math.min(...flips)) : null
}

export function lakeReadService(repo: LakeReadRepo) {
  /**
   * The lake's seasonal phase at `now`: its stored state advanced over the whole days since it was
   * last judged, and stored again. A lake without a state (or with one a month old) starts from
   * its history. Only past days are judged, each once: a day's mean is final when the day is over.
   */
  async function currentPhase(
    lake: LakeRow,
    temps: Point[],
    now: Date,
  ): Promise<SeasonalPhaseResult | null> {
    const today = localDate(now, lake.timeZone)
    const means = dailyMeans(
      temps.filter((p) => localDate(p.at, lake.timeZone) < today),
      lake.timeZone,
    )
    const input = means && {
      dailyMeanWaterC: means.days,
      lastDay: means.lastDay,
      latitude: lake.centerLat,
    }
    const stored = await repo.phaseState(lake.id)
    const fresh = (day: string) => addDays(day, STALE_STATE_DAYS) >= (means?.lastDay ?? today)
    if (stored && input && stored.lastDay > input.lastDay) {
      // A read for a moment before the stored state (a recomputation of the past): not stored.
      return input.dailyMeanWaterC.length >= 14 ? seasonalPhase(input) : null
    }
    if (stored && fresh(stored.lastDay)) {
      const advanced = input ? (unlessTooFew(() => advancePhase(stored, input)) ?? stored) : stored
      if (advanced.lastDay !== stored.lastDay) await repo.savePhaseState(lake.id, advanced)
      return phaseView(advanced, lake.centerLat)
    }
    if (!input || input.dailyMeanWaterC.length < 14) return null
    const started = startPhase(input)
    await repo.savePhaseState(lake.id, started, true)
    return phaseView(started, lake.centerLat)
  }

  return {
    /** Hourly series for the charts: gauge means per hour (Secchi estimated from turbidity) and observed weather. */
    async series(slug: string, days: number, now = new Date()): Promise<LakeSeries> {
      const lake = await repo.lakeBySlug(slug)
      if (!lake) throw notFound('lake')
      const gauge = await repo.gauge(lake.id)
      const start = Math.floor((now.getTime() - days * DAY) / 3_600_000) * 3_600_000
      const { readings, weather } = await repo.hourly(gauge?.id ?? null, lake.id, new Date(start))
      const hours = Array.from(
        { length: Math.floor((now.getTime() - start) / 3_600_000) + 1 },
        (_, i) => start + i * 3_600_000,
      )
      const slot = new Map(hours.map((h, i) => [h, i]))
      const empty = () => hours.map((): number | null => null)
      const out = {
        waterC: empty(),
        secchiM: empty(),
        gaugeM: empty(),
        windMs: empty(),
        gustMs: empty(),
        precipitationMm: empty(),
      }
      for (const r of readings) {
        const i = slot.get(new Date(r.hour).getTime())
        if (i === undefined) continue
        if (r.parameter === 'water_temp') out.waterC[i] = Number(r.value)
        else if (r.parameter === 'turbidity') out.secchiM[i] = secchiFromTurbidity(Number(r.value))
        else out.gaugeM[i] = Number(r.value)
      }
      for (const w of weather) {
        const i = slot.get(w.at.getTime())
        if (i === undefined) continue
        out.windMs[i] = w.windMs
        out.gustMs[i] = w.gustMs
        out.precipitationMm[i] = w.precipitationMm
      }
      return { days, hours: hours.map((h) => new Date(h).toISOString()), ...out }
    },

    /** The Lake read at `now`, from stored readings and weather; nothing here calls the feed. */
    async compute(lake: LakeRow, now = new Date()): Promise<LakeRead> {
      const gauge = await repo.gauge(lake.id)
      const rows = gauge
        ? await repo.series(
            gauge.id,
            ['water_temp', 'turbidity', 'secchi', 'gauge_height'],
            new Date(now.getTime() - 30 * DAY),
          )
        : []
      const of = (p: string) =>
        rows.filter((r) => r.parameter === p).map((r) => ({ at: r.at, value: r.value }))
      const [temps, turbidity, secchi, level] = [
        of('water_temp'),
        of('turbidity'),
        of('secchi'),
        of('gauge_height'),
      ]

      const lastTemp = temps.at(-1)
      const waterTemp = lastTemp
        ? {
            at: iso(lastTemp.at),
            stale: false,
            valueC: lastTemp.value,
            trendCPerDay: trendPerDay(temps, now),
          }
        : null

      // A Secchi disk reading from the last week beats the turbidity estimate.
      const lastDisk = secchi.at(-1)
      const lastTurb = turbidity.at(-1)
      const diskFresh = lastDisk && now.getTime() - lastDisk.at.getTime() < 7 * DAY
      const clarityPoint = diskFresh
        ? lastDisk
        : lastTurb && { at: lastTurb.at, value: secchiFromTurbidity(lastTurb.value) }
      const estimates = turbidity.map((p) => ({
        at: iso(p.at),
        secchiM: secchiFromTurbidity(p.value),
      }))
      // Rain over the trend's 72 h and the day before it, to name the cause of a staining.
      const rain = (await repo.rainfall(lake.id, new Date(now.getTime() - 4 * DAY), now)).map(
        (r) => ({ at: iso(r.at), mm: r.mm }),
      )
      const trend = unlessTooFew(() => clarityTrend(estimates, iso(now), rain))
      const clarity = clarityPoint
        ? {
            at: iso(clarityPoint.at),
            stale: false,
            secchiM: clarityPoint.value,
            source: diskFresh ? ('secchi' as const) : ('turbidity' as const),
            class: clarityClass(clarityPoint.value),
            tsi: carlsonTsi(clarityPoint.value),
            trend,
          }
        : null

      const lastLevel = level.at(-1)
      const levelRead = lastLevel
        ? {
            at: iso(lastLevel.at),
            stale: false,
            gaugeM: lastLevel.value,
            vsMedian30dM:
              level.length >= 96 ? lastLevel.value - median(level.map((p) => p.value)) : null,
          }
        : null

      const observed = await repo.weather(
        lake.id,
        'observed',
        new Date(now.getTime() - 6 * 3_600_000),
        now,
      )
      const forecast = await repo.weather(
        lake.id,
        'forecast',
        now,
        new Date(now.getTime() + 12 * 3_600_000),
      )
      const hour = (w: (typeof observed)[number]): WindHour => ({
        at: iso(w.at),
        windMs: w.windMs,
        gustMs: w.gustMs,
        windFromDeg: w.windFromDeg,
      })
      const latest = observed.at(-1)
      const tendency = unlessTooFew(() =>
        pressureTendency(observed.map((w) => ({ at: iso(w.at), hPa: w.pressureHpa }))),
      )
      const pressure = latest && tendency ? { hPa: latest.pressureHpa, ...tendency } : null

      const phase = await currentPhase(lake, temps, now)

      const next12 = forecast.map(hour)
      // Safety looks at the worst hour from now to 12 h ahead: the wind, and the waves it raises.
      const ahead = [...(latest ? [latest] : []), ...forecast]
      const wave = ahead.length
        ? Math.max(...ahead.map((w) => openWaterWaveM(lake.shoreline, w.windFromDeg, w.windMs)))
        : null
      const list = cautions({
        ...worstOf(
          ahead.map((w) => ({ ...w, thunderstormProbabilityPct: w.thunderProbabilityPct })),
        ),
        waveHeightM: wave ?? undefined,
        waterC: lastTemp?.value,
      })
      const times = [lastTemp?.at, lastTurb?.at, lastLevel?.at].filter((d): d is Date => !!d)

      return withStaleFlags(
        {
          lake: {
            id: lake.id,
            slug: lake.slug,
            name: lake.name,
            region: lake.region,
            timeZone: lake.timeZone,
            normalPoolM: lake.normalPoolM,
            areaKm2: lake.areaKm2,
            center: [lake.centerLon, lake.centerLat],
          },
          asOf: iso(now),
          lastReadingAt: times.length
            ? iso(new Date(Math.max(...times.map((d) => d.getTime()))))
            : null,
          waterTemp,
          clarity,
          level: levelRead,
          windNow: latest ? hour(latest) : null,
          windNext12h: next12,
          airC: latest?.airC ?? null,
          pressure,
          sky: skyDay(lake.centerLat, lake.centerLon, localDate(now, lake.timeZone), lake.timeZone),
          phase,
          openWaterWaveM: wave,
          cautions: list,
          verdict: verdictOf(list),
        },
        now,
      )
    },
  }
}
export type LakeReadService = ReturnType<typeof lakeReadService>
