import type { ClarityClass } from '../conditions/clarity'
import { CLARITY_LABELS } from '../conditions/clarity'
import type { DayPlan, WindowId } from '../conditions/day-plan'
import type { SeasonalPhase } from '../conditions/season'
import { PHASE_LABELS } from '../conditions/season'
import { BLADE_LABELS } from '../conditions/tackle-lists'
import type { Blade } from '../conditions/tackle-rules'
import type { makeFormat } from '../format'
import { MIN_SAMPLE, WATER_BANDS_C } from './insights'

/**
 * Our threshold for the angler's own log to speak on a Day plan or in the brief: at least this many
 * catches in similar conditions (the same clarity class, water temperature band and seasonal
 * phase), the same number the insights call enough to say something.
 */
export const LOG_MIN_SIMILAR = MIN_SAMPLE
/** The log's lure moves first among the calls only when it took at least this share of the fish. */
export const LOG_LEAD_SHARE = 0.5

/** What the log needs of each catch (from its stored conditions and lure). */
export interface LogCatch {
  clarity: ClarityClass | null
  waterC: number | null
  phase: SeasonalPhase | null
  timeOfDay: string | null
  family: string
  blade: Blade | null
}

/** The conditions a day (or a window of it) is planned in. */
export interface LogConditions {
  clarity: ClarityClass
  waterC: number
  phase: SeasonalPhase
}

/** The line a log adds beside the tackle calls: numbers and keys, worded at the edges (`logLine`). */
export interface YourLog {
  /** Fish that came on what is named (the family, with the blade when one is named). */
  count: number
  /** Fish in the log in these conditions. */
  of: number
  /** Fish of those on the family, whatever its blade. */
  familyCount: number
  family: string
  blade: Blade | null
  clarity: ClarityClass
  phase: SeasonalPhase
  /** The water band in °C: [low, high), either end open (null). */
  waterBandC: [number | null, number | null]
  /** Set when the window's own time of day had enough catches on its own. */
  timeOfDay: WindowId | null
  /** The family was moved first among the window's tackle calls. */
  leads: boolean
}

/** The water band holding a temperature, in °C: [low, high), either end open. */
export function waterBandOf(waterC: number): [number | null, number | null] {
  const i = WATER_BANDS_C.findIndex((b) => waterC < b)
  if (i === -1) return [WATER_BANDS_C.at(-1)!, null]
  return [i === 0 ? null : WATER_BANDS_C[i - 1]!, WATER_BANDS_C[i]!]
}

const sameBand = (a: number, b: number) => {
  const [x, y] = [waterBandOf(a), waterBandOf(b)]
  return x[0] === y[0] && x[1] === y[1]
}

const mostOf = <K>(items: K[]): [K, number] | null => {
  const counts = new Map<K, number>()
  for (const k of items) counts.set(k, (counts.get(k) ?? 0) + 1)
  return (
    [...counts.entries()].sort(
      (a, b) => b[1] - a[1] || String(a[0]).localeCompare(String(b[0])),
    )[0] ?? null
  )
}

/**
 * What the angler's log says for these conditions: the lure that took most of their fish in the
 * same clarity class, water band and phase, or null below `LOG_MIN_SIMILAR` catches. With a window
 * named, its own time of day is used when that alone holds enough catches. A blade is named when
 * at least half the family's fish (and two or more) came on the same one.
 */
export function yourLog(
  catches: LogCatch[],
  day: LogConditions,
  window?: WindowId,
): Omit<YourLog, 'leads'> | null {
  const similar = catches.filter(
    (c) =>
      c.clarity === day.clarity &&
      c.phase === day.phase &&
      c.waterC !== null &&
      sameBand(c.waterC, day.waterC),
  )
  const narrow = window ? similar.filter((c) => c.timeOfDay === window) : []
  const used = narrow.length >= LOG_MIN_SIMILAR ? narrow : similar
  if (used.length < LOG_MIN_SIMILAR) return null
  const [family, familyCount] = mostOf(used.map((c) => c.family.trim().toLowerCase()))!
  const blades = used
    .filter((c) => c.family.trim().toLowerCase() === family && c.blade)
    .map((c) => c.blade!)
  const blade = mostOf(blades)
  const named = blade && blade[1] >= 2 && blade[1] * 2 >= familyCount ? blade : null
  return {
    count: named ? named[1] : familyCount,
    of: used.length,
    familyCount,
    family,
    blade: named ? named[0] : null,
    clarity: day.clarity,
    phase: day.phase,
    waterBandC: waterBandOf(day.waterC),
    timeOfDay: used === narrow ? window! : null,
  }
}

/**
 * A plan with the angler's log beside each fishable window's tackle calls. Where the log's lure
 * took at least `LOG_LEAD_SHARE` of the fish and the window calls that family, its call moves
 * first; otherwise the calls stay in the rules' order. Too few catches change nothing.
 */
export function withYourLog<P extends Pick<DayPlan, 'clarity' | 'waterC' | 'phase' | 'windows'>>(
  plan: P,
  catches: LogCatch[],
): P & { windows: (P['windows'][number] & { yourLog: YourLog | null })[] } {
  return {
    ...plan,
    windows: plan.windows.map((w) => {
      const log = w.tackle.length ? yourLog(catches, plan, w.id) : null
      if (!log) return { ...w, yourLog: null }
      const at = w.tackle.findIndex((t) => t.family.toLowerCase() === log.family)
      const leads = at >= 0 && log.familyCount >= LOG_LEAD_SHARE * log.of
      const tackle =
        leads && at > 0 ? [w.tackle[at]!, ...w.tackle.filter((_, i) => i !== at)] : w.tackle
      return { ...w, tackle, yourLog: { ...log, leads } }
    }),
  }
}

const WINDOW_WORDS: Record<WindowId, string> = {
  dawn: 'at dawn',
  midday: 'at midday',
  afternoon: 'in the afternoon',
}

/** "a spinnerbait", "an Indiana blade". */
const article = (words: string) => `${/^[aeiou]/i.test(words) ? 'an' : 'a'} ${words}`

/** "a Colorado blade", "double willow blades". */
const blades = (label: string) => (label.endsWith('blades') ? label : article(label))

/**
 * "Your log: 7 of 9 fish in stained water at 50-59 °F in the pre-spawn phase came on a spinnerbait
 * with a Colorado blade." in a person's units.
 */
export function logLine(log: YourLog, f: ReturnType<typeof makeFormat>): string {
  const t = (c: number) => Math.round(f.toTemp(c))
  const [lo, hi] = log.waterBandC
  const water =
    lo === null
      ? `under ${t(hi!)} ${f.tempUnit}`
      : hi === null
        ? `at ${t(lo)} ${f.tempUnit} and over`
        : `at ${t(lo)}-${t(hi)} ${f.tempUnit}`
  const when = log.timeOfDay ? ` ${WINDOW_WORDS[log.timeOfDay]}` : ''
  const lure = log.blade
    ? `${article(log.family)} with ${blades(BLADE_LABELS[log.blade])}`
    : article(log.family)
  return `Your log: ${log.count} of ${log.of} fish in ${CLARITY_LABELS[log.clarity]} water ${water} in the ${PHASE_LABELS[log.phase]} phase${when} came on ${lure}.`
}
