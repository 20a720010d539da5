import { assertFinite, DomainError } from '../errors'
import { assertDate } from '../time'

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
 * Thresholds on the 5-day mean water temperature, °C. Sources:
 * early pre-spawn from the mid 40s °F when warming (common practice);
 * growth begins at 10-14 °C and spawning runs 12.8-21 °C, mostly at or above 15 °C
 * (Edwards, Gebhart and Maughan 1983, USFWS HSI: smallmouth bass);
 * summer preference 21-27 °C (same source; Coutant 1975 as cited by Wyoming Game and Fish).
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
const HOLD_DAYS = 3
/** A trend within ±0.05 °C/day is flat. */
const FLAT_C_PER_DAY = 0.05
/** After this long in post-spawn, warm water is summer even below the summer threshold. */
const POST_SPAWN_MAX_DAYS = 35

export interface SeasonalPhaseResult {
  phase: SeasonalPhase
  reason: string
}

interface Day {
  meanC: number
  trendCPerDay: number
}

/** The phase a series starts in, from its first week and whether the year is warming at that date. */
function initialPhase(first: Day, warmingHalf: boolean): SeasonalPhase {
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

/** The next phase when today's mean and trend call for it; each phase moves only to its neighbour. */
function wants(phase: SeasonalPhase, d: Day, daysInPhase: number): SeasonalPhase {
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
      return d.meanC >= PHASE_C.postSpawn ? 'post-spawn' : phase
    case 'post-spawn':
      if (d.meanC >= PHASE_C.summer || daysInPhase >= POST_SPAWN_MAX_DAYS) return 'summer'
      return phase
    case 'summer':
      return d.meanC < PHASE_C.fallBelow && cooling ? 'fall' : phase
    case 'fall':
      return d.meanC < PHASE_C.winterBelow ? 'winter' : phase
  }
}

const REASON: Record<SeasonalPhase, string> = {
  winter: 'cold water; bass hold deep and feed little below about 10 °C',
  'early-pre-spawn': 'water warming through the mid 40s °F (common practice)',
  'pre-spawn': 'warming water from 10 °C, when growth and feeding pick up (Edwards et al. 1983)',
  spawn: 'water from 15 °C, where most nesting happens (Edwards et al. 1983)',
  'post-spawn': 'water past 21 °C after the spawn (Edwards et al. 1983)',
  summer: 'water in the summer range of 21-27 °C and above',
  fall: 'water cooling from its summer peak',
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

/**
 * Seasonal phase of black bass from daily mean water temperatures (oldest first, ending on
 * `lastDay`, at least 14 days). A state machine over a 5-day mean and 7-day trend, with hysteresis:
 * a phase moves on only after its threshold holds 3 days, and spring and autumn use different
 * thresholds, so the same temperature reads differently warming and cooling.
 */
export function seasonalPhase(input: {
  dailyMeanWaterC: number[]
  lastDay: string
  latitude: number
}): SeasonalPhaseResult {
  const { dailyMeanWaterC: temps, lastDay, latitude } = input
  assertDate(lastDay, 'lastDay')
  assertFinite(latitude, 'latitude', { min: -90, max: 90 })
  if (!Array.isArray(temps) || temps.length < 14) {
    throw new DomainError(
      'invalid_series',
      'dailyMeanWaterC needs at least 14 daily values.',
      'dailyMeanWaterC',
    )
  }
  temps.forEach((t, i) => assertFinite(t, `dailyMeanWaterC[${i}]`, { min: -2, max: 40 }))

  const days: Day[] = temps.map((_, i) => {
    const from = Math.max(0, i - 6)
    return {
      meanC: mean(temps.slice(Math.max(0, i - 4), i + 1)),
      trendCPerDay: slope(temps.slice(from, i + 1)),
    }
  })
  // Day of year of the first value decides whether the year is warming there (northern spring: Jan-Jul).
  const [y, m, d] = assertDate(lastDay)
  const firstDay = new Date(Date.UTC(y, m - 1, d - (temps.length - 1)))
  const doy = (firstDay.getTime() - Date.UTC(firstDay.getUTCFullYear(), 0, 1)) / 86_400_000
  const northernWarming = doy < 200
  const warmingHalf = latitude >= 0 ? northernWarming : !northernWarming

  let phase = initialPhase(days[6]!, warmingHalf)
  let pending: SeasonalPhase | null = null
  let held = 0
  let daysInPhase = 0
  for (const day of days.slice(7)) {
    daysInPhase++
    const next = wants(phase, day, daysInPhase)
    if (next === phase) {
      pending = null
      held = 0
      continue
    }
    held = next === pending ? held + 1 : 1
    pending = next
    if (held >= HOLD_DAYS) {
      phase = next
      pending = null
      held = 0
      daysInPhase = 0
    }
  }
  const last = days[days.length - 1]!
  const trend = last.trendCPerDay
  const trendText =
    Math.abs(trend) <= FLAT_C_PER_DAY
      ? 'steady'
      : `${trend > 0 ? 'warming' : 'cooling'} ${Math.abs(trend).toFixed(2)} °C a day`
  return {
    phase,
    reason: `5-day mean ${last.meanC.toFixed(1)} °C, ${trendText}: ${REASON[phase]}.`,
  }
}
