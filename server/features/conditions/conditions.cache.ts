import type { LRUCache } from 'lru-cache'
import type { DayPlanResponse } from '../../../shared/schemas/day-plan'
import type { LakeRead } from '../../../shared/schemas/lake-read'
import { NoticedCache, type Change, type Changes } from '../../db/changes'
import { prepareJson, type PreparedJson } from '../../http/prepared-json'
import type { ConditionsService } from './conditions.service'

/**
 * A Lake read or Day plan kept in memory while change notices are live: its data (the page boot
 * writes it into the page), its JSON ready to send, and what it was made from, as notices name it.
 */
export interface Kept<T> {
  data: T
  answer: PreparedJson
  lakeId: string
  /** The angler a Day plan was made for (their banks, their log). */
  userId?: string
  /** When the clock makes it wrong (a stale flag turns, midnight takes its date out of reach). */
  until: Date | null
}

type KeptCache<T> = NoticedCache<Kept<T>>

/**
 * Drops the kept answers a notice names: a lake's (its row, its read, its days) or an angler's
 * (their banks, their catches), whichever instance or job made the change.
 */
function forgetting<T>(names: Record<string, 'lakeId' | 'userId'>) {
  return (change: Change, kept: LRUCache<string, Kept<T>>) => {
    const field = names[change.table]
    if (!field) return
    const named: string[] = []
    kept.forEach((value, key) => value[field] === change.key && named.push(key))
    for (const key of named) kept.delete(key)
  }
}

/** The kept answer, or a new one when the clock has made it wrong. */
async function current<T>(
  cache: KeptCache<T>,
  key: string,
  now: Date,
  load: () => Promise<Kept<T>>,
): Promise<Kept<T>> {
  const kept = await cache.get(key, load)
  if (!kept.until || now < kept.until) return kept
  cache.delete(key)
  return cache.get(key, load)
}

/**
 * The Lake read and the Day plan as sent: without change notices (or while they are down) made
 * from the database on every view; with them, kept until a notice names what they were made
 * from. Reading the database each time costs the Lake read and the Day plan most of their
 * throughput (`npm run bench -- dashboard`, DEVELOPERS.md "Banks and the conditions cache").
 */
export function conditionsAnswers(conditions: ConditionsService, changes?: Changes) {
  const lake = { lakes: 'lakeId', lake_reads: 'lakeId' } as const
  const reads: KeptCache<LakeRead> = new NoticedCache(
    changes,
    { max: 1_000 },
    forgetting<LakeRead>(lake),
  )
  const plans: KeptCache<DayPlanResponse> = new NoticedCache(
    changes,
    { maxSize: 32 * 2 ** 20, sizeCalculation: (kept) => kept.answer.body.length },
    forgetting<DayPlanResponse>({
      ...lake,
      lake_days: 'lakeId',
      banks: 'userId',
      catches: 'userId',
    }),
  )

  return {
    read: (slug: string, now = new Date()) =>
      current(reads, slug, now, async () => {
        const { lakeId, read, holdsUntil } = await conditions.read(slug, now)
        return { data: read, answer: prepareJson(read), lakeId, until: holdsUntil }
      }),

    plan: (userId: string, slug: string, date: string, now = new Date()) =>
      current(plans, `${userId} ${slug} ${date}`, now, async () => {
        const { lakeId, plan, plannableUntil } = await conditions.plan(userId, slug, date, now)
        return { data: plan, answer: prepareJson(plan), lakeId, userId, until: plannableUntil }
      }),
  }
}
export type ConditionsAnswers = ReturnType<typeof conditionsAnswers>
