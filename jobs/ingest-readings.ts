import { ingestReadings, type IngestDeps } from '../server/features/ingest/readings.ingest'
import type { JobSlot } from '../server/db/job-lock'
import { runFromCli } from './cli'
import { ingestThenRefresh } from './ingest-then-refresh'

/** Every 15 minutes: gauge readings since each datastream's high-water mark. */
export const INGEST_READINGS_CRON = '*/15 * * * *'

export function runIngestReadings(deps: IngestDeps, slot?: JobSlot) {
  return ingestThenRefresh(deps, 'ingest-readings', () => ingestReadings(deps), slot)
}

runFromCli(import.meta.url, (ctx) => runIngestReadings(ctx))
