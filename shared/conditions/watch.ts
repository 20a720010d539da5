import type { WatchConditions } from '../schemas/watch'
import { MS_PER_KMH, MS_PER_KNOT, MS_PER_MPH } from '../units'
import type { ClarityClass } from './clarity'
import type { WindowConditions, WindowId } from './day-plan'
import { bankExposure, type ExposureClass, type ExposureTable } from './exposure'
import type { Caution, Verdict } from './safety'
import type { SeasonalPhase } from './season'

const MS_PER = { mph: MS_PER_MPH, kmh: MS_PER_KMH, knots: MS_PER_KNOT } as const

/** A watch's conditions made ready to judge thousands of windows: speeds in m/s, lists as sets. */
export interface CompiledWatch {
  wind: { onto: boolean; minMs: number; maxMs: number } | null
  clarity: ReadonlySet<ClarityClass> | null
  phases: ReadonlySet<SeasonalPhase> | null
  windows: ReadonlySet<WindowId> | null
  notNoGo: boolean
}

/** Half a unit either side: "8 to 20 mph" holds 7.6 and 20.4 mph, as the angler reads them rounded. */
export function compileWatch(c: WatchConditions): CompiledWatch {
  const set = <T>(list: readonly T[]) => (list.length ? new Set(list) : null)
  const k = c.wind ? MS_PER[c.wind.unit] : 0
  return {
    wind: c.wind
      ? {
          onto: c.wind.onto,
          minMs: Math.max(0, c.wind.min - 0.5) * k,
          maxMs: (c.wind.max + 0.5) * k,
        }
      : null,
    clarity: set(c.clarity),
    phases: set(c.phases),
    windows: set(c.windows),
    notNoGo: c.notNoGo,
  }
}

/** One forecast window of a lake's stored day, with the verdict its worst hour earned. */
export interface WatchedWindow {
  date: string
  id: WindowId
  clarity: ClarityClass
  phase: SeasonalPhase
  /** Null when the forecast does not reach the window. */
  weather: WindowConditions | null
  verdict: Verdict | null
}

/** Why a window matched, in SI: what the alert tells the angler. */
export interface WatchMatch {
  windMs: number
  windFromDeg: number
  /** The bank's exposure to the window's typical wind; null on a lake-wide watch. */
  exposure: ExposureClass | null
  clarity: ClarityClass
  phase: SeasonalPhase
  verdict: Verdict
}

/**
 * Whether a window meets a watch. The wind is the window's typical wind (its means, what the
 * fishing is judged on); the verdict is from its worst hour. Wind onto the bank means the bank's
 * stored table reads it windward or rough (it blows within 70° of straight onto the bank over
 * open water). Null when any condition fails or the forecast does not reach the window.
 */
export function judgeWindow(
  watch: CompiledWatch,
  window: WatchedWindow,
  bank: ExposureTable | null,
): WatchMatch | null {
  const { weather, verdict } = window
  if (!weather || !verdict || !meetsLakeConditions(watch, window)) return null
  let exposure: ExposureClass | null = null
  if (bank) {
    exposure = bankExposure(bank, weather.windFromDeg, weather.windMs).exposure
    if (watch.wind?.onto && exposure !== 'windward' && exposure !== 'rough') return null
  } else if (watch.wind?.onto) return null
  return {
    windMs: weather.windMs,
    windFromDeg: weather.windFromDeg,
    exposure,
    clarity: window.clarity,
    phase: window.phase,
    verdict,
  }
}

/**
 * The conditions that do not depend on a bank: forecast reached, verdict, window, clarity, phase
 * and wind speed. A matcher asks this first and reads a bank's table only where it holds.
 */
export function meetsLakeConditions(watch: CompiledWatch, window: WatchedWindow): boolean {
  const { weather, verdict } = window
  if (!weather || !verdict) return false
  if (watch.notNoGo && verdict === 'no-go') return false
  if (watch.windows && !watch.windows.has(window.id)) return false
  if (watch.clarity && !watch.clarity.has(window.clarity)) return false
  if (watch.phases && !watch.phases.has(window.phase)) return false
  if (watch.wind && (weather.windMs < watch.wind.minMs || weather.windMs > watch.wind.maxMs))
    return false
  return true
}

/** Why a guide should hear about a trip day: its verdict is no-go or a caution is a danger. */
export interface TripAlarm {
  verdict: Verdict
  /** The dangers' headlines, most serious first. */
  dangers: string[]
}

/** A trip day's alarm from its day verdict and cautions; null while neither calls for one. */
export function tripAlarm(day: { verdict: Verdict; cautions: Caution[] }): TripAlarm | null {
  const dangers = day.cautions.filter((c) => c.level === 'danger').map((c) => c.headline)
  if (day.verdict !== 'no-go' && !dangers.length) return null
  return { verdict: day.verdict, dangers }
}
