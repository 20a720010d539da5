import { ingestReadings, type IngestDeps } from '../server/features/ingest/readings.ingest'
import { runFromCli } from './cli'
import { ingestThenRefresh } from './ingest-then-refresh'

/** Every 15 minutes: gauge readings since each datastream's high-water mark. */
export const INGEST_READINGS_CRON = '*/15 * * * *'

export function runIngestReadings(deps: IngestDeps) {
  return ingestThenRefresh(deps, 'ingest-readings', () => ingestReadings(deps))
}

runFromCli(import.meta.url, (ctx) => runIngestReadings(ctx))
