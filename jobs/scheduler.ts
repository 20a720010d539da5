import cron from 'node-cron'
import type { Logger } from '../server/logger'
import { INGEST_READINGS_CRON, runIngestReadings } from './ingest-readings'
import { INGEST_WEATHER_CRON, runIngestWeather } from './ingest-weather'
import type { JobContext } from './cli'
import { runCheckWatches } from './check-watches'
import { runRecomputeBanks } from './recompute-banks'
import { runSendBriefs, SEND_BRIEFS_CRON } from './send-briefs'

/**
 * The in-process schedule, after one run at start of the jobs that bring stored rows up to this
 * version of the app (`recompute-banks`). Every instance may run it: each job takes a PostgreSQL
 * advisory lock, so only one instance does the work of a given run.
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
  // Watches are judged after each refresh of the lakes' days, which each ingest ends with.
  const thenWatches = async (ingest: () => Promise<unknown>) => ({
    ingest: await ingest(),
    watches: await runCheckWatches(ctx),
  })
  const jobs: [string, string, () => Promise<unknown>][] = [
    ['ingest-readings', INGEST_READINGS_CRON, () => thenWatches(() => runIngestReadings(ctx))],
    ['ingest-weather', INGEST_WEATHER_CRON, () => thenWatches(() => runIngestWeather(ctx))],
    ['send-briefs', SEND_BRIEFS_CRON, () => runSendBriefs(ctx)],
  ]
  void guarded('recompute-banks', ctx.log, () => runRecomputeBanks(ctx))()
  const tasks = jobs.map(([name, expression, run]) =>
    cron.schedule(expression, guarded(name, ctx.log, run), { name, noOverlap: true }),
  )
  return {
    stop: async () => {
      for (const task of tasks) await task.stop()
      await Promise.all(running)
    },
  }
}
