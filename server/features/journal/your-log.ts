import { and, inArray, isNotNull, sql } from 'drizzle-orm'
import type { LogCatch } from '../../../shared/journal/feedback'
import type { Db } from '../../db/index'
import { catches } from '../../db/schema/index'

// The conditions and lure are jsonb: their keys are read with the `sql` tag, the rest is the builder's.
const clarityClass = sql<LogCatch['clarity']>`${catches.conditions}->'clarity'->>'class'`
const phase = sql<LogCatch['phase']>`${catches.conditions}->>'phase'`
const LOG_COLUMNS = {
  userId: catches.userId,
  clarity: clarityClass,
  // node-postgres reads a float8 as a number.
  waterC: sql<number | null>`(${catches.conditions}->>'waterC')::float8`,
  phase,
  timeOfDay: sql<string | null>`${catches.conditions}->>'timeOfDay'`,
  family: sql<string>`${catches.lure}->>'family'`,
  blade: sql<LogCatch['blade']>`${catches.lure}->>'blade'`,
}

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
  const rows = await db
    .select(LOG_COLUMNS)
    .from(catches)
    .where(
      and(
        inArray(catches.userId, userIds),
        only
          ? and(sql`${clarityClass} = ${only.clarity}`, sql`${phase} = ${only.phase}`)
          : isNotNull(catches.conditions),
      ),
    )
  for (const { userId, ...c } of rows) {
    const list = byUser.get(userId) ?? []
    list.push(c)
    byUser.set(userId, list)
  }
  return byUser
}
