import { assertFinite, DomainError } from '../errors'
import { addDays, assertDate, DAY_MS } from '../time'

export const SEASONAL_PHASES = [
  'winter',
  'early-pre-spawn',
  'pre-spawn',
  'spawn',
  'post-spawn',
  'summer',
  'fall',
] as const
export type SeasonalPhase = (typeof SEASONAL_PHASES)[number]

/** The phases in words, as anglers write them. */
export const PHASE_LABELS: Record<SeasonalPhase, string> = {
  winter: 'winter',
  'early-pre-spawn': 'early pre-spawn',
  'pre-spawn': 'pre-spawn',
  spawn: 'spawn',
  'post-spawn': 'post-spawn',
  summer: 'summer',
  fall: 'fall',
}

/**
 * Thresholds on the 5-day mean water temperature, °C. Largemouth bass, the anglers' main fish:
 * spawning from about 15 °C and adult growth best at 24-30 °C (Stuber, Kinney and Raleigh 1982,
 * USFWS HSI: largemouth bass; both figures from memory, the report not yet read).
 * Early pre-spawn from the mid 40s °F when warming (common practice). Growth begins at 10-14 °C
 * and spawning ends by about 21 °C (Edwards, Gebhart and Maughan 1983, USFWS HSI: smallmouth bass,
 * used where the largemouth figures are not to hand); Coutant (1975) as cited by Wyoming Game and
 * Fish puts the summer plateau at 21-27 °C. backToWinter is our own, below earlyPreSpawn so a
 * front does not flick the phase back.
 */
export const PHASE_C = {
  earlyPreSpawn: 7.2,
  backToWinter: 5.5,
  preSpawn: 10,
  spawn: 15,
  postSpawn: 21,
  summer: 24,
  fallBelow: 21,
  winterBelow: 10,
}
/** A threshold must hold this many days in a row before the phase moves on. */
export const HOLD_DAYS = 3
/** A trend within ±0.05 °C/day is flat. */
const FLAT_C_PER_DAY = 0.05
/** After this long in post-spawn, warm water is summer even below the summer threshold (our rule). */
export const POST_SPAWN_MAX_DAYS = 35
/**
 * After this long in spawn, water that never reaches the post-spawn threshold is past the spawn
 * anyway (our rule; from memory, a lake's spawn runs in waves over a month or so).
 */
const SPAWN_MAX_DAYS = 45
/** A state judged last more than this long ago says nothing about today: start again from history. */
export const STALE_STATE_DAYS = 30

const SPAWNING_SIDE: readonly SeasonalPhase[] = ['early-pre-spawn', 'pre-spawn', 'spawn']

/**
 * A lake's phase as it carries from day to day: stored per lake and advanced over each new day,
 * never re-derived from a window (which restarts the hysteresis and the day counts every day).
 */
export interface PhaseState {
  phase: SeasonalPhase
  /** The local date the phase began, or the first day judged when it began before the history. */
  since: string
  /** The neighbour the days call for, and how many days in a row they have. */
  pending: SeasonalPhase | null
  pendingDays: number
  /** The last local date judged, and its 5-day mean (°C) and 7-day trend (°C a day). */
  lastDay: string
  meanC: number
  trendCPerDay: number
}

/** The phase as the Lake read shows it: the state with a short reason; the numbers are fields. */
export interface SeasonalPhaseResult extends PhaseState {
  reason: string
}

/** Daily means, oldest first, ending on `lastDay`. */
export interface DailyWaterSeries {
  dailyMeanWaterC: number[]
  lastDay: string
  latitude: number
}

interface Day {
  date: string
  meanC: number
  trendCPerDay: number
}

/**
 * The stretch of the year where `date` falls in the lake's hemisphere. The solstices and equinoxes
 * are taken as 20-21 March, 21 June, 22 September and 21 December (from memory; each varies by a
 * day or so from year to year).
 */
function seasonOfYear(
  date: string,
  latitude: number,
): 'spring' | 'early-summer' | 'late-summer' | 'early-winter' | 'late-winter' {
  const [, m, d] = assertDate(date)
  const md = m * 100 + d
  // Northern calendar; the southern hemisphere is six months on.
  const north =
    md >= 320 && md < 621
      ? 'spring'
      : md >= 621 && md < 922
        ? 'summer'
        : md >= 922 && md < 1221
          ? 'autumn'
          : 'winter'
  const here =
    latitude >= 0
      ? north
      : ({ spring: 'autumn', summer: 'winter', autumn: 'spring', winter: 'summer' } as const)[north]
  return here === 'spring'
    ? 'spring'
    : here === 'summer'
      ? 'late-summer'
      : here === 'autumn'
        ? 'early-winter'
        : 'late-winter'
}

/** The phase a history starts in, from its first judged day and whether the year is warming then. */
function initialPhase(first: Day, latitude: number): SeasonalPhase {
  // Day of year decides whether the year is warming there (northern spring: January to mid July).
  const [y, m, d] = assertDate(first.date)
  const doy = (Date.UTC(y, m - 1, d) - Date.UTC(y, 0, 1)) / DAY_MS
  const northernWarming = doy < 200
  const warmingHalf = latitude >= 0 ? northernWarming : !northernWarming
  const t = first.meanC
  if (!warmingHalf)
    return t >= PHASE_C.fallBelow ? 'summer' : t >= PHASE_C.winterBelow ? 'fall' : 'winter'
  if (t < PHASE_C.earlyPreSpawn) return 'winter'
  if (t < PHASE_C.preSpawn)
    return first.trendCPerDay > FLAT_C_PER_DAY ? 'early-pre-spawn' : 'winter'
  if (t < PHASE_C.spawn) return 'pre-spawn'
  if (t < PHASE_C.postSpawn) return 'spawn'
  if (t < PHASE_C.summer) return 'post-spawn'
  return 'summer'
}

/** The next phase the day's mean and trend call for, by temperature alone; only to a neighbour. */
function wantsByWater(phase: SeasonalPhase, d: Day, daysInPhase: number): SeasonalPhase {
  const warming = d.trendCPerDay > FLAT_C_PER_DAY
  const cooling = d.trendCPerDay < -FLAT_C_PER_DAY
  switch (phase) {
    case 'winter':
      return d.meanC >= PHASE_C.earlyPreSpawn && warming ? 'early-pre-spawn' : phase
    case 'early-pre-spawn':
      if (d.meanC < PHASE_C.backToWinter) return 'winter'
      return d.meanC >= PHASE_C.preSpawn ? 'pre-spawn' : phase
    case 'pre-spawn':
      return d.meanC >= PHASE_C.spawn ? 'spawn' : phase
    case 'spawn':
      return d.meanC >= PHASE_C.postSpawn || daysInPhase >= SPAWN_MAX_DAYS ? 'post-spawn' : phase
    case 'post-spawn':
      if (d.meanC >= PHASE_C.summer || daysInPhase >= POST_SPAWN_MAX_DAYS) return 'summer'
      return phase
    case 'summer':
      return d.meanC < PHASE_C.fallBelow && cooling ? 'fall' : phase
    case 'fall':
      return d.meanC < PHASE_C.winterBelow ? 'winter' : phase
  }
}

/**
 * The temperature's call bounded by the calendar: from the autumn equinox to the winter solstice
 * no warm spell starts the spring, and a spawning-side phase (left from a bad start) gives way;
 * from the spring equinox to the summer solstice no cool spell starts the fall; after the winter
 * solstice a fall that never got cold enough for winter is winter all the same, so a warm lake
 * still comes to its spring.
 */
function wants(phase: SeasonalPhase, d: Day, daysInPhase: number, latitude: number): SeasonalPhase {
  const byWater = wantsByWater(phase, d, daysInPhase)
  switch (seasonOfYear(d.date, latitude)) {
    case 'early-winter':
      if (SPAWNING_SIDE.includes(phase)) return d.meanC < PHASE_C.winterBelow ? 'winter' : 'fall'
      return SPAWNING_SIDE.includes(byWater) ? phase : byWater
    case 'spring':
      return byWater === 'fall' ? phase : byWater
    case 'late-winter':
      return phase === 'fall' ? 'winter' : byWater
    default:
      return byWater
  }
}

const daysBetween = (from: string, to: string) => {
  const [a, b] = [assertDate(from), assertDate(to)]
  return Math.round((Date.UTC(b[0], b[1] - 1, b[2]) - Date.UTC(a[0], a[1] - 1, a[2])) / DAY_MS)
}

/** One day judged: the phase moves on only after its neighbour has been called for HOLD_DAYS days. */
function judge(state: PhaseState, day: Day, latitude: number): PhaseState {
  const next = wants(state.phase, day, daysBetween(state.since, day.date), latitude)
  const numbers = { lastDay: day.date, meanC: day.meanC, trendCPerDay: day.trendCPerDay }
  if (next === state.phase) return { ...state, ...numbers, pending: null, pendingDays: 0 }
  const held = next === state.pending ? state.pendingDays + 1 : 1
  if (held >= HOLD_DAYS)
    return { ...numbers, phase: next, since: day.date, pending: null, pendingDays: 0 }
  return { ...state, ...numbers, pending: next, pendingDays: held }
}

function mean(values: number[]): number {
  return values.reduce((a, b) => a + b, 0) / values.length
}

function slope(values: number[]): number {
  const n = values.length
  const xm = (n - 1) / 2
  const ym = mean(values)
  let num = 0
  let den = 0
  values.forEach((y, x) => {
    num += (x - xm) * (y - ym)
    den += (x - xm) ** 2
  })
  return den ? num / den : 0
}

/** Each day from the seventh on, with its 5-day mean and 7-day least-squares trend. */
function judgedDays(input: DailyWaterSeries, minDays: number): Day[] {
  const { dailyMeanWaterC: temps, lastDay, latitude } = input
  assertDate(lastDay, 'lastDay')
  assertFinite(latitude, 'latitude', { min: -90, max: 90 })
  if (!Array.isArray(temps) || temps.length < minDays) {
    throw new DomainError(
      'invalid_series',
      `dailyMeanWaterC needs at least ${minDays} daily values.`,
      'dailyMeanWaterC',
    )
  }
  temps.forEach((t, i) => assertFinite(t, `dailyMeanWaterC[${i}]`, { min: -2, max: 40 }))
  return temps.flatMap((_, i) =>
    i < 6
      ? []
      : [
          {
            date: addDays(lastDay, i - (temps.length - 1)),
            meanC: mean(temps.slice(i - 4, i + 1)),
            trendCPerDay: slope(temps.slice(i - 6, i + 1)),
          },
        ],
  )
}

/**
 * The state of a lake that has none yet, from its history (at least 14 daily means): the phase its
 * first judged day starts in by temperature and date, then each later day judged in turn.
 */
export function startPhase(input: DailyWaterSeries): PhaseState {
  const [first, ...rest] = judgedDays(input, 14)
  const start: PhaseState = {
    phase: initialPhase(first!, input.latitude),
    since: first!.date,
    pending: null,
    pendingDays: 0,
    lastDay: first!.date,
    meanC: first!.meanC,
    trendCPerDay: first!.trendCPerDay,
  }
  // The calendar bounds the start too: a warm early winter is not a spring.
  if (
    SPAWNING_SIDE.includes(start.phase) &&
    seasonOfYear(first!.date, input.latitude) === 'early-winter'
  )
    start.phase = first!.meanC < PHASE_C.winterBelow ? 'winter' : 'fall'
  return rest.reduce((state, day) => judge(state, day, input.latitude), start)
}

/**
 * The stored state advanced over the days of `input` after its last judged day (each needs the
 * six days before it in the series). Days already judged are not judged again, so refreshing twice
 * in a day changes nothing.
 */
export function advancePhase(state: PhaseState, input: DailyWaterSeries): PhaseState {
  const days = judgedDays(input, 7).filter((d) => d.date > state.lastDay)
  return days.reduce((s, day) => judge(s, day, input.latitude), state)
}

/** What each phase means for the fish, without numbers (the read carries them as fields). */
const REASON: Record<SeasonalPhase, string> = {
  winter: 'cold water: bass hold deep and feed little',
  'early-pre-spawn':
    'winter is over: bass start toward the banks they spawn near (common practice)',
  'pre-spawn':
    'water warm enough for feeding and growth, not yet for nesting (Edwards et al. 1983)',
  spawn: 'water warm enough for nesting (Stuber et al. 1982, figures from memory)',
  'post-spawn': 'past the spawn: bass recover and move out (Edwards et al. 1983)',
  summer: 'summer water: bass feed most in the warm range (Stuber et al. 1982, from memory)',
  fall: 'water past its summer peak: bass follow the bait',
}

/** The water each phase usually has, °C; outside it, the phase is being held (hysteresis). */
const USUAL_C: Record<SeasonalPhase, [number, number]> = {
  winter: [-Infinity, PHASE_C.preSpawn],
  'early-pre-spawn': [PHASE_C.backToWinter, PHASE_C.preSpawn],
  'pre-spawn': [PHASE_C.preSpawn, PHASE_C.spawn],
  spawn: [PHASE_C.spawn, PHASE_C.postSpawn],
  'post-spawn': [PHASE_C.postSpawn, PHASE_C.summer],
  summer: [PHASE_C.fallBelow, Infinity],
  fall: [PHASE_C.winterBelow, PHASE_C.fallBelow],
}

/** The state as the read shows it, with a reason that agrees with its mean and trend. */
export function phaseView(state: PhaseState, latitude: number): SeasonalPhaseResult {
  const { phase, pending, pendingDays, meanC } = state
  const day = { date: state.lastDay, meanC, trendCPerDay: state.trendCPerDay }
  const season = seasonOfYear(state.lastDay, latitude)
  const byWater = wantsByWater(phase, day, daysBetween(state.since, state.lastDay))
  const [lo, hi] = USUAL_C[phase]
  let why = REASON[phase]
  if (pending) {
    const left = HOLD_DAYS - pendingDays
    why += `; ${PHASE_LABELS[pending]} if the water holds ${left} more day${left === 1 ? '' : 's'}`
  } else if (
    season === 'early-winter' &&
    phase === 'winter' &&
    (meanC >= hi || SPAWNING_SIDE.includes(byWater))
  ) {
    why += '; a warm spell before the winter solstice does not start the spring'
  } else if (season === 'spring' && phase === 'summer' && (meanC < lo || byWater === 'fall')) {
    why += '; a cool spell before the summer solstice does not start the fall'
  } else if (meanC < lo) {
    why += '; the phase holds through a cold spell'
  } else if (meanC >= hi) {
    why += '; the phase holds through a warm spell'
  }
  return { ...state, reason: `${why}.` }
}

/**
 * Seasonal phase of black bass from daily mean water temperatures (oldest first, ending on
 * `lastDay`, at least 14 days), for a lake with no stored state: `startPhase` and its view. A state
 * machine over a 5-day mean and 7-day trend with hysteresis (a phase moves on only after its
 * threshold holds 3 days; spring and autumn use different thresholds), bounded by the calendar.
 */
export function seasonalPhase(input: DailyWaterSeries): SeasonalPhaseResult {
  return phaseView(startPhase(input), input.latitude)
}
