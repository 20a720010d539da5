import { assertFinite, DomainError } from '../errors'
import { HOUR_MS, toInstant } from '../time'
import { theilSen } from './trend'

export const CLARITY_CLASSES = [
  'muddy',
  'stained',
  'lightly-stained',
  'clear',
  'very-clear',
] as const
export type ClarityClass = (typeof CLARITY_CLASSES)[number]

export const CLARITY_LABELS: Record<ClarityClass, string> = {
  muddy: 'muddy',
  stained: 'stained',
  'lightly-stained': 'lightly stained',
  clear: 'clear',
  'very-clear': 'very clear',
}

/**
 * Upper Secchi depth of each class, metres. Stained at 0.6 m (2 ft) or less and muddy below about
 * 0.3 m (1 ft) are common practice; 1.2 m (4 ft) and 3 m (10 ft) are our own breakpoints.
 */
export const CLARITY_BREAKS_M: Record<Exclude<ClarityClass, 'very-clear'>, number> = {
  muddy: 0.3,
  stained: 0.6,
  'lightly-stained': 1.2,
  clear: 3,
}

/** Carlson (1977), Limnol. Oceanogr. 22:361, TSI(SD) = 60 - 14.41 ln(SD), SD in metres. */
export function carlsonTsi(secchiM: number): number {
  assertFinite(secchiM, 'secchiM')
  if (secchiM <= 0) throw new DomainError('invalid_number', 'secchiM must be positive.', 'secchiM')
  return 60 - 14.41 * Math.log(secchiM)
}

/** Default: USGS Oregon WSC site regression, SD(ft) = 11.123 T^-0.637 (T in FNU), here in metres. */
export const USGS_SECCHI_CALIBRATION = { a: 11.123 * 0.3048, b: -0.637 }
/** Turbidity sensors do not resolve below about 0.1 FNU; lower readings are held there. */
const MIN_TURBIDITY_FNU = 0.1

/** Secchi depth estimate in metres: SD = a T^b, with a per-station calibration when an admin has set one. */
export function secchiFromTurbidity(
  turbidityFnu: number,
  calibration: { a: number; b: number } = USGS_SECCHI_CALIBRATION,
): number {
  assertFinite(turbidityFnu, 'turbidityFnu', { min: 0 })
  assertFinite(calibration.a, 'calibration.a', { min: Number.MIN_VALUE })
  assertFinite(calibration.b, 'calibration.b')
  return calibration.a * Math.max(turbidityFnu, MIN_TURBIDITY_FNU) ** calibration.b
}

export function clarityClass(secchiM: number): ClarityClass {
  assertFinite(secchiM, 'secchiM', { min: 0 })
  if (secchiM < CLARITY_BREAKS_M.muddy) return 'muddy'
  if (secchiM <= CLARITY_BREAKS_M.stained) return 'stained'
  if (secchiM <= CLARITY_BREAKS_M['lightly-stained']) return 'lightly-stained'
  if (secchiM <= CLARITY_BREAKS_M.clear) return 'clear'
  return 'very-clear'
}

export interface ClarityTrend {
  /** Change of ln(Secchi) per day: +0.1 is about 10 % clearer each day. */
  slopePerDay: number
  label: 'clearing' | 'steady' | 'staining'
  /** Days until the next class at this rate (clearer when clearing, dirtier when staining). */
  daysToNextClass: number | null
}

/** Below 5 % a day either way, clarity is called steady (our threshold). */
const STEADY_PER_DAY = 0.05
const WINDOW_MS = 72 * HOUR_MS

/** Trend of ln(Secchi) over the last 72 h by the Theil-Sen estimator, robust to outliers and gaps. */
export function clarityTrend(
  samples: { at: string; secchiM: number }[],
  now: string,
): ClarityTrend {
  const nowMs = toInstant(now, 'now').getTime()
  const points = samples
    .map((s, i) => {
      assertFinite(s.secchiM, `samples[${i}].secchiM`)
      return {
        t: (toInstant(s.at, `samples[${i}].at`).getTime() - nowMs) / 86_400_000,
        y: s.secchiM,
      }
    })
    .filter((p) => p.t <= 0 && p.t >= -WINDOW_MS / 86_400_000 && p.y > 0)
    .map((p) => ({ t: p.t, y: Math.log(p.y) }))
  if (points.length < 3) {
    throw new DomainError(
      'invalid_series',
      'A clarity trend needs at least 3 readings in the last 72 h.',
      'samples',
    )
  }
  const line = theilSen(points)
  if (!line)
    throw new DomainError('invalid_series', 'Clarity readings must span some time.', 'samples')
  const slope = line.slope
  const label =
    slope > STEADY_PER_DAY ? 'clearing' : slope < -STEADY_PER_DAY ? 'staining' : 'steady'
  // Time is measured from now, so the intercept is today's Secchi estimate.
  const nowSecchi = Math.exp(line.intercept)
  return { slopePerDay: slope, label, daysToNextClass: daysToNextClass(nowSecchi, slope, label) }
}

function daysToNextClass(
  secchiM: number,
  slope: number,
  label: ClarityTrend['label'],
): number | null {
  if (label === 'steady') return null
  const breaks = Object.values(CLARITY_BREAKS_M)
  const target =
    label === 'clearing'
      ? breaks.find((b) => b > secchiM)
      : [...breaks].reverse().find((b) => b < secchiM)
  if (target === undefined) return null
  return Math.log(target / secchiM) / slope
}
