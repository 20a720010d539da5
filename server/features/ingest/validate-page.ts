import { plausibility, toSi, type Parameter, type Rejection } from '../../../shared/readings'
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

type Parsed = { obs: Observation; t: number }

/** A reading in SI, or why it is rejected: unknown unit, out of range, rate of change. */
function judge(
  parameter: Parameter,
  unit: string,
  result: number,
  at: Date,
  previous?: { value: number; at: Date },
): { si: number } | Rejection {
  const si = toSi(parameter, result, unit)
  if (si === null)
    return { reason: 'unknown_unit', detail: `no conversion from ${unit} for ${parameter}` }
  return plausibility(parameter, si, at, previous) ?? { si }
}

/**
 * Sorts a page by time, drops exact repeats, and splits it into good rows (in SI) and rows for
 * quarantine with their reason: malformed, unknown unit, out of range, rate of change, or a
 * second value for a time already seen. Plain loops: this runs for every row the feed sends.
 */
export function validatePage(
  parameter: Parameter,
  unit: string,
  rows: unknown[],
  previous?: { value: number; at: Date },
): PageVerdict {
  const bad: QuarantineRow[] = []
  const parsed: Parsed[] = []
  for (let i = 0; i < rows.length; i++) {
    const raw = rows[i]
    const obs = Observation.safeParse(raw)
    if (obs.success) parsed.push({ obs: obs.data, t: Date.parse(obs.data.phenomenonTime) })
    else {
      const detail = obs.error.issues[0]?.message ?? 'unreadable'
      bad.push({
        feedId: rawId(raw, i),
        observedAt: null,
        raw: raw ?? null,
        reason: 'malformed',
        detail,
      })
    }
  }
  parsed.sort((a, b) => a.t - b.t)

  const good: GoodRow[] = []
  const seen = new Map<number, number>()
  for (const { obs, t } of parsed) {
    const at = new Date(t)
    const earlier = seen.get(t)
    if (earlier === obs.result) continue
    if (earlier === undefined) seen.set(t, obs.result)
    const verdict =
      earlier !== undefined
        ? {
            reason: 'conflicting_duplicate' as const,
            detail: `a second value for ${obs.phenomenonTime}`,
          }
        : judge(parameter, unit, obs.result, at, previous)
    if ('si' in verdict) {
      good.push({ observedAt: at, value: verdict.si, originalValue: obs.result })
      previous = { value: verdict.si, at }
    } else bad.push({ feedId: obs['@iot.id'], observedAt: at, raw: obs, ...verdict })
  }
  const last = parsed.at(-1)
  return { good, bad, latest: last && new Date(last.t), previous }
}
