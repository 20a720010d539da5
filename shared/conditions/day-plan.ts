import { DomainError } from '../errors'
import { lakeCenter } from '../geo/polygon'
import type { LakeGeometry } from '../geo/types'
import { HOUR_MS, localDayBounds, toInstant } from '../time'
import { clarityClass, type ClarityClass } from './clarity'
import { compassName, openWaterWaveM as openWaterWave, ROUGH_WAVE_M } from './exposure'
import { cautions, type Caution } from './safety'
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
}

export type WindowId = 'dawn' | 'midday' | 'afternoon'

export const WINDOW_LABELS: Record<WindowId, string> = {
  dawn: 'Dawn to mid-morning',
  midday: 'Midday',
  afternoon: 'Afternoon to dusk',
}

export interface WindowConditions extends WindowWeather {
  airC: number
  relativeHumidityPct: number
  thunderstormProbabilityPct: number
}

/** One window of a lake's day, before any angler's banks are ranked in it. */
export interface WindowDay {
  id: WindowId
  label: string
  start: string
  end: string
  /** Null when the forecast does not reach this window. */
  weather: WindowConditions | null
  /** Wave height where the wind has the longest run, for the open-water caution. */
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
  banks: RankedBank[]
  tackle: TackleCall[]
  cautions: Caution[]
}

export interface DayPlan extends Omit<LakeDay, 'windows'> {
  windows: WindowPlan[]
}

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

function summarise(hours: ForecastHour[], lowLight: boolean): WindowConditions | null {
  if (!hours.length) return null
  const avg = (f: (h: ForecastHour) => number) => hours.reduce((s, h) => s + f(h), 0) / hours.length
  return {
    windFromDeg: meanDirection(hours),
    windMs: avg((h) => h.windMs),
    gustMs: Math.max(...hours.map((h) => h.gustMs)),
    sky: skyFromCloud(avg((h) => h.cloudCoverPct)),
    lowLight,
    airC: avg((h) => h.airC),
    thunderstormProbabilityPct: Math.max(...hours.map((h) => h.thunderstormProbabilityPct)),
    relativeHumidityPct: avg((h) => h.relativeHumidityPct),
  }
}

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
      const weather = summarise(inside, id !== 'midday')
      return {
        id,
        label: WINDOW_LABELS[id],
        start: start.toISOString(),
        end: end.toISOString(),
        weather,
        openWaterWaveM: weather
          ? openWaterWave(input.lake, weather.windFromDeg, weather.windMs)
          : 0,
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
 * the best bank (or the lake's usual cover when none are saved), and cautions. Banks carry their
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
    if (!weather) return { ...w, banks: [], tackle: [], cautions: [] }
    const ranked = rankBanks({ lake: opts.lake, banks, window: weather, conditions })
    const best = banks.find((b) => b.id === ranked[0]?.id)
    const tackle = tackleCalls({
      ...conditions,
      windMs: weather.windMs,
      sky: weather.sky,
      cover: best?.cover ?? opts.lakeCover ?? ['open'],
      depthM: best?.depthM,
    })
    const windowCautions = cautions({
      windMs: weather.windMs,
      gustMs: weather.gustMs,
      waveHeightM: Math.max(w.openWaterWaveM, ...ranked.map((b) => b.exposure.waveHeightM)),
      thunderstormProbabilityPct: weather.thunderstormProbabilityPct,
      waterC: day.waterC,
      airC: weather.airC,
      relativeHumidityPct: weather.relativeHumidityPct,
    })
    return { ...w, banks: ranked, tackle, cautions: windowCautions }
  })
  return { ...day, windows }
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
 * water is rough, cover anywhere when it is calm. Null when the forecast does not reach the window.
 */
export function lakeWideSuggestion(window: WindowDay): string | null {
  const { weather } = window
  if (!weather) return null
  const from = compassName(weather.windFromDeg)
  if (window.openWaterWaveM >= ROUGH_WAVE_M)
    return `Rough open water: fish the ${from} shore, in the lee, and stay off the open lake.`
  if (weather.windMs < SURFACE_BREAKING_WIND_MS)
    return 'Little wind: work cover (wood, grass, docks) slowly anywhere on the lake.'
  return `Wind from ${from}: start on windblown points and banks of the ${compassName(weather.windFromDeg + 180)} shore, rock and sparse grass first.`
}
