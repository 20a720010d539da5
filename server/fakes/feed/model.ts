import { secchiFromTurbidity } from '../../../shared/conditions/clarity'
import { oxygenSaturationMgL } from '../../../shared/readings'
import type { ScriptedDays } from './scenarios'

/**
 * The synthetic lake world behind the fake feed: physical in shape, deterministic for a seed, and
 * computable at any instant without replaying history, so a year of backfill costs no more than a day.
 */
export interface FeedLake {
  slug: string
  lat: number
  lon: number
  /** Gauge height at normal pool, feet on the gauge datum. */
  normalGaugeFt: number
  baseTurbidityFnu: number
}

const HOUR = 3_600_000
const DAY = 24 * HOUR
const EPOCH = Date.UTC(2025, 0, 1)
const SPAN_DAYS = 3 * 365

/** 32-bit integer mix (the "lowbias32" hash by Chris Wellons). */
function mix(x: number): number {
  x ^= x >>> 16
  x = Math.imul(x, 0x7feb352d)
  x ^= x >>> 15
  x = Math.imul(x, 0x846ca68b)
  x ^= x >>> 16
  return x >>> 0
}

/** A repeatable number in [0, 1) for a tuple of integers. */
export function rand(...parts: number[]): number {
  let h = 0x9e3779b9
  for (const p of parts) h = mix(h ^ (p | 0))
  return h / 2 ** 32
}

/** Centred noise in [-1, 1). */
const noise = (...parts: number[]) => 2 * rand(...parts) - 1

function eventTimes(
  seed: number,
  lake: number,
  stream: number,
  minDays: number,
  maxDays: number,
): number[] {
  const times: number[] = []
  let t = EPOCH + rand(seed, lake, stream, -1) * maxDays * DAY
  for (let k = 0; t < EPOCH + SPAN_DAYS * DAY; k++) {
    times.push(t)
    t += (minDays + rand(seed, lake, stream, k) * (maxDays - minDays)) * DAY
  }
  return times
}

/** Index of the last event at or before t (-1 if none), by binary search. */
function lastAtOrBefore(times: number[], t: number): number {
  let lo = 0
  let hi = times.length - 1
  let found = -1
  while (lo <= hi) {
    const mid = (lo + hi) >> 1
    if (times[mid]! <= t) {
      found = mid
      lo = mid + 1
    } else hi = mid - 1
  }
  return found
}

export interface WeatherSample {
  windMs: number
  gustMs: number
  windFromDeg: number
  airC: number
  relativeHumidityPct: number
  pressureHpa: number
  precipitationMm: number
  cloudCoverPct: number
  precipitationProbabilityPct: number
  thunderProbabilityPct: number
}

export class LakeWorld {
  /** Cold fronts every 3 to 7 days. */
  private readonly fronts: number[]
  /** Rain events every 4 to 12 days, with a size from 0.2 to 1. */
  private readonly rains: { at: number; size: number }[]
  private readonly rainTimes: number[]
  /** A named scenario played on this lake: its tracks replace the world where they reach. */
  script: ScriptedDays | null = null

  constructor(
    readonly lake: FeedLake,
    private readonly seed: number,
    private readonly index: number,
  ) {
    this.fronts = eventTimes(seed, index, 1, 3, 7)
    this.rains = eventTimes(seed, index, 2, 4, 12).map((at, k) => ({
      at,
      size: 0.2 + 0.8 * rand(seed, index, 3, k),
    }))
    this.rainTimes = this.rains.map((r) => r.at)
  }

  private solarHour(t: number): number {
    return (((t / HOUR + this.lake.lon / 15) % 24) + 24) % 24
  }

  private dayOfYear(t: number): number {
    const d = new Date(t)
    return (t - Date.UTC(d.getUTCFullYear(), 0, 1)) / DAY
  }

  /** Strength of the latest front's after-effect (0 to 1), peaking 12 h after it passes. */
  private frontAfter(t: number): number {
    let s = 0
    // Only fronts of the last five days still matter; walk back from the latest.
    for (let k = lastAtOrBefore(this.fronts, t); k >= 0; k--) {
      const age = (t - this.fronts[k]!) / HOUR
      if (age >= 120) break
      s = Math.max(s, Math.min(1, age / 12) * Math.exp(-Math.max(0, age - 12) / 48))
    }
    return s
  }

  /** How close the next front is (0 to 1) over the day before it. */
  private frontAhead(t: number): number {
    const next = this.fronts[lastAtOrBefore(this.fronts, t) + 1]
    if (next === undefined) return 0
    const hours = (next - t) / HOUR
    return hours < 24 ? 1 - hours / 24 : 0
  }

  private rainLoad(t: number, rampH: number, decayDays: number): number {
    let load = 0
    // Events older than eight decay times add nothing measurable.
    for (let k = lastAtOrBefore(this.rainTimes, t); k >= 0; k--) {
      const r = this.rains[k]!
      const age = (t - r.at) / HOUR
      if (age >= decayDays * 24 * 8) break
      load += r.size * Math.min(1, age / rampH) * Math.exp(-age / (decayDays * 24))
    }
    return load
  }

  /** Rain falls for six hours from the start of each event. */
  private raining(t: number): number {
    const r = this.rains[lastAtOrBefore(this.rainTimes, t)]
    return r && t - r.at < 6 * HOUR ? r.size : 0
  }

  private seasonalAirC(t: number): number {
    const lat = Math.abs(this.lake.lat)
    const mean = 22 - 0.5 * (lat - 30)
    const amp = 9 + 0.2 * (lat - 30)
    // Coldest in mid January in the north; mirrored south of the equator.
    const phase = this.lake.lat >= 0 ? 15 : 197
    return mean - amp * Math.cos((2 * Math.PI * (this.dayOfYear(t) - phase)) / 365)
  }

  airC(t: number): number {
    const daily = 5 * Math.cos((2 * Math.PI * (this.solarHour(t) - 15)) / 24)
    const front = -7 * this.frontAfter(t) + 2 * this.frontAhead(t)
    return (
      this.seasonalAirC(t) +
      daily +
      front +
      0.3 * noise(this.seed, this.index, 10, Math.floor(t / HOUR))
    )
  }

  /** Surface water lags the air by about a month, swings less by day, and cools after fronts. */
  waterC(t: number): number {
    const scripted = this.script?.waterAt('tempC', t)
    const lagged = scripted ?? this.seasonalAirC(t - 30 * DAY) + 1
    const daily = 0.4 * Math.cos((2 * Math.PI * (this.solarHour(t) - 16)) / 24)
    const value =
      lagged +
      daily -
      (scripted === undefined ? 1.2 * this.frontAfter(t) : 0) +
      0.05 * noise(this.seed, this.index, 11, Math.floor(t / 900_000))
    return Math.max(0.5, value)
  }

  gaugeFt(t: number): number {
    return (
      this.lake.normalGaugeFt +
      (this.script?.waterAt('levelFt', t) ?? 1.4 * this.rainLoad(t, 12, 6)) +
      0.01 * noise(this.seed, this.index, 12, Math.floor(t / 900_000))
    )
  }

  turbidityFnu(t: number): number {
    const value =
      this.script?.waterAt('turbidityFnu', t) ??
      this.lake.baseTurbidityFnu + 60 * this.rainLoad(t, 6, 2.5)
    return value * (1 + 0.03 * noise(this.seed, this.index, 13, Math.floor(t / 900_000)))
  }

  /** Near saturation, a little over by afternoon photosynthesis and under by dawn. */
  oxygenMgL(t: number): number {
    const daily = 1 + 0.06 * Math.cos((2 * Math.PI * (this.solarHour(t) - 16)) / 24)
    return (
      oxygenSaturationMgL(this.waterC(t)) *
      daily *
      (1 + 0.01 * noise(this.seed, this.index, 15, Math.floor(t / 900_000)))
    )
  }

  secchiM(t: number): number {
    return (
      secchiFromTurbidity(this.turbidityFnu(t)) *
      (1 + 0.05 * noise(this.seed, this.index, 14, Math.floor(t / DAY)))
    )
  }

  /** Whether the weather at t comes from a scenario (a forecast of it then does not drift). */
  scriptsWeather(t: number): boolean {
    return this.script?.scriptsWeather(t) ?? false
  }

  weather(t: number): WeatherSample {
    const scripted = this.script?.weatherAt(t)
    if (scripted) return scripted
    const hour = Math.floor(t / HOUR)
    const after = this.frontAfter(t)
    const ahead = this.frontAhead(t)
    const rain = this.raining(t)
    const windMs = Math.max(
      0,
      3.5 +
        1.5 * Math.sin((2 * Math.PI * (this.solarHour(t) - 9)) / 24) +
        5 * after +
        0.8 * noise(this.seed, this.index, 20, hour),
    )
    // Prevailing south-south-west, veering to the north-west behind a front.
    const windFromDeg =
      (((200 + 115 * after + 15 * noise(this.seed, this.index, 21, hour)) % 360) + 360) % 360
    const cloud = Math.min(
      100,
      35 + 55 * Math.max(ahead, rain > 0 ? 1 : 0) + 10 * noise(this.seed, this.index, 22, hour),
    )
    const warm = this.airC(t) > 18
    return {
      windMs,
      gustMs: windMs * (1.35 + 0.2 * rand(this.seed, this.index, 23, hour)) + 0.5,
      windFromDeg,
      airC: this.airC(t),
      relativeHumidityPct: Math.min(
        100,
        rain > 0
          ? 95
          : 65 -
              15 * Math.cos((2 * Math.PI * (this.solarHour(t) - 15)) / 24) +
              5 * noise(this.seed, this.index, 24, hour),
      ),
      // Pressure dips ahead of a front and rises behind it.
      pressureHpa: 1015 + 3 * Math.sin((2 * Math.PI * t) / (9 * DAY)) - 8 * ahead + 6 * after,
      precipitationMm: rain * 6,
      cloudCoverPct: Math.max(0, cloud),
      precipitationProbabilityPct: Math.min(100, Math.round(100 * Math.max(rain, ahead * 0.7))),
      thunderProbabilityPct: warm ? Math.round(60 * Math.max(rain, ahead * 0.6)) : 0,
    }
  }
}
