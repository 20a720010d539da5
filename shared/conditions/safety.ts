import { assertFinite } from '../errors'
import { cToF, fToC, M_PER_FT, msToKmh, msToKnots, mToFt } from '../units'
import { heatIndexC, windChillC } from './weather'
import { wordList } from '../words'

export type CautionLevel = 'info' | 'caution' | 'warning' | 'danger'
export type CautionKind =
  'wind' | 'waves' | 'lightning' | 'cold-water' | 'heat' | 'wind-chill' | 'authority'

export interface Caution {
  kind: CautionKind
  level: CautionLevel
  /** The number the caution is judged on, in SI: sustained wind m/s, wave m, chance %, or °C. */
  value?: number
  /** The strongest gust, m/s, for a wind caution. */
  gustMs?: number
  /** The hazard and its number in a few words: what a verdict gives as its reason. */
  headline: string
  /** The headline and what to do about it. */
  message: string
  /** A published source, or "common practice" / "from memory". */
  source: string
  /** For a day's cautions: the windows (ids) where the hazard is at its level, in the day's order. */
  windows?: string[]
  /** For a day's cautions: those windows in words ("Midday and afternoon to dusk", "All day"). */
  when?: string
}

/**
 * The worst of the hours a caution covers: highest wind, gust, wave, chance of thunder and heat
 * index; lowest wind chill. Cautions are judged on these, never on averages that hide a peak.
 */
export interface CautionInput {
  windMs: number
  gustMs?: number
  /** The highest significant wave height expected where the boat will run. */
  waveHeightM?: number
  thunderstormProbabilityPct?: number
  waterC?: number
  heatIndexC?: number
  windChillC?: number
}

/** How a caution writes a number: by default in both unit systems, as cautions kept for everyone. */
export interface CautionUnits {
  /** A wind speed as `windFigure` prints it. */
  speed: (ms: number) => string
  length: (m: number) => string
  /** To a tenth of a degree: cautions are judged on the value as shown. */
  temp: (c: number) => string
  /**
   * The limits a caution's source quotes, as the values are shown against them: wind and waves
   * to a tenth of the unit, a temperature limit given in °F (°C for a °C reader where it starts).
   */
  limit: {
    speed: (ms: number) => string
    length: (m: number) => string
    tempF: (f: number) => string
  }
}

const tenth = (x: number) => Math.round(x * 10) / 10
/** A tenth without a trailing ".0": 17.9, 1, 0.3. */
const figure = (x: number) => String(tenth(x))

/**
 * Where a °F limit starts for a °C reader: the lowest tenth of a degree Celsius whose °F shows
 * at the limit or above (103 °F starts at 39.5 °C, as 39.4 °C shows as 102.9 °F).
 */
export function limitC(f: number): number {
  let c = tenth(fToC(f) - 0.2)
  while (tenth(cToF(c)) < f) c = tenth(c + 0.1)
  return c
}

export const BOTH_UNITS: CautionUnits = {
  speed: (ms) => `${windFigure(ms, msToKnots)} kt (${windFigure(ms, msToKmh)} km/h)`,
  length: (m) => `${mToFt(m).toFixed(1)} ft (${m.toFixed(1)} m)`,
  temp: (c) => `${cToF(c).toFixed(1)} °F (${c.toFixed(1)} °C)`,
  limit: {
    speed: (ms) => `${figure(msToKnots(ms))} kt (${figure(msToKmh(ms))} km/h)`,
    length: (m) => `${figure(mToFt(m))} ft (${figure(m)} m)`,
    tempF: (f) => `${figure(f)} °F (${figure(limitC(f))} °C)`,
  },
}

/**
 * Wind on inland lakes for small boats, m/s, at the WMO Beaufort scale's bounds: force 5 (fresh
 * breeze, 8.0 m/s), force 6 (strong breeze, 10.8 m/s, "large waves begin to form"), force 7
 * (13.9 m/s) and force 8 (gale, 17.2 m/s). The 7 m/s caution, and which force a bass boat should
 * not go out in, are common practice: NWS lake wind advisories vary by forecast office, and small
 * boats are at risk well below the marine small craft advisory (22 kt).
 */
export const WIND_MS = {
  caution: 7,
  warning: 8,
  danger: 10.8,
  gustCaution: 10.8,
  gustWarning: 13.9,
  gustDanger: 17.2,
}
const WIND_LIMITS = [...new Set(Object.values(WIND_MS))]

/**
 * A wind speed as people read it, judged as the wind cautions judge it (to 0.1 m/s): a whole
 * number in their unit, or a tenth where the whole number would stand on the other side of a
 * wind limit than the speed does, the limits being shown to a tenth. So 7.9 m/s, below the 8.0 m/s
 * warning (17.9 mph), prints as 17.7 mph, never as the 18 mph that 8.0 m/s prints as.
 */
export function windFigure(ms: number, toUnit: (ms: number) => number): string {
  const judged = tenth(ms)
  const whole = Math.round(toUnit(judged))
  const astray = WIND_LIMITS.some((limit) => judged >= limit !== whole >= tenth(toUnit(limit)))
  return astray ? figure(toUnit(judged)) : String(whole)
}
/** Waves for a small boat (common practice): 1 ft a chop, 2 ft rough, 3 ft dangerous. */
export const WAVE_M = { caution: 0.3, warning: 0.6, danger: 0.9 }
/**
 * Chance of thunder, %: NWS wording calls 15-20 % a slight chance (isolated storms), 30-50 % a
 * chance (scattered), 60 % and up likely. Lightning strikes miles from a storm (NWS lightning
 * safety), so even a slight chance is a caution; 50 % is our danger line.
 */
export const THUNDER_PCT = { caution: 15, warning: 30, danger: 50 }

type Levels = Record<Exclude<CautionLevel, 'info'>, string>

interface CautionRule {
  kind: Exclude<CautionKind, 'authority'>
  /** The number judged, from the worst hour; undefined when the conditions lack it. */
  value: (c: CautionInput) => number | undefined
  level: (value: number, c: CautionInput) => CautionLevel | null
  headline: (value: number, c: CautionInput, u: CautionUnits) => string
  /** What to do, by level. */
  advice: Levels
  /** Where the limits come from, quoting them in the reader's units. */
  source: (u: CautionUnits) => string
}

/** The wind and gust as judged and shown, to 0.1 m/s. */
const windOf = (c: CautionInput) => tenth(c.windMs)
const gustOf = (c: CautionInput) => tenth(Math.max(c.gustMs ?? 0, c.windMs))
/** A temperature as a °F reader sees it, from the tenth of a °C it is judged on. */
const shownF = (c: number) => tenth(cToF(c))
const GET_OFF = 'Do not launch; if you are out, get off the water by the shortest sheltered route.'

/** Each caution is a row: what it judges, at what level, what it says and where that comes from. */
export const CAUTION_RULES: CautionRule[] = [
  {
    kind: 'wind',
    // Judged to 0.1 m/s, as shown (see windFigure): a speed never prints at a level it is not.
    value: windOf,
    level: (ms, c) => {
      const gust = gustOf(c)
      if (ms >= WIND_MS.danger || gust >= WIND_MS.gustDanger) return 'danger'
      if (ms >= WIND_MS.warning || gust >= WIND_MS.gustWarning) return 'warning'
      return ms >= WIND_MS.caution || gust >= WIND_MS.gustCaution ? 'caution' : null
    },
    headline: (ms, c, u) => `Wind ${u.speed(ms)}, gusts ${u.speed(gustOf(c))}`,
    advice: {
      caution:
        'Whitecaps on open water: cross it with care, quartering the waves, and keep to sheltered water on long runs.',
      warning:
        'Rough for a small boat: fish near the launch and in sheltered coves, and do not cross open water.',
      danger: `Dangerous for small boats. ${GET_OFF}`,
    },
    source: ({ limit: { speed } }) =>
      `WMO Beaufort scale (force 5 from ${speed(WIND_MS.warning)}, force 6 from ${speed(WIND_MS.danger)}, force 7 from ${speed(WIND_MS.gustWarning)}, gale from ${speed(WIND_MS.gustDanger)}); the ${speed(WIND_MS.caution)} caution and limits for small boats on inland lakes are common practice`,
  },
  {
    kind: 'waves',
    // Judged to a tenth of a metre, as shown: "0.6 m" never reads below the 0.6 m warning.
    value: (c) => (c.waveHeightM === undefined ? undefined : tenth(c.waveHeightM)),
    level: (m) =>
      m >= WAVE_M.danger
        ? 'danger'
        : m >= WAVE_M.warning
          ? 'warning'
          : m >= WAVE_M.caution
            ? 'caution'
            : null,
    headline: (m, _c, u) => `Waves to ${u.length(m)} on exposed water`,
    advice: {
      caution: 'A chop a small boat feels: slow down and quarter into it.',
      warning:
        'Rough for a small boat: stay in the lee, slow down, and avoid long runs across open water.',
      danger: `Waves that can swamp a small boat. ${GET_OFF}`,
    },
    source: ({ limit: { length } }) =>
      `Common practice for small boats (${length(WAVE_M.caution)}, ${length(WAVE_M.warning)} and ${length(WAVE_M.danger)}); NWS small craft advisories on the Great Lakes start at ${length(4 * M_PER_FT)}`,
  },
  {
    kind: 'lightning',
    value: (c) => c.thunderstormProbabilityPct,
    level: (p) =>
      p >= THUNDER_PCT.danger
        ? 'danger'
        : p >= THUNDER_PCT.warning
          ? 'warning'
          : p >= THUNDER_PCT.caution
            ? 'caution'
            : null,
    headline: (p) => `Thunderstorms ${Math.round(p)} %`,
    advice: {
      caution:
        'Lightning strikes miles from a storm: watch the sky, and at the first thunder get off the water and wait 30 minutes after the last.',
      warning:
        'When thunder roars, go indoors: plan to be off the water before storms build, and wait 30 minutes after the last thunder.',
      danger: `Storms are likely. ${GET_OFF} When thunder roars, go indoors, and wait 30 minutes after the last thunder.`,
    },
    source: () => 'NWS lightning safety; NWS chance-of-precipitation wording',
  },
  {
    kind: 'cold-water',
    // Judged on the value as shown, to a tenth of a degree, so one number never reads at two levels.
    value: (c) => (c.waterC === undefined ? undefined : tenth(c.waterC)),
    // Against °F limits as a °F reader sees the tenth: 21.1 °C shows as 70.0 °F, no caution.
    level: (c) => (shownF(c) < 50 ? 'warning' : shownF(c) < 70 ? 'caution' : null),
    headline: (c, _i, u) => `Water ${u.temp(c)}`,
    advice: {
      caution:
        'A fall brings cold shock (1-10-1: about 1 minute to control breathing, 10 of useful movement, an hour before unconsciousness). Wear the life jacket and clip on the kill-switch lanyard.',
      warning:
        'Very cold water: a fall brings cold shock within a minute (1-10-1). Wear the life jacket zipped, clip on the kill-switch lanyard, and do not fish alone.',
      danger: GET_OFF,
    },
    source: ({ limit: { tempF } }) =>
      `1-10-1 principle; ${tempF(70)} and ${tempF(50)} thresholds from memory`,
  },
  {
    kind: 'heat',
    // Judged to a tenth of a degree, as shown, against the bands as a °F reader sees the tenth.
    value: (c) => (c.heatIndexC === undefined ? undefined : tenth(c.heatIndexC)),
    level: (c) => {
      const hi = shownF(c)
      return hi >= 103 ? 'danger' : hi >= 90 ? 'warning' : hi >= 80 ? 'caution' : null
    },
    headline: (c, _i, u) => `Heat index ${u.temp(c)}`,
    advice: {
      caution: 'Drink water before you are thirsty, cover up, and rest in shade.',
      warning:
        'Heat exhaustion is possible: drink water every 15-20 minutes, cover up, rest in shade, and fish the cool hours.',
      danger:
        'Heat stroke is likely with long exposure: stay off the open water in the heat of the day, and fish the early hours only.',
    },
    source: ({ limit: { tempF } }) =>
      `NWS heat index risk bands (${tempF(80)}, ${tempF(90)}, ${tempF(103)})`,
  },
  {
    kind: 'wind-chill',
    value: (c) => (c.windChillC === undefined ? undefined : tenth(c.windChillC)),
    level: (wc) => (wc <= -28 ? 'danger' : wc <= -10 ? 'warning' : wc <= 0 ? 'caution' : null),
    headline: (c, _i, u) => `Wind chill ${u.temp(c)}`,
    advice: {
      caution: 'Colder still at running speed: cover skin and dress for spray.',
      warning: 'Colder still at running speed: cover all skin; frostbite comes within 30 minutes.',
      danger: 'Frostbite comes within minutes, faster at running speed: stay off the water.',
    },
    source: ({ limit: { tempF } }) =>
      `NWS wind chill (2001); ${tempF(cToF(-28))} frostbite threshold from memory`,
  },
]

export const AUTHORITY_CAUTION: Caution = {
  kind: 'authority',
  level: 'info',
  headline: 'A guide only',
  message:
    'These cautions are a guide only. Follow local authorities, marine and weather warnings, and boating law; wear a life jacket and use the kill-switch lanyard.',
  source: 'common practice',
}

const RANK: Record<CautionLevel, number> = { danger: 0, warning: 1, caution: 2, info: 3 }

/** Whether caution `a` is worse than `b` of the same kind: a higher level, or a worse number. */
function worse(a: Caution, b: Caution): boolean {
  if (a.level !== b.level) return RANK[a.level] < RANK[b.level]
  const sign = a.kind === 'wind-chill' || a.kind === 'cold-water' ? -1 : 1
  return sign * ((a.value ?? 0) - (b.value ?? 0)) > 0
}

/**
 * A caution's headline, message and source in some units; a day's caution keeps the windows it
 * names.
 */
export function cautionWords(
  c: Pick<
    Caution,
    'kind' | 'level' | 'value' | 'gustMs' | 'when' | 'headline' | 'message' | 'source'
  >,
  units: CautionUnits,
): { headline: string; message: string; source: string } {
  const rule = CAUTION_RULES.find((r) => r.kind === c.kind)
  if (!rule || c.value === undefined || c.level === 'info')
    return { headline: c.headline, message: c.message, source: c.source }
  const bare = rule.headline(c.value, { windMs: c.value, gustMs: c.gustMs }, units)
  const headline = c.when ? `${c.when}: ${bare}` : bare
  return { headline, message: `${headline}. ${rule.advice[c.level]}`, source: rule.source(units) }
}

/** Cautions for the worst of the conditions, most serious first, always ending with the deferral to local authority. */
export function cautions(conditions: CautionInput, units: CautionUnits = BOTH_UNITS): Caution[] {
  assertFinite(conditions.windMs, 'windMs', { min: 0 })
  for (const key of [
    'gustMs',
    'waveHeightM',
    'thunderstormProbabilityPct',
    'waterC',
    'heatIndexC',
    'windChillC',
  ] as const) {
    const v = conditions[key]
    if (v !== undefined) assertFinite(v, key)
  }
  const found: Caution[] = []
  for (const rule of CAUTION_RULES) {
    const value = rule.value(conditions)
    const level = value === undefined ? null : rule.level(value, conditions)
    if (value === undefined || !level || level === 'info') continue
    const caution = {
      kind: rule.kind,
      level,
      value,
      ...(rule.kind === 'wind' && { gustMs: gustOf(conditions) }),
    }
    found.push({
      ...caution,
      ...cautionWords({ ...caution, headline: '', message: '', source: '' }, units),
    })
  }
  found.sort((a, b) => RANK[a.level] - RANK[b.level])
  return [...found, AUTHORITY_CAUTION]
}

/** One hour of weather as the cautions read it. */
export interface CautionHour {
  windMs: number
  gustMs: number
  airC: number
  relativeHumidityPct: number
  thunderstormProbabilityPct?: number | null
}

/** The worst of some hours for the cautions: a day is judged by its worst hour for safety. */
export function worstOf(
  hours: CautionHour[],
): CautionInput & { gustMs: number; thunderstormProbabilityPct: number } {
  const chills = hours.flatMap((h) => {
    const wc = windChillC(h.airC, h.windMs)
    return wc === null ? [] : [wc]
  })
  return {
    windMs: Math.max(0, ...hours.map((h) => h.windMs)),
    gustMs: Math.max(0, ...hours.map((h) => h.gustMs)),
    thunderstormProbabilityPct: Math.max(0, ...hours.map((h) => h.thunderstormProbabilityPct ?? 0)),
    heatIndexC: hours.length
      ? Math.max(...hours.map((h) => heatIndexC(h.airC, h.relativeHumidityPct)))
      : undefined,
    windChillC: chills.length ? Math.min(...chills) : undefined,
  }
}

export type Verdict = 'go' | 'caution' | 'no-go'

export interface VerdictResult {
  verdict: Verdict
  /** The cautions that decided it, as headlines. */
  reasons: string[]
}

/** The verdict in words, the same on every screen and mail. */
export const VERDICT_LABELS: Record<Verdict, string> = {
  go: 'Go',
  caution: 'Go with caution',
  'no-go': 'No-go: do not launch',
}

/** The verdict's shape, so it never rests on colour alone: a tick, a bang, a cross. */
export const VERDICT_SHAPES: Record<Verdict, string> = { go: '✓', caution: '!', 'no-go': '✕' }

/**
 * Go, caution or no-go from the cautions: any danger is a no-go, any warning a caution; the
 * reasons are the cautions at the deciding level (or, on a go, the lesser cautions to keep in mind).
 */
export function verdictOf(list: Pick<Caution, 'kind' | 'level' | 'headline'>[]): VerdictResult {
  const real = list.filter((c) => c.kind !== 'authority')
  const at = (level: CautionLevel) => real.filter((c) => c.level === level).map((c) => c.headline)
  if (at('danger').length) return { verdict: 'no-go', reasons: at('danger') }
  if (at('warning').length) return { verdict: 'caution', reasons: at('warning') }
  return { verdict: 'go', reasons: at('caution') }
}

/** "Dawn to mid-morning", "midday and afternoon to dusk", "all day". */
function whenText(labels: string[], of: number): string {
  if (labels.length === of && of > 1) return 'All day'
  const lower = labels.map((l, i) => (i ? l.toLowerCase() : l))
  return wordList(lower)
}

/**
 * The cautions of a day's windows as one list: one line per hazard at its worst level, naming
 * the windows where it reaches that level ("Midday and afternoon to dusk: Thunderstorms 36 %"),
 * most serious first, ending with the deferral to local authority. Each window's own cautions
 * still say what the others bring.
 */
export function mergeCautions(
  windows: { id: string; label: string; cautions: Caution[] }[],
): Caution[] {
  const byKind = new Map<CautionKind, { worst: Caution; ids: string[]; labels: string[] }>()
  for (const w of windows)
    for (const c of w.cautions) {
      if (c.kind === 'authority') continue
      const seen = byKind.get(c.kind)
      if (!seen || RANK[c.level] < RANK[seen.worst.level])
        byKind.set(c.kind, { worst: c, ids: [w.id], labels: [w.label] })
      else if (c.level === seen.worst.level) {
        if (worse(c, seen.worst)) seen.worst = c
        seen.ids.push(w.id)
        seen.labels.push(w.label)
      }
    }
  const merged = [...byKind.values()].map(({ worst, ids, labels }): Caution => {
    const when = whenText(labels, windows.length)
    return {
      ...worst,
      headline: `${when}: ${worst.headline}`,
      message: `${when}: ${worst.message}`,
      windows: ids,
      when,
    }
  })
  return [...merged.sort((a, b) => RANK[a.level] - RANK[b.level]), AUTHORITY_CAUTION]
}
