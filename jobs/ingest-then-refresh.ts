import type { Db } from '../server/db/index'
import { conditionsFor } from '../server/features/conditions/conditions.service'
import { withJobLock, type JobSlot } from '../server/db/job-lock'
import type { Logger } from '../server/logger'

/**
 * An ingest under its job lock, then every lake's read and days recomputed from what it stored:
 * every page view reads what the refresh computes, once per lake, after each ingest.
 */
export function ingestThenRefresh<T>(
  deps: { db: Db; log: Logger; now?: () => Date },
  job: string,
  ingest: () => Promise<T>,
  slot?: JobSlot,
) {
  return withJobLock(
    deps.db,
    job,
    deps.log,
    async () => {
      const summary = await ingest()
      await conditionsFor(deps.db).refreshAll(deps.now?.())
      return summary
    },
    slot,
  )
}
