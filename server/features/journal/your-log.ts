import type { LogCatch } from '../../../shared/journal/feedback'
import type { Db } from '../../db/index'

const LOG_SELECT = `select user_id as "userId",
    conditions->'clarity'->>'class' as clarity,
    (conditions->>'waterC')::float8 as "waterC",
    conditions->>'phase' as phase,
    conditions->>'timeOfDay' as "timeOfDay",
    lure->>'family' as family,
    lure->>'blade' as blade
  from catches`

/**
 * What the Day plan and the brief need of anglers' logs: each catch's clarity, water, phase, time
 * of day and lure, by angler. With a clarity and phase given, only catches in them are read.
 */
export async function logCatches(
  db: Db,
  userIds: string[],
  only?: { clarity: string; phase: string },
): Promise<Map<string, LogCatch[]>> {
  const byUser = new Map<string, LogCatch[]>()
  if (!userIds.length) return byUser
  const { rows } = await db.$client.query<LogCatch & { userId: string }>(
    only
      ? {
          name: 'journal_log_similar',
          text: `${LOG_SELECT} where user_id = any($1::uuid[])
            and conditions->'clarity'->>'class' = $2 and conditions->>'phase' = $3`,
          values: [userIds, only.clarity, only.phase],
        }
      : {
          name: 'journal_log_all',
          text: `${LOG_SELECT} where user_id = any($1::uuid[]) and conditions is not null`,
          values: [userIds],
        },
  )
  for (const { userId, ...c } of rows) {
    const list = byUser.get(userId) ?? []
    list.push(c)
    byUser.set(userId, list)
  }
  return byUser
}
