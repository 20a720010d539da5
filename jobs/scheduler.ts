import cron from 'node-cron'
import type { Logger } from '../server/logger'
import { INGEST_READINGS_CRON, runIngestReadings } from './ingest-readings'
import { INGEST_WEATHER_CRON, runIngestWeather } from './ingest-weather'
import type { JobContext } from './cli'

/**
 * The in-process schedule. Every instance may run it: each job takes a PostgreSQL advisory lock,
 * so only one instance does the work of a given run.
 */
export function startScheduler(ctx: JobContext): { stop: () => Promise<void> } {
  // Runs in flight, so that stopping waits for them before the pool under them ends.
  const running = new Set<Promise<void>>()
  const guarded = (name: string, log: Logger, run: () => Promise<unknown>) => async () => {
    const done = (async () => {
      try {
        log.info({ job: name, result: await run() }, 'job run')
      } catch (err) {
        log.error({ job: name, err }, 'job run failed')
      }
    })()
    running.add(done)
    await done
    running.delete(done)
  }
  const tasks = [
    cron.schedule(
      INGEST_READINGS_CRON,
      guarded('ingest-readings', ctx.log, () => runIngestReadings(ctx)),
      {
        name: 'ingest-readings',
        noOverlap: true,
      },
    ),
    cron.schedule(
      INGEST_WEATHER_CRON,
      guarded('ingest-weather', ctx.log, () => runIngestWeather(ctx)),
      {
        name: 'ingest-weather',
        noOverlap: true,
      },
    ),
  ]
  return {
    stop: async () => {
      for (const task of tasks) await task.stop()
      await Promise.all(running)
    },
  }
}
