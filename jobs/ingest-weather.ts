import { ingestWeather, type WeatherDeps } from '../server/features/ingest/weather.ingest'
import type { JobSlot } from '../server/db/job-lock'
import { runFromCli } from './cli'
import { ingestThenRefresh } from './ingest-then-refresh'

/** Hourly, a few minutes past: observations since the last and the latest 7-day forecast. */
export const INGEST_WEATHER_CRON = '5 * * * *'

export function runIngestWeather(deps: WeatherDeps, slot?: JobSlot) {
  return ingestThenRefresh(deps, 'ingest-weather', () => ingestWeather(deps), slot)
}

runFromCli(import.meta.url, (ctx) => runIngestWeather(ctx))
