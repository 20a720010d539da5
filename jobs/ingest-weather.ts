import { withJobLock } from '../server/features/ingest/job-lock'
import { ingestWeather, type WeatherDeps } from '../server/features/ingest/weather.ingest'
import { conditionsFor } from '../server/features/conditions/conditions.service'
import { runFromCli } from './cli'

/** Hourly, a few minutes past: observations since the last and the latest 7-day forecast. */
export const INGEST_WEATHER_CRON = '5 * * * *'

export function runIngestWeather(deps: WeatherDeps) {
  return withJobLock(deps.db, 'ingest-weather', deps.log, async () => {
    const summary = await ingestWeather(deps)
    // Every page view reads what this computes, once per lake, after each ingest.
    await conditionsFor(deps.db).refreshAll(deps.now?.())
    return summary
  })
}

runFromCli(import.meta.url, (ctx) => runIngestWeather(ctx))
