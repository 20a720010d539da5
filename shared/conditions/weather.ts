import { assertFinite, DomainError } from '../errors'
import { HOUR_MS, toInstant } from '../time'
import { cToF, fToC, msToKnots, msToMph } from '../units'

/** NWS wind chill (2001), in °F and mph; defined only for T <= 50 °F and V > 3 mph. */
export function windChillC(airC: number, windMs: number): number | null {
  assertFinite(airC, 'airC')
  assertFinite(windMs, 'windMs', { min: 0 })
  const t = cToF(airC)
  const v = msToMph(windMs)
  // The tolerance keeps an exact 3 mph, after unit conversion, outside the range.
  if (t > 50 || v <= 3 + 1e-9) return null
  const v16 = v ** 0.16
  return fToC(35.74 + 0.6215 * t - 35.75 * v16 + 0.4275 * t * v16)
}

/**
 * NWS heat index (WPC): Steadman's simple formula below 80 °F, else the Rothfusz (1990) regression
 * with the low- and high-humidity adjustments.
 */
export function heatIndexC(airC: number, relativeHumidityPct: number): number {
  assertFinite(airC, 'airC')
  assertFinite(relativeHumidityPct, 'relativeHumidityPct', { min: 0, max: 100 })
  const t = cToF(airC)
  const rh = relativeHumidityPct
  const simple = 0.5 * (t + 61 + (t - 68) * 1.2 + rh * 0.094)
  if ((simple + t) / 2 < 80) return fToC(simple)
  let hi =
    -42.379 +
    2.04901523 * t +
    10.14333127 * rh -
    0.22475541 * t * rh -
    0.00683783 * t * t -
    0.05481717 * rh * rh +
    0.00122874 * t * t * rh +
    0.00085282 * t * rh * rh -
    0.00000199 * t * t * rh * rh
  if (rh < 13 && t >= 80 && t <= 112)
    hi -= ((13 - rh) / 4) * Math.sqrt((17 - Math.abs(t - 95)) / 17)
  else if (rh > 85 && t >= 80 && t <= 87) hi += ((rh - 85) / 10) * ((87 - t) / 5)
  return fToC(hi)
}

/** WMO Beaufort scale: upper bound of each force in whole knots. */
const BEAUFORT_MAX_KNOTS = [0, 3, 6, 10, 16, 21, 27, 33, 40, 47, 55, 63]

export function beaufortForce(windMs: number): number {
  assertFinite(windMs, 'windMs', { min: 0 })
  const knots = Math.round(msToKnots(windMs))
  const force = BEAUFORT_MAX_KNOTS.findIndex((max) => knots <= max)
  return force === -1 ? 12 : force
}

export type PressureTendencyLabel =
  'steady' | `${'rising' | 'falling'}${'' | ' slowly' | ' quickly' | ' very rapidly'}`

export interface PressureTendency {
  changeHpa3h: number
  label: PressureTendencyLabel
}

/**
 * Change over the last three hours, with the tendency terms of UK Met Office shipping forecasts
 * (from memory): steady < 0.1 hPa, slowly 0.1-1.5, plain 1.6-3.5, quickly 3.6-6.0, very rapidly > 6.
 */
export function pressureTendency(samples: { at: string; hPa: number }[]): PressureTendency {
  if (samples.length < 2) {
    throw new DomainError(
      'invalid_series',
      'A pressure tendency needs at least two readings.',
      'samples',
    )
  }
  const points = samples
    .map((s, i) => {
      assertFinite(s.hPa, `samples[${i}].hPa`, { min: 800, max: 1100 })
      return { t: toInstant(s.at, `samples[${i}].at`).getTime(), hPa: s.hPa }
    })
    .sort((a, b) => a.t - b.t)
  const last = points[points.length - 1]!
  const target = last.t - 3 * HOUR_MS
  const earlier = points.reduce((best, p) =>
    Math.abs(p.t - target) < Math.abs(best.t - target) ? p : best,
  )
  // Readings closer than two hours apart, or over four, do not make a three-hour tendency.
  const span = last.t - earlier.t
  if (span < 2 * HOUR_MS || span > 4 * HOUR_MS) {
    throw new DomainError(
      'invalid_series',
      'Pressure readings must include one from about 3 h before the last.',
      'samples',
    )
  }
  const change = ((last.hPa - earlier.hPa) * 3 * HOUR_MS) / span
  const size = Math.abs(change)
  if (size < 0.1) return { changeHpa3h: change, label: 'steady' }
  const direction = change > 0 ? 'rising' : 'falling'
  const rate = size <= 1.5 ? ' slowly' : size <= 3.5 ? '' : size <= 6 ? ' quickly' : ' very rapidly'
  return { changeHpa3h: change, label: `${direction}${rate}` }
}

export interface FrontSignal {
  /** A cold front has passed: pressure rising after a fall, wind veered into the north-west quarter. */
  coldFrontPassed: boolean
  reason: string
}

/**
 * Cold-front passage as commonly read from surface observations (common practice): pressure
 * bottoms out and rises, and the wind veers to between west and north.
 */
export function frontPassage(
  hours: { at: string; hPa: number; windFromDeg: number }[],
): FrontSignal {
  if (hours.length < 6)
    return { coldFrontPassed: false, reason: 'Too few hourly readings to judge a front.' }
  const sorted = [...hours].sort((a, b) => toInstant(a.at).getTime() - toInstant(b.at).getTime())
  const lowest = sorted.reduce((lo, h) => (h.hPa < lo.hPa ? h : lo))
  const last = sorted[sorted.length - 1]!
  const first = sorted[0]!
  const rise = last.hPa - lowest.hPa
  const fall = first.hPa - lowest.hPa
  const northWest = last.windFromDeg >= 260 && last.windFromDeg <= 360
  const passed = rise >= 1.5 && fall >= 1 && northWest && lowest !== last
  return {
    coldFrontPassed: passed,
    reason: passed
      ? `Pressure fell ${fall.toFixed(1)} hPa, then rose ${rise.toFixed(1)} hPa, with the wind now from ${Math.round(last.windFromDeg)}°.`
      : 'No cold-front signature in the last hours.',
  }
}
