import { assertFinite, DomainError } from '../errors'
import { HOUR_MS, toInstant } from '../time'
import { median, theilSen } from './trend'

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
  /** Change of ln(Secchi) per day over the last 72 h (Theil-Sen): +0.1 is about 10 % clearer each day. */
  slopePerDay: number
  label: 'clearing' | 'steady' | 'staining'
  /**
   * What the label rests on: `event`, water a quarter or more dirtier within 36 h (a rain event)
   * and the clearing after it; `day`, the recent level against a day before; `drift`, the 72 h slope.
   */
  basis: 'event' | 'day' | 'drift'
  /** The rate behind the label and the estimate, ln(Secchi) per day; 0 when steady. */
  ratePerDay: number
  /** The water now, metres: the recent robust level, or the fitted line at `now`. */
  secchiNowM: number
  /** Median of the readings 18 to 30 h before the latest, metres; null with fewer than 3 there. */
  secchiDayAgoM: number | null
  /** The dirtiest water of an event, from which clearing is measured; null without one. */
  peakAt: string | null
  /** Rain at the lake before the staining, from the observed weather; null when none was recorded. */
  rain: { mm: number; since: string; until: string } | null
  /** Days until the next class at this rate (clearer when clearing, dirtier when staining). */
  daysToNextClass: number | null
  /** When the water reaches `nextClass` at this rate; null when steady, past the last class or far off. */
  nextClassAt: string | null
  nextClass: ClarityClass | null
  /** The grounds of the label in words, without numbers: the client formats those in the angler's units. */
  reason: string
}

/** Below 5 % a day either way, clarity is called steady (our threshold). */
const STEADY_PER_DAY = 0.05
const WINDOW_MS = 72 * HOUR_MS
/** The robust level at a reading: the median of the 6 h up to it, when it holds at least 3 readings. */
const LEVEL_MS = 6 * HOUR_MS
const LEVEL_MIN_READINGS = 3
/**
 * 25 % within a day or so, five times the steady threshold, is a sustained change (our threshold);
 * the 6 h medians it compares move about 1 % with a gauge's noise. A rain's step is far more: from
 * 3 to 60 FNU, Secchi falls to a seventh (USGS Oregon WSC regression).
 */
const CHANGE = Math.log(1.25)
/** After an event the water reads clearing once it is 10 % clearer than at its dirtiest (our threshold). */
const RECOVERED = Math.log(1.1)
/** An event reads staining for 48 h at most; water that stays dirty longer is no longer staining. */
const STAINING_FOR_MS = 48 * HOUR_MS
/** The clear level before an event is looked for in the 36 h before its dirtiest water. */
const BEFORE_EVENT_MS = 36 * HOUR_MS
/** Rain from 12 h before the water was last clear up to its dirtiest counts towards an event. */
const RAIN_LEAD_MS = 12 * HOUR_MS
/** Less rain than 1 mm (about 0.04 in) is not named as a cause (our threshold). */
const MIN_RAIN_MM = 1
/** An estimate more than a month ahead is no estimate. */
const MAX_DAYS_AHEAD = 30

/** t in days from now (negative: past), y = ln(Secchi). */
type Point = { t: number; y: number }
const DAY = 86_400_000

/** The median of the readings between two times (days from now), or null with fewer than 3. */
function levelBetween(points: Point[], from: number, to: number): number | null {
  const ys = points.filter((p) => p.t >= from && p.t <= to).map((p) => p.y)
  return ys.length >= LEVEL_MIN_READINGS ? median(ys) : null
}

/** The next class boundary in the direction of travel, and the class just past it. */
function nextBoundary(
  secchiM: number,
  clearing: boolean,
): { boundaryM: number; next: ClarityClass } | null {
  // A boundary value itself belongs to the class below it (clarityClass), so look just past it.
  const past = (b: number) => clarityClass(b * (clearing ? 1 + 1e-9 : 1 - 1e-9))
  const breaks = Object.values(CLARITY_BREAKS_M).sort((a, b) => (clearing ? a - b : b - a))
  const now = clarityClass(secchiM)
  const boundaryM = breaks.find((b) => (clearing ? b >= secchiM : b <= secchiM) && past(b) !== now)
  return boundaryM === undefined ? null : { boundaryM, next: past(boundaryM) }
}

/** Rain summed over the observed hours between two instants (ms), or null under MIN_RAIN_MM. */
function rainBetween(
  rain: { at: string; mm: number }[],
  fromMs: number,
  toMs: number,
): ClarityTrend['rain'] {
  const wet = rain
    .map((r, i) => {
      assertFinite(r.mm, `rain[${i}].mm`, { min: 0 })
      return { ms: toInstant(r.at, `rain[${i}].at`).getTime(), mm: r.mm }
    })
    .filter((r) => r.mm > 0 && r.ms >= fromMs && r.ms <= toMs)
    .sort((a, b) => a.ms - b.ms)
  const mm = wet.reduce((sum, r) => sum + r.mm, 0)
  if (mm < MIN_RAIN_MM) return null
  return {
    mm,
    since: new Date(wet[0]!.ms).toISOString(),
    until: new Date(wet.at(-1)!.ms).toISOString(),
  }
}

/**
 * Clarity trend from Secchi estimates over the last 72 h. A rain event stains the water within
 * hours, so the label first looks for an event: the robust level (median of 6 h of readings, which
 * a lone spike cannot move) falling a quarter or more below its level in the 36 h before. Such
 * water reads staining until it is clearly clearer than at its dirtiest, then clearing at the rate
 * measured since (Theil-Sen). Without an event, the recent level against the level a day before
 * decides; without that, the 72 h Theil-Sen slope (Sen 1968) does, for slow drift. `rain` is the
 * lake's observed hourly precipitation, used to name the cause of staining.
 */
export function clarityTrend(
  samples: { at: string; secchiM: number }[],
  now: string,
  rain: { at: string; mm: number }[] = [],
): ClarityTrend {
  const nowMs = toInstant(now, 'now').getTime()
  const points: Point[] = samples
    .map((s, i) => {
      assertFinite(s.secchiM, `samples[${i}].secchiM`)
      return { t: (toInstant(s.at, `samples[${i}].at`).getTime() - nowMs) / DAY, y: s.secchiM }
    })
    .filter((p) => p.t <= 0 && p.t >= -WINDOW_MS / DAY && p.y > 0)
    .map((p) => ({ t: p.t, y: Math.log(p.y) }))
    .sort((a, b) => a.t - b.t)
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

  const msAt = (t: number) => nowMs + t * DAY
  const latest = points.at(-1)!.t
  // The robust level at each reading that has enough readings in the 6 h up to it.
  const levels = points.flatMap((p) => {
    const y = levelBetween(points, p.t - LEVEL_MS / DAY, p.t)
    return y === null ? [] : [{ t: p.t, y }]
  })
  const recent = levelBetween(points, latest - LEVEL_MS / DAY, latest)
  const dayAgo = levelBetween(points, latest - 30 / 24, latest - 18 / 24)

  const result = (
    label: ClarityTrend['label'],
    basis: ClarityTrend['basis'],
    rate: number,
    nowLn: number,
    extra: Partial<Pick<ClarityTrend, 'peakAt' | 'rain'>> & { reason: string; estimate?: false },
  ): ClarityTrend => {
    const secchiNowM = Math.exp(nowLn)
    const target =
      label === 'steady' || extra.estimate === false
        ? null
        : nextBoundary(secchiNowM, label === 'clearing')
    const days = target ? Math.log(target.boundaryM / secchiNowM) / rate : null
    const ahead = days !== null && days >= 0 && days <= MAX_DAYS_AHEAD ? days : null
    return {
      slopePerDay: line.slope,
      label,
      basis,
      ratePerDay: label === 'steady' ? 0 : rate,
      secchiNowM,
      secchiDayAgoM: dayAgo === null ? null : Math.exp(dayAgo),
      peakAt: extra.peakAt ?? null,
      rain: extra.rain ?? null,
      daysToNextClass: ahead,
      nextClassAt: ahead === null ? null : new Date(nowMs + ahead * DAY).toISOString(),
      nextClass: ahead === null ? null : target!.next,
      reason: extra.reason,
    }
  }

  // An event: the dirtiest robust level of the window, well below the clearest in the 36 h before it.
  const peak = levels.reduce<Point | null>((low, l) => (!low || l.y < low.y ? l : low), null)
  const before = peak
    ? levels
        .filter((l) => l.t < peak.t && l.t >= peak.t - BEFORE_EVENT_MS / DAY)
        .reduce<Point | null>((high, l) => (!high || l.y >= high.y ? l : high), null)
    : null
  if (peak && before && recent !== null && before.y - peak.y >= CHANGE) {
    const eventRain = rainBetween(rain, msAt(before.t) - RAIN_LEAD_MS, msAt(peak.t))
    const peakAt = new Date(msAt(peak.t)).toISOString()
    const since = points.filter((p) => p.t >= peak.t)
    const sinceLine = since.length >= 3 && latest - peak.t >= 3 / 24 ? theilSen(since) : null
    if (sinceLine && recent - peak.y >= RECOVERED && sinceLine.slope > STEADY_PER_DAY) {
      return result('clearing', 'event', sinceLine.slope, sinceLine.intercept, {
        peakAt,
        rain: eventRain,
        reason: `clearing since the water was dirtiest${eventRain ? ' after rain' : ''}`,
      })
    }
    if (nowMs - msAt(peak.t) <= STAINING_FOR_MS) {
      // How fast it stained; whether more staining follows depends on rain yet to come.
      const eventRate = (peak.y - before.y) / Math.max(peak.t - before.t, 1 / 24)
      return result('staining', 'event', eventRate, recent, {
        peakAt,
        rain: eventRain,
        estimate: false,
        reason: eventRain
          ? 'stained by rain within the last two days'
          : 'dirtier within the last two days; no rain recorded at the lake',
      })
    }
  }

  // A sustained change over a day: the recent level against the level a day before.
  if (recent !== null && dayAgo !== null && Math.abs(recent - dayAgo) >= CHANGE) {
    const lastDay = points.filter((p) => p.t >= latest - 1)
    const dayLine = theilSen(lastDay) ?? line
    const label = recent > dayAgo ? 'clearing' : 'staining'
    const dayRain = label === 'staining' ? rainBetween(rain, nowMs - 2 * DAY, nowMs) : null
    return result(label, 'day', dayLine.slope, dayLine.intercept, {
      rain: dayRain,
      reason: `${label === 'clearing' ? 'clearer' : 'dirtier'} than a day before${dayRain ? ', after rain' : ''}`,
    })
  }

  const slope = line.slope
  const label =
    slope > STEADY_PER_DAY ? 'clearing' : slope < -STEADY_PER_DAY ? 'staining' : 'steady'
  // Time is measured from now, so the intercept is today's Secchi estimate.
  return result(label, 'drift', slope, line.intercept, {
    rain: label === 'staining' ? rainBetween(rain, nowMs - WINDOW_MS, nowMs) : null,
    reason:
      label === 'steady'
        ? 'no change beyond the readings’ scatter over 72 h'
        : `a slow ${label === 'clearing' ? 'clearing' : 'staining'} over 72 h`,
  })
}
