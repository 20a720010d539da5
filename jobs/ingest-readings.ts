import { withJobLock } from '../server/features/ingest/job-lock'
import { ingestReadings, type IngestDeps } from '../server/features/ingest/readings.ingest'
import { conditionsFor } from '../server/features/conditions/conditions.service'
import { runFromCli } from './cli'

/** Every 15 minutes: gauge readings since each datastream's high-water mark. */
export const INGEST_READINGS_CRON = '*/15 * * * *'

export function runIngestReadings(deps: IngestDeps) {
  return withJobLock(deps.db, 'ingest-readings', deps.log, async () => {
    const summary = await ingestReadings(deps)
    // Every page view reads what this computes, once per lake, after each ingest.
    await conditionsFor(deps.db).refreshAll(deps.now?.())
    return summary
  })
}

runFromCli(import.meta.url, (ctx) => runIngestReadings(ctx))
