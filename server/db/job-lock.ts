import { hostname } from 'node:os'
import { setTimeout as sleep } from 'node:timers/promises'
import { and, eq, isNotNull, sql } from 'drizzle-orm'
import { drizzle } from 'drizzle-orm/node-postgres'
import type pg from 'pg'
import type { Db } from './index'
import type { Logger } from '../logger'
import { jobRuns } from './schema/index'

/** A scheduled run: the time the schedule named, the same in every instance. */
export interface JobSlot {
  slot: Date
  /** How long to wait for another instance's run of the same slot before giving up on it. */
  waitMs?: number
  /** How often a waiting instance looks at the lock and at the run's row. */
  pollMs?: number
  /** Stops the waiting (the scheduler stopping). */
  signal?: AbortSignal
}

/** host:pid, written on the runs this process takes. */
export const RUNNER = `${hostname()}:${process.pid}`

const DEFAULT_WAIT_MS = 5 * 60_000
const DEFAULT_POLL_MS = 500

type Outcome<T> = { skipped: true } | { skipped: false; result: T }

/** The job's advisory lock on one pooled session: the lock dies with the connection. */
async function tryLock(db: Db, job: string) {
  const client: pg.PoolClient = await db.$client.connect()
  const session = drizzle({ client })
  try {
    const { rows } = await session.execute<{ ok: boolean }>(
      sql`select pg_try_advisory_lock(hashtext(${job})) as ok`,
    )
    if (rows[0]?.ok) {
      return {
        unlock: async () => {
          try {
            await session.execute(sql`select pg_advisory_unlock(hashtext(${job}))`)
            client.release()
          } catch (err) {
            // The session is gone (a restart, a dropped connection), and the lock with it.
            client.release(err instanceof Error ? err : true)
          }
        },
      }
    }
  } catch (err) {
    client.release(err instanceof Error ? err : true)
    throw err
  }
  client.release()
  return null
}

async function slotFinished(db: Db, job: string, slot: Date) {
  const [row] = await db
    .select({ job: jobRuns.job })
    .from(jobRuns)
    .where(and(eq(jobRuns.job, job), eq(jobRuns.slot, slot), isNotNull(jobRuns.finishedAt)))
  return Boolean(row)
}

/**
 * Runs `fn` only if no other process holds the job's PostgreSQL advisory lock. The lock belongs to
 * one pooled session, so a killed runner releases it the moment its connection drops.
 *
 * Without a slot (a run from the command line) a second runner skips and says so. With one (the
 * scheduler's runs, which every instance fires at the same moment), the run is recorded in
 * `job_runs`: an instance that finds the lock held waits, and skips once the holder has finished
 * that slot; if the holder died first, the next instance to get the lock runs the slot again, and
 * one that gets the lock after the slot was finished (a clock that fired late) does nothing.
 */
export async function withJobLock<T>(
  db: Db,
  job: string,
  log: Logger,
  fn: () => Promise<T>,
  slot?: JobSlot,
): Promise<Outcome<T>> {
  const deadline = Date.now() + (slot?.waitMs ?? DEFAULT_WAIT_MS)
  for (;;) {
    const lock = await tryLock(db, job)
    if (lock) {
      try {
        if (!slot) return { skipped: false, result: await fn() }
        if (await slotFinished(db, job, slot.slot)) {
          log.info({ job, slot: slot.slot }, 'another runner did this run; skipping it')
          return { skipped: true }
        }
        await db
          .insert(jobRuns)
          .values({ job, slot: slot.slot, runner: RUNNER })
          .onConflictDoUpdate({
            target: [jobRuns.job, jobRuns.slot],
            set: { runner: RUNNER, attempts: sql`${jobRuns.attempts} + 1`, startedAt: new Date() },
          })
        const result = await fn()
        await db
          .update(jobRuns)
          .set({ finishedAt: new Date() })
          .where(and(eq(jobRuns.job, job), eq(jobRuns.slot, slot.slot)))
        return { skipped: false, result }
      } finally {
        await lock.unlock()
      }
    }
    if (!slot) {
      log.info({ job }, 'another runner holds the lock; skipping this run')
      return { skipped: true }
    }
    if (await slotFinished(db, job, slot.slot)) return { skipped: true }
    if (slot.signal?.aborted) return { skipped: true }
    if (Date.now() > deadline) {
      log.warn({ job, slot: slot.slot }, 'another runner still holds the lock; giving up this run')
      return { skipped: true }
    }
    await sleep(slot.pollMs ?? DEFAULT_POLL_MS, undefined, { signal: slot.signal }).catch(
      () => undefined,
    )
  }
}
