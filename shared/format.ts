import { compassName } from './conditions/exposure'
import { cautionWords, limitC, verdictOf, windFigure, type CautionUnits } from './conditions/safety'
import type { Settings } from './schemas/settings'
import { addDays, dateLabel, dateTimeFormat, localDate } from './time'
import {
  cToF,
  fToC,
  ftToM,
  HPA_PER_INHG,
  KM2_PER_SQ_MI,
  M_PER_FT,
  M_PER_MI,
  MM_PER_IN,
  mToFt,
  msToKmh,
  msToKnots,
  msToMph,
} from './units'

/** "12 min ago", "3 h ago": how old a reading is. */
export function age(iso: string, now = Date.now()): string {
  const min = Math.max(0, Math.round((now - Date.parse(iso)) / 60_000))
  if (min < 1) return 'just now'
  if (min < 90) return `${min} min ago`
  return min < 2880 ? `${Math.round(min / 60)} h ago` : `${Math.round(min / 1440)} days ago`
}

/** A number to at most one decimal, without a trailing ".0": 0.6, 3, 1.5. */
const short = (x: number) => String(Math.round(x * 10) / 10)

/** A change as shown, signed by its rounded value: "+0.04 inHg", "−1.2 m", and "0.0 m", never "−0.0". */
const signed = (x: number, digits: number, unit: string) => {
  const shown = Number(x.toFixed(digits))
  const sign = shown > 0 ? '+' : shown < 0 ? '−' : ''
  return `${sign}${Math.abs(shown).toFixed(digits)} ${unit}`
}

/** "1-1.5" from two numbers, or one number alone. */
const span = (lo: number, hi: number | undefined, each: (x: number) => string) =>
  hi === undefined ? each(lo) : `${each(lo)}-${each(hi)}`

/**
 * Measurements written into the engine's words (tackle reasons, sizes: "about 2 ft of visibility",
 * "runs 1-1.5 m", "the mid 40s °F", a front's "fell 3.5 hPa") restated in a person's units; text
 * without them is unchanged.
 */
function unitsInText(text: string, s: Settings): string {
  const imperial = s.length === 'ft'
  return text
    .replace(/\b(\d+(?:\.\d+)?)(?:-(\d+(?:\.\d+)?))? (ft|m|in|mm)\b/g, (all, a, b, unit) => {
      const lo = Number(a)
      const hi = b === undefined ? undefined : Number(b)
      if (imperial && unit === 'm') return `${span(lo, hi, (m) => short(Math.round(mToFt(m))))} ft`
      if (imperial && unit === 'mm')
        return `${span(lo, hi, (mm) => short(Math.round((mm / MM_PER_IN) * 2) / 2))} in`
      if (!imperial && unit === 'ft') return `${span(lo, hi, (ft) => short(ft * M_PER_FT))} m`
      if (!imperial && unit === 'in')
        return `${span(lo, hi, (i) => String(Math.round((i * MM_PER_IN) / 5) * 5))} mm`
      return all
    })
    .replace(/\b(\d+(?:\.\d+)?) hPa\b/g, (all, n) =>
      imperial ? `${(Number(n) / HPA_PER_INHG).toFixed(2)} inHg` : all,
    )
    .replace(/\b(?:the )?mid[- ](\d)0s °F/g, (all, tens) =>
      s.temperature === 'C' ? `about ${Math.round(fToC(Number(tens) * 10 + 5))} °C` : all,
    )
    .replace(/(-?\d+(?:\.\d+)?) °([CF])\b/g, (all, n, scale) =>
      scale === 'F' && s.temperature === 'C'
        ? `${Math.round(fToC(Number(n)))} °C`
        : scale === 'C' && s.temperature === 'F'
          ? `${Math.round(cToF(Number(n)))} °F`
          : all,
    )
}

/** What a user sees before choosing (and while signed out). */
/**
 * A number (or range) and its unit as `makeFormat` writes them: "32.2 °C", "17.9 mph", "1-1.5 ft".
 * The edges keep them on one line: a no-wrap span on screens, a no-break space in mail.
 */
export const FIGURE =
  /(-?\d+(?:\.\d+)?(?:-\d+(?:\.\d+)?)? (?:°[CF]|mph|km\/h|kt|ft|m|in|mm|hPa|inHg|%|oz|mi|km|km²|sq mi)(?![\w²]))/

export const DEFAULT_SETTINGS: Settings = {
  temperature: 'F',
  length: 'ft',
  speed: 'mph',
  clock: '12h',
  homeLakeSlug: null,
}

/** Display formats in the user's units: SI comes in, the angler's units go out. */
export function makeFormat(s: Settings = DEFAULT_SETTINGS) {
  const speed = { mph: [msToMph, 'mph'], kmh: [msToKmh, 'km/h'], knots: [msToKnots, 'kt'] } as const
  const [toSpeed, speedUnit] = speed[s.speed]
  /** A change in temperature (no offset between scales). */
  const tempChange = (c: number) =>
    s.temperature === 'F' ? `${((c * 9) / 5).toFixed(1)} °F` : `${c.toFixed(1)} °C`
  const lengthOf = (m: number) => (s.length === 'ft' ? mToFt(m) : m)
  /** Whole numbers, or a tenth beside a wind limit (see windFigure): the level and the figure agree. */
  const speedText = (ms: number) => `${windFigure(ms, toSpeed)} ${speedUnit}`
  const lengthText = (m: number) => `${lengthOf(m).toFixed(1)} ${s.length}`
  const imperial = s.length === 'ft'
  /** Pressure follows lengths: inches of mercury with feet, hectopascals with metres. */
  const toPressure = (hPa: number) => (imperial ? hPa / HPA_PER_INHG : hPa)
  const pressureUnit = imperial ? 'inHg' : 'hPa'
  const pressureDigits = imperial ? 2 : 0
  const cautionUnits: CautionUnits = {
    speed: speedText,
    length: lengthText,
    // A tenth of a degree, as cautions are judged: 49.8 °F reads as a warning, 50.0 °F not.
    temp: (c) => (s.temperature === 'F' ? `${cToF(c).toFixed(1)} °F` : `${c.toFixed(1)} °C`),
    limit: {
      speed: (ms) => `${short(toSpeed(ms))} ${speedUnit}`,
      length: (m) => `${short(lengthOf(m))} ${s.length}`,
      tempF: (f) => (s.temperature === 'F' ? `${short(f)} °F` : `${short(limitC(f))} °C`),
    },
  }
  return {
    settings: s,
    tempUnit: s.temperature === 'F' ? '°F' : '°C',
    lengthUnit: s.length,
    speedUnit,
    toTemp: (c: number) => (s.temperature === 'F' ? cToF(c) : c),
    toLength: lengthOf,
    /** A length typed in the angler's unit, back to metres. */
    fromLength: (x: number) => (s.length === 'ft' ? ftToM(x) : x),
    toSpeed: (ms: number) => toSpeed(ms),
    temp: (c: number) =>
      s.temperature === 'F' ? `${Math.round(cToF(c))} °F` : `${c.toFixed(1)} °C`,
    tempChange,
    /** A temperature trend per day: "warming 1.2 °F/day", "steady" below 0.1 °C a day. */
    tempTrend: (perDay: number | null) =>
      perDay === null
        ? 'trend unknown'
        : Math.abs(perDay) < 0.1
          ? 'steady'
          : `${perDay > 0 ? 'warming' : 'cooling'} ${tempChange(Math.abs(perDay))}/day`,
    length: lengthText,
    /** A wave height to the tenth of a metre the cautions judge it at: 0.58 m reads as 2.0 ft. */
    wave: (m: number) => lengthText(Math.round(m * 10) / 10),
    signedLength: (m: number) => signed(lengthOf(m), 1, s.length),
    /** Longer distances (fetch): miles with feet, kilometres with metres. */
    distance: (m: number) =>
      s.length === 'ft' ? `${(m / M_PER_MI).toFixed(1)} mi` : `${(m / 1000).toFixed(1)} km`,
    speed: speedText,
    /** Sea-level pressure: "30.01 inHg" or "1016 hPa". */
    pressure: (hPa: number) => `${toPressure(hPa).toFixed(pressureDigits)} ${pressureUnit}`,
    /** A change of pressure: "+0.04 inHg" or "+1.2 hPa". */
    pressureChange: (hPa: number) => signed(toPressure(hPa), imperial ? 2 : 1, pressureUnit),
    /** A caution's headline, message and source in these units. */
    caution: (c: Parameters<typeof cautionWords>[0]) => cautionWords(c, cautionUnits),
    /** The verdict of some cautions, its reasons in these units. */
    verdict: (cautions: Parameters<typeof cautionWords>[0][]) =>
      verdictOf(cautions.map((c) => ({ ...c, ...cautionWords(c, cautionUnits) }))),
    from: (deg: number) => `from ${compassName(deg)}`,
    /** A lake's area: square miles or square kilometres. */
    area: (km2: number) =>
      s.length === 'ft' ? `${(km2 / KM2_PER_SQ_MI).toFixed(1)} sq mi` : `${km2.toFixed(1)} km²`,
    /** Rain: inches to the hundredth, or millimetres. */
    rain: (mm: number) =>
      s.length === 'ft' ? `${(mm / MM_PER_IN).toFixed(2)} in` : `${Math.round(mm)} mm`,
    rainUnit: s.length === 'ft' ? 'in' : 'mm',
    toRain: (mm: number) => (s.length === 'ft' ? mm / MM_PER_IN : mm),
    /** Measurements inside the engine's words, restated in these units. */
    prose: (text: string) => unitsInText(text, s),
    hourCycle: s.clock === '24h' ? ('h23' as const) : ('h12' as const),
    /** An hour of a chart's axis: "14:00" or "2 PM". */
    hour: (iso: string, timeZone: string) =>
      dateTimeFormat({
        timeZone,
        hour: 'numeric',
        ...(s.clock === '24h' ? { minute: '2-digit', hourCycle: 'h23' } : { hourCycle: 'h12' }),
      }).format(new Date(iso)),
    /**
     * The local day of an instant against today at the lake: "today", "yesterday", "tomorrow",
     * else "on Tue, Mar 10".
     */
    day: (iso: string, timeZone: string, now: Date = new Date()) => {
      const date = localDate(new Date(iso), timeZone)
      const today = localDate(now, timeZone)
      if (date === today) return 'today'
      if (date === addDays(today, -1)) return 'yesterday'
      if (date === addDays(today, 1)) return 'tomorrow'
      return `on ${dateLabel(date)}`
    },
    time: (iso: string | null, timeZone: string) =>
      iso
        ? dateTimeFormat({
            timeZone,
            hour: 'numeric',
            minute: '2-digit',
            hourCycle: s.clock === '24h' ? 'h23' : 'h12',
          }).format(new Date(iso))
        : '—',
    /** A date and time in this clock: "Mar 10, 2:05 PM" or "Mar 10, 14:05" (the browser's zone when none). */
    dateTime: (iso: string, timeZone?: string) =>
      dateTimeFormat({
        ...(timeZone ? { timeZone } : {}),
        year: 'numeric',
        month: 'short',
        day: 'numeric',
        hour: 'numeric',
        minute: '2-digit',
        hourCycle: s.clock === '24h' ? 'h23' : 'h12',
      }).format(new Date(iso)),
    age,
  }
}
export type Format = ReturnType<typeof makeFormat>
