import { plausibility, toSi, type Parameter } from '../../../shared/readings'
import { Observation } from './feed.schemas'
import type { GoodRow, QuarantineRow } from './ingest.repo'

export interface PageVerdict {
  good: GoodRow[]
  bad: QuarantineRow[]
  /** Latest phenomenon time on the page, good or bad: how far the job has read. */
  latest?: Date
  /** The last good reading, for judging the next page. */
  previous?: { value: number; at: Date }
}

const rawId = (raw: unknown, i: number) =>
  raw && typeof raw === 'object' && '@iot.id' in raw
    ? String((raw as Record<string, unknown>)['@iot.id'])
    : `unparsed-${i}`

/**
 * Sorts a page by time, drops exact repeats, and splits it into good rows (in SI) and rows for
 * quarantine with their reason: malformed, unknown unit, out of range, rate of change, or a
 * second value for a time already seen.
 */
export function validatePage(
  parameter: Parameter,
  unit: string,
  rows: unknown[],
  previous?: { value: number; at: Date },
): PageVerdict {
  const bad: QuarantineRow[] = []
  const parsed: (Observation & { at: Date })[] = []
  rows.forEach((raw, i) => {
    const obs = Observation.safeParse(raw)
    if (!obs.success) {
      const detail = obs.error.issues[0]?.message ?? 'unreadable'
      bad.push({
        feedId: rawId(raw, i),
        observedAt: null,
        raw: raw ?? null,
        reason: 'malformed',
        detail,
      })
      return
    }
    parsed.push({ ...obs.data, at: new Date(obs.data.phenomenonTime) })
  })
  parsed.sort((a, b) => a.at.getTime() - b.at.getTime())

  const good: GoodRow[] = []
  const seen = new Map<number, number>()
  let latest: Date | undefined
  for (const obs of parsed) {
    const t = obs.at.getTime()
    if (!latest || t > latest.getTime()) latest = obs.at
    const quarantined = (reason: string, detail: string) =>
      bad.push({ feedId: obs['@iot.id'], observedAt: obs.at, raw: obs, reason, detail })
    if (seen.has(t)) {
      if (seen.get(t) !== obs.result)
        quarantined('conflicting_duplicate', `a second value for ${obs.phenomenonTime}`)
      continue
    }
    seen.set(t, obs.result)
    const si = toSi(parameter, obs.result, unit)
    if (si === null) {
      quarantined('unknown_unit', `no conversion from ${unit} for ${parameter}`)
      continue
    }
    const rejection = plausibility(parameter, si, obs.at, previous)
    if (rejection) {
      quarantined(rejection.reason, rejection.detail)
      continue
    }
    good.push({ observedAt: obs.at, value: si, originalValue: obs.result })
    previous = { value: si, at: obs.at }
  }
  return { good, bad, latest, previous }
}
