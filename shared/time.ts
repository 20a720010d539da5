import { DomainError } from './errors'

const DAY_MS = 86_400_000

/** One Intl.DateTimeFormat (en-US) per set of options: building one costs far more than using it. */
const formats = new Map<string, Intl.DateTimeFormat>()
export function dateTimeFormat(options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = JSON.stringify(options)
  let format = formats.get(key)
  if (!format) {
    format = new Intl.DateTimeFormat('en-US', options)
    formats.set(key, format)
  }
  return format
}

const formatterFor = (timeZone: string) =>
  dateTimeFormat({
    timeZone,
    hourCycle: 'h23',
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
    second: '2-digit',
  })

/** A calendar date (YYYY-MM-DD) in words: "Tue, Mar 10", or "Tuesday, March 10" when long. */
export function dateLabel(date: string, style: 'short' | 'long' = 'short'): string {
  const [y, m, d] = assertDate(date)
  return dateTimeFormat({
    weekday: style,
    month: style,
    day: 'numeric',
    timeZone: 'UTC',
  }).format(new Date(Date.UTC(y, m - 1, d, 12)))
}

/** Offset of `timeZone` from UTC at `instant`, in milliseconds (positive east of Greenwich). */
export function zoneOffsetMs(instant: Date, timeZone: string): number {
  const parts = formatterFor(timeZone).formatToParts(instant)
  const get = (type: string) => Number(parts.find((p) => p.type === type)?.value)
  const asUtc = Date.UTC(
    get('year'),
    get('month') - 1,
    get('day'),
    get('hour'),
    get('minute'),
    get('second'),
  )
  return asUtc - Math.floor(instant.getTime() / 1000) * 1000
}

export function assertDate(date: string, field = 'date'): [number, number, number] {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date)
  const parsed = m ? new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]))) : null
  if (!m || !parsed || parsed.toISOString().slice(0, 10) !== date) {
    throw new DomainError(
      'invalid_date',
      `${field} must be a calendar date as YYYY-MM-DD, got ${date}.`,
      field,
    )
  }
  return [Number(m[1]), Number(m[2]), Number(m[3])]
}

/** The UTC instant of local midnight starting `date` in `timeZone` (DST-safe). */
export function zonedMidnight(date: string, timeZone: string): Date {
  const [y, mo, d] = assertDate(date)
  const guess = Date.UTC(y, mo - 1, d)
  let t = guess - zoneOffsetMs(new Date(guess), timeZone)
  // A second pass settles days whose offset differs at midnight from the first guess.
  t = guess - zoneOffsetMs(new Date(t), timeZone)
  return new Date(t)
}

/** [start, end) of the local calendar day as UTC instants; 23 or 25 hours long on DST days. */
export function localDayBounds(date: string, timeZone: string): [Date, Date] {
  return [zonedMidnight(date, timeZone), zonedMidnight(addDays(date, 1), timeZone)]
}

export function addDays(date: string, days: number): string {
  const [y, m, d] = assertDate(date)
  return new Date(Date.UTC(y, m - 1, d + days)).toISOString().slice(0, 10)
}

/** The local calendar date (YYYY-MM-DD) of an instant in a time zone. */
export function localDate(instant: Date, timeZone: string): string {
  return new Date(instant.getTime() + zoneOffsetMs(instant, timeZone)).toISOString().slice(0, 10)
}

export function toInstant(at: string | Date, field = 'at'): Date {
  const d = at instanceof Date ? at : new Date(at)
  if (Number.isNaN(d.getTime()))
    throw new DomainError('invalid_date', `${field} is not a valid instant: ${String(at)}.`, field)
  return d
}

/** An instant as ISO 8601 text, or null when there is none. */
export const isoOrNull = (d: Date | null | undefined): string | null => (d ? d.toISOString() : null)

export const HOUR_MS = 3_600_000
export { DAY_MS }

/** Whether the runtime knows `timeZone` as an IANA zone name ("America/Chicago", "UTC"). */
export function isTimeZone(timeZone: string): boolean {
  try {
    dateTimeFormat({ timeZone })
    return true
  } catch {
    return false
  }
}

/** The zone's short name on a local date, as clocks there read it ("CDT", "GMT+10"). */
export function zoneAbbreviation(date: string, timeZone: string): string {
  const [y, m, d] = assertDate(date)
  const parts = dateTimeFormat({ timeZone, timeZoneName: 'short' }).formatToParts(
    new Date(Date.UTC(y, m - 1, d, 12)),
  )
  return parts.find((p) => p.type === 'timeZoneName')?.value ?? timeZone
}
