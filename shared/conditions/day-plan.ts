import { DomainError } from '../errors'
import { lakeCenter } from '../geo/polygon'
import type { LakeGeometry } from '../geo/types'
import { HOUR_MS, localDayBounds, toInstant } from '../time'
import { clarityClass, type ClarityClass } from './clarity'
import { compassName, openWaterWaveM as openWaterWave, ROUGH_WAVE_M } from './exposure'
import { frontPassage } from './weather'
import {
  cautions,
  mergeCautions,
  verdictOf,
  worstOf,
  type Caution,
  type VerdictResult,
} from './safety'
import { rankBanks, type Bank, type RankedBank, type WindowWeather } from './ranking'
import type { SeasonalPhase } from './season'
import { skyDay, type SkyDay } from './sky'
import { tackleCalls, type TackleCall } from './tackle'
import { SURFACE_BREAKING_WIND_MS, type Cover, type Sky } from './tackle-rules'

export interface ForecastHour {
  at: string
  windFromDeg: number
  windMs: number
  gustMs: number
  airC: number
  relativeHumidityPct: number
  cloudCoverPct: number
  thunderstormProbabilityPct: number
  /** Sea-level pressure, for telling a front; absent in forecasts without it. */
  pressureHpa?: number
}

export type WindowId = 'dawn' | 'midday' | 'afternoon'

export const WINDOW_LABELS: Record<WindowId, string> = {
  dawn: 'Dawn to mid-morning',
  midday: 'Midday',
  afternoon: 'Afternoon to dusk',
}

/** The worst hour of a window, for safety: what its cautions and bank safety are judged on. */
export interface WindowPeak {
  /** Where the strongest wind comes from. */
  windFromDeg: number
  windMs: number
  gustMs: number
  thunderstormProbabilityPct: number
  heatIndexC: number
  /** Null where no hour is cold and windy enough for a wind chill. */
  windChillC: number | null
}

/** A window's typical weather (means, for fishing) and its worst hour (for safety). */
export interface WindowConditions extends WindowWeather {
  airC: number
  relativeHumidityPct: number
  /** The highest chance in the window. */
  thunderstormProbabilityPct: number
  peak: WindowPeak
  /** Why a cold front has just passed (pressure up after a fall, wind veered); null when none. */
  coldFront: string | null
}

/** One window of a lake's day, before any angler's banks are ranked in it. */
export interface WindowDay {
  id: WindowId
  label: string
  start: string
  end: string
  /** Null when the forecast does not reach this window. */
  weather: WindowConditions | null
  /** Wave height where the wind has the longest run, in the window's worst hour. */
  openWaterWaveM: number
}

/** A lake's day without banks: what the server computes once per lake and date and caches. */
export interface LakeDay {
  date: string
  phase: SeasonalPhase
  clarity: ClarityClass
  waterC: number
  sky: SkyDay
  windows: WindowDay[]
}

export interface WindowPlan extends WindowDay {
  /** Empty on a no-go window: no bank is offered as a place to fish. */
  banks: RankedBank[]
  /** Empty on a no-go window. */
  tackle: TackleCall[]
  cautions: Caution[]
  /** Null when the forecast does not reach the window. */
  verdict: VerdictResult | null
}

export interface DayPlan extends Omit<LakeDay, 'windows'> {
  windows: WindowPlan[]
  /** The day's cautions, one per hazard, each naming the windows it reaches. */
  cautions: Caution[]
  verdict: VerdictResult
}

/**
 * Plans cover today and the days the 7-day forecast reaches (and yesterday, kept a day): the
 * server refuses other dates, and the Day plan offers these when asked for one of them.
 */
export const PLAN_DAYS = 7

/** Our cloud-cover classes: under 30 % sun, under 70 % partly, else overcast. */
export function skyFromCloud(cloudCoverPct: number): Sky {
  return cloudCoverPct < 30 ? 'sun' : cloudCoverPct < 70 ? 'partly' : 'overcast'
}

function windowBounds(sky: SkyDay, date: string, timeZone: string): [WindowId, Date, Date][] {
  const [dayStart, dayEnd] = localDayBounds(date, timeZone)
  const at = (iso: string | null, fallbackHour: number) =>
    iso ? new Date(iso) : new Date(dayStart.getTime() + fallbackHour * HOUR_MS)
  const dawn = at(sky.civilDawn, 5)
  const sunrise = at(sky.sunrise, 6)
  const sunset = at(sky.sunset, 19)
  const dusk = at(sky.civilDusk, 20)
  const midMorning = new Date(sunrise.getTime() + 3 * HOUR_MS)
  const lateAfternoon = new Date(sunset.getTime() - 3 * HOUR_MS)
  const clamp = (d: Date) =>
    new Date(Math.min(Math.max(d.getTime(), dayStart.getTime()), dayEnd.getTime()))
  return [
    ['dawn', clamp(dawn), clamp(midMorning)],
    ['midday', clamp(midMorning), clamp(lateAfternoon)],
    ['afternoon', clamp(lateAfternoon), clamp(dusk)],
  ]
}

/** Vector mean of wind directions (from), so 350° and 10° average to north, not south. */
function meanDirection(hours: ForecastHour[]): number {
  let x = 0
  let y = 0
  for (const h of hours) {
    x += Math.sin((h.windFromDeg * Math.PI) / 180) * h.windMs
    y += Math.cos((h.windFromDeg * Math.PI) / 180) * h.windMs
  }
  return ((Math.atan2(x, y) * 180) / Math.PI + 360) % 360
}

function summarise(
  hours: TimedHour[],
  lowLight: boolean,
  before: TimedHour[],
): WindowConditions | null {
  if (!hours.length) return null
  const avg = (f: (h: ForecastHour) => number) => hours.reduce((s, h) => s + f(h), 0) / hours.length
  const worst = worstOf(hours)
  const strongest = hours.reduce((a, b) => (b.windMs > a.windMs ? b : a))
  const withPressure = before.filter((h) => h.pressureHpa !== undefined)
  const front =
    withPressure.length === before.length
      ? frontPassage(withPressure.map((h) => ({ ...h, hPa: h.pressureHpa! })))
      : null
  return {
    windFromDeg: meanDirection(hours),
    windMs: avg((h) => h.windMs),
    gustMs: worst.gustMs,
    sky: skyFromCloud(avg((h) => h.cloudCoverPct)),
    lowLight,
    airC: avg((h) => h.airC),
    thunderstormProbabilityPct: worst.thunderstormProbabilityPct,
    relativeHumidityPct: avg((h) => h.relativeHumidityPct),
    peak: {
      windFromDeg: strongest.windFromDeg,
      windMs: strongest.windMs,
      gustMs: worst.gustMs,
      thunderstormProbabilityPct: worst.thunderstormProbabilityPct,
      // Defined: a window has hours.
      heatIndexC: worst.heatIndexC!,
      windChillC: worst.windChillC ?? null,
    },
    coldFront: front?.coldFrontPassed ? front.reason : null,
  }
}

type TimedHour = ForecastHour & { t: number }
/** A front is read from the day before a window up to its start. */
const FRONT_LOOKBACK_MS = 24 * HOUR_MS

interface LakeDayInput {
  lake: LakeGeometry
  date: string
  timeZone: string
  hourly: ForecastHour[]
  waterC: number
  secchiM: number
  phase: SeasonalPhase
}

/** A lake's day: sky, and each window's wind, light and open-water waves. All the geometry is here. */
export function lakeDay(input: LakeDayInput): LakeDay {
  const [lon, lat] = lakeCenter(input.lake)
  const sky = skyDay(lat, lon, input.date, input.timeZone)
  const hours = input.hourly.map((h) => ({ ...h, t: toInstant(h.at).getTime() }))
  if (hours.some((h) => !Number.isFinite(h.windMs) || h.windMs < 0)) {
    throw new DomainError(
      'invalid_series',
      'Every forecast hour needs a wind speed of 0 or more.',
      'hourly',
    )
  }
  const windows = windowBounds(sky, input.date, input.timeZone).map(
    ([id, start, end]): WindowDay => {
      const inside = hours.filter((h) => h.t >= start.getTime() && h.t < end.getTime())
      const before = hours.filter(
        (h) => h.t >= start.getTime() - FRONT_LOOKBACK_MS && h.t <= start.getTime(),
      )
      return {
        id,
        label: WINDOW_LABELS[id],
        start: start.toISOString(),
        end: end.toISOString(),
        weather: summarise(inside, id !== 'midday', before),
        // The worst hour's waves: two hours of a blow raise them however calm the rest.
        openWaterWaveM: Math.max(
          0,
          ...inside.map((h) => openWaterWave(input.lake, h.windFromDeg, h.windMs)),
        ),
      }
    },
  )
  return {
    date: input.date,
    phase: input.phase,
    clarity: clarityClass(input.secchiM),
    waterC: input.waterC,
    sky,
    windows,
  }
}

/**
 * An angler's plan from a lake's day: in each window the saved banks ranked, the tackle calls for
 * the best bank (or the lake's usual cover when none are saved), cautions from the window's worst
 * hour and its verdict. A no-go window ranks no banks and calls no tackle. Banks carry their
 * stored exposure tables, so this is arithmetic only; `lake` is needed only for banks without one.
 */
export function planForBanks(
  day: LakeDay,
  banks: Bank[],
  opts: { lake?: LakeGeometry; lakeCover?: Cover[] } = {},
): DayPlan {
  const conditions = { clarity: day.clarity, waterC: day.waterC, phase: day.phase }
  const windows = day.windows.map((w): WindowPlan => {
    const { weather } = w
    if (!weather) return { ...w, banks: [], tackle: [], cautions: [], verdict: null }
    const ranked = rankBanks({ lake: opts.lake, banks, window: weather, conditions })
    const { peak } = weather
    const windowCautions = cautions({
      windMs: peak.windMs,
      gustMs: peak.gustMs,
      waveHeightM: Math.max(w.openWaterWaveM, ...ranked.map((b) => b.peakWaveHeightM)),
      thunderstormProbabilityPct: peak.thunderstormProbabilityPct,
      waterC: day.waterC,
      heatIndexC: peak.heatIndexC,
      windChillC: peak.windChillC ?? undefined,
    })
    const verdict = verdictOf(windowCautions)
    if (verdict.verdict === 'no-go')
      return { ...w, banks: [], tackle: [], cautions: windowCautions, verdict }
    const best = banks.find((b) => b.id === ranked[0]?.id)
    const tackle = tackleCalls({
      ...conditions,
      windMs: weather.windMs,
      sky: weather.sky,
      cover: best?.cover ?? opts.lakeCover ?? ['open'],
      depthM: best?.depthM,
      coldFrontPassed: weather.coldFront !== null,
    })
    return { ...w, banks: ranked, tackle, cautions: windowCautions, verdict }
  })
  const dayCautions = mergeCautions(windows.filter((w) => w.verdict))
  return { ...day, windows, cautions: dayCautions, verdict: verdictOf(dayCautions) }
}

/** The day's plan for one lake and a set of banks, in one call. */
export function dayPlan(
  input: LakeDayInput & {
    banks: Bank[]
    /** Cover to call tackle for when the angler has no banks saved. */
    lakeCover?: Cover[]
  },
): DayPlan {
  return planForBanks(lakeDay(input), input.banks, {
    lake: input.lake,
    lakeCover: input.lakeCover,
  })
}

/**
 * Where to start on a lake where the angler has saved no banks, from the window's wind (common
 * practice): the shore the wind blows onto when it breaks the surface, the lee when the open
 * water is rough, cover anywhere when it is calm. Null when the forecast does not reach the window
 * or it is a no-go.
 */
export function lakeWideSuggestion(window: WindowPlan): string | null {
  const { weather } = window
  if (!weather || window.verdict?.verdict === 'no-go') return null
  const from = compassName(weather.windFromDeg)
  if (window.openWaterWaveM >= ROUGH_WAVE_M)
    return `Rough open water: fish the ${from} shore, in the lee, and stay off the open lake.`
  if (weather.windMs < SURFACE_BREAKING_WIND_MS)
    return 'Little wind: work cover (wood, grass, docks) slowly anywhere on the lake.'
  return `Wind from ${from}: start on windblown points and banks of the ${compassName(weather.windFromDeg + 180)} shore, rock and sparse grass first.`
}
