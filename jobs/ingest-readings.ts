import { withJobLock } from '../server/features/ingest/job-lock'
import { ingestReadings, type IngestDeps } from '../server/features/ingest/readings.ingest'
import { runFromCli } from './cli'

/** Every 15 minutes: gauge readings since each datastream's high-water mark. */
export const INGEST_READINGS_CRON = '*/15 * * * *'

export function runIngestReadings(deps: IngestDeps) {
  return withJobLock(deps.db, 'ingest-readings', deps.log, () => ingestReadings(deps))
}

runFromCli(import.meta.url, (ctx) => runIngestReadings(ctx))
