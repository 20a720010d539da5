import { compassName } from './conditions/exposure'
import { cautionWords, verdictOf, type CautionUnits } from './conditions/safety'
import { quantitiesIn } from './quantities'
import type { Settings } from './schemas/settings'
import { dateTimeFormat } from './time'
import { cToF, ftToM, mToFt, msToKmh, msToKnots, msToMph } from './units'

/** "12 min ago", "3 h ago": how old a reading is. */
export function age(iso: string, now = Date.now()): string {
  const min = Math.max(0, Math.round((now - Date.parse(iso)) / 60_000))
  if (min < 90) return `${min} min ago`
  return min < 2880 ? `${Math.round(min / 60)} h ago` : `${Math.round(min / 1440)} days ago`
}

/** What a user sees before choosing (and while signed out). */
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
  const speedText = (ms: number) => `${Math.round(toSpeed(ms))} ${speedUnit}`
  const lengthText = (m: number) => `${lengthOf(m).toFixed(1)} ${s.length}`
  const cautionUnits: CautionUnits = {
    speed: speedText,
    length: lengthText,
    // A tenth of a degree, as cautions are judged: 49.8 °F reads as a warning, 50.0 °F not.
    temp: (c) => (s.temperature === 'F' ? `${cToF(c).toFixed(1)} °F` : `${c.toFixed(1)} °C`),
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
    signedLength: (m: number) =>
      `${m >= 0 ? '+' : '−'}${Math.abs(lengthOf(m)).toFixed(1)} ${s.length}`,
    /** Longer distances (fetch): miles with feet, kilometres with metres. */
    distance: (m: number) =>
      s.length === 'ft' ? `${(m / 1609.344).toFixed(1)} mi` : `${(m / 1000).toFixed(1)} km`,
    speed: speedText,
    /** A caution's headline and message in these units. */
    caution: (c: Parameters<typeof cautionWords>[0]) => cautionWords(c, cautionUnits),
    /** The verdict of some cautions, its reasons in these units. */
    verdict: (cautions: Parameters<typeof cautionWords>[0][]) =>
      verdictOf(cautions.map((c) => ({ ...c, ...cautionWords(c, cautionUnits) }))),
    /** The quantities in a rule's wording (tackle reasons, sizes) in these units. */
    quantities: (text: string) => quantitiesIn(text, s),
    from: (deg: number) => `from ${compassName(deg)}`,
    time: (iso: string | null, timeZone: string) =>
      iso
        ? dateTimeFormat({
            timeZone,
            hour: 'numeric',
            minute: '2-digit',
            hourCycle: s.clock === '24h' ? 'h23' : 'h12',
          }).format(new Date(iso))
        : '—',
    age,
  }
}
export type Format = ReturnType<typeof makeFormat>
