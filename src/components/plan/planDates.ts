import { PLAN_DAYS } from '@shared/conditions/day-plan'
import { addDays, dateLabel } from '@shared/time'

/** The dates the server plans when today at the lake is `today`: yesterday through the forecast. */
export function plannableDates(today: string): string[] {
  return Array.from({ length: PLAN_DAYS + 1 }, (_, i) => addDays(today, i - 1))
}

const DATE = /^(\d{4})-(\d{2})-(\d{2})$/
const dayNumber = (y: number, m: number, d: number) => Date.UTC(y, m - 1, d) / 86_400_000

/**
 * A date against today, as a person would say it: "yesterday", "in 9 days", "next month",
 * "in March 2027". Null when `date` is not a calendar date at all.
 */
export function whenIs(date: string, today: string): string | null {
  const a = DATE.exec(date)
  const b = DATE.exec(today)
  if (!a || !b) return null
  const [y, m, d] = a.slice(1).map(Number) as [number, number, number]
  const [ty, tm, td] = b.slice(1).map(Number) as [number, number, number]
  const at = new Date(Date.UTC(y, m - 1, d))
  if (at.getUTCMonth() !== m - 1 || at.getUTCDate() !== d) return null
  const days = dayNumber(y, m, d) - dayNumber(ty, tm, td)
  if (days === 0) return 'today'
  if (days === -1) return 'yesterday'
  if (days === 1) return 'tomorrow'
  if (Math.abs(days) < 14) return days < 0 ? `${-days} days ago` : `in ${days} days`
  const months = y * 12 + m - (ty * 12 + tm)
  if (months === 0) return days < 0 ? 'earlier this month' : 'later this month'
  if (months === -1) return 'last month'
  if (months === 1) return 'next month'
  const month = at.toLocaleString('en-US', { month: 'long', year: 'numeric', timeZone: 'UTC' })
  return days < 0 ? `back in ${month}` : `in ${month}`
}

/** Why a date has no plan, in one sentence: "Sunday, March 1 was 9 days ago." */
export function outsideSentence(date: string, today: string): string {
  const when = whenIs(date, today)
  if (when === null) return `“${date}” is not a date.`
  return `${dateLabel(date, 'long')} ${date < today ? 'was' : 'is'} ${when}.`
}
