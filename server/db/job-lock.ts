import type { Db } from './index'
import type { Logger } from '../logger'

/**
 * Runs `fn` only if no other process holds the job's PostgreSQL advisory lock; a second runner
 * skips and says so. The lock belongs to one pooled session, so a killed runner releases it.
 */
export async function withJobLock<T>(
  db: Db,
  job: string,
  log: Logger,
  fn: () => Promise<T>,
): Promise<{ skipped: true } | { skipped: false; result: T }> {
  const client = await db.$client.connect()
  try {
    const { rows } = await client.query<{ ok: boolean }>(
      'select pg_try_advisory_lock(hashtext($1)) as ok',
      [job],
    )
    if (!rows[0]?.ok) {
      log.info({ job }, 'another runner holds the lock; skipping this run')
      return { skipped: true }
    }
    try {
      return { skipped: false, result: await fn() }
    } finally {
      await client.query('select pg_advisory_unlock(hashtext($1))', [job])
    }
  } finally {
    client.release()
  }
}
