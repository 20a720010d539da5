import { DomainError } from '../errors'
import { lakeCenter } from '../geo/polygon'
import type { LakeGeometry } from '../geo/types'
import { HOUR_MS, localDayBounds, toInstant } from '../time'
import { clarityClass, type ClarityClass } from './clarity'
import { openWaterWaveM as openWaterWave } from './exposure'
import { cautions, type Caution } from './safety'
import { rankBanks, type Bank, type RankedBank, type WindowWeather } from './ranking'
import type { SeasonalPhase } from './season'
import { skyDay, type SkyDay } from './sky'
import { tackleCalls, type TackleCall } from './tackle'
import type { Cover, Sky } from './tackle-rules'

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

export interface WindowPlan {
  id: WindowId
  label: string
  start: string
  end: string
  /** Null when the forecast does not reach this window. */
  weather: WindowConditions | null
  /** Wave height where the wind has the longest run, for the open-water caution. */
  openWaterWaveM: number
  banks: RankedBank[]
  tackle: TackleCall[]
  cautions: Caution[]
}

export interface DayPlan {
  date: string
  phase: SeasonalPhase
  clarity: ClarityClass
  waterC: number
  sky: SkyDay
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

/**
 * The day's plan for one lake: three windows, each with its wind, the saved banks ranked, the
 * tackle calls for the best bank (or the lake's usual cover when none are saved), and cautions.
 */
export function dayPlan(input: {
  lake: LakeGeometry
  date: string
  timeZone: string
  banks: Bank[]
  hourly: ForecastHour[]
  waterC: number
  secchiM: number
  phase: SeasonalPhase
  /** Cover to call tackle for when the angler has no banks saved. */
  lakeCover?: Cover[]
}): DayPlan {
  const [lon, lat] = lakeCenter(input.lake)
  const sky = skyDay(lat, lon, input.date, input.timeZone)
  const clarity = clarityClass(input.secchiM)
  const conditions = { clarity, waterC: input.waterC, phase: input.phase }
  const hours = input.hourly.map((h) => ({ ...h, t: toInstant(h.at).getTime() }))
  if (hours.some((h) => !Number.isFinite(h.windMs) || h.windMs < 0)) {
    throw new DomainError(
      'invalid_series',
      'Every forecast hour needs a wind speed of 0 or more.',
      'hourly',
    )
  }

  const windows = windowBounds(sky, input.date, input.timeZone).map(
    ([id, start, end]): WindowPlan => {
      const inside = hours.filter((h) => h.t >= start.getTime() && h.t < end.getTime())
      const weather = summarise(inside, id !== 'midday')
      const base = {
        id,
        label: WINDOW_LABELS[id],
        start: start.toISOString(),
        end: end.toISOString(),
      }
      if (!weather)
        return { ...base, weather, openWaterWaveM: 0, banks: [], tackle: [], cautions: [] }
      const openWaterWaveM = openWaterWave(input.lake, weather.windFromDeg, weather.windMs)
      const banks = rankBanks({ lake: input.lake, banks: input.banks, window: weather, conditions })
      const best = input.banks.find((b) => b.id === banks[0]?.id)
      const tackle = tackleCalls({
        ...conditions,
        windMs: weather.windMs,
        sky: weather.sky,
        cover: best?.cover ?? input.lakeCover ?? ['open'],
        depthM: best?.depthM,
      })
      const windowCautions = cautions({
        windMs: weather.windMs,
        gustMs: weather.gustMs,
        waveHeightM: Math.max(openWaterWaveM, ...banks.map((b) => b.exposure.waveHeightM)),
        thunderstormProbabilityPct: weather.thunderstormProbabilityPct,
        waterC: input.waterC,
        airC: weather.airC,
        relativeHumidityPct: weather.relativeHumidityPct,
      })
      return { ...base, weather, openWaterWaveM, banks, tackle, cautions: windowCautions }
    },
  )
  return { date: input.date, phase: input.phase, clarity, waterC: input.waterC, sky, windows }
}
