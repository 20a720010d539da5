import cron, { type TaskContext } from 'node-cron'
import type { JobSlot } from '../server/db/job-lock'
import type { Logger } from '../server/logger'
import { INGEST_READINGS_CRON, runIngestReadings } from './ingest-readings'
import { INGEST_WEATHER_CRON, runIngestWeather } from './ingest-weather'
import type { JobContext } from './cli'
import { runCheckWatches } from './check-watches'
import { runRecomputeBanks } from './recompute-banks'
import { runSendBriefs, SEND_BRIEFS_CRON } from './send-briefs'

/** Cron expressions (node-cron, an optional seconds field first) to run a job on another schedule. */
export interface JobSchedule {
  ingestReadings?: string
  ingestWeather?: string
  sendBriefs?: string
}

/**
 * The in-process schedule, after one run at start of the jobs that bring stored rows up to this
 * version of the app (`recompute-banks`). Every instance may run it: each run takes the job's
 * PostgreSQL advisory lock and is recorded under its scheduled time (`withJobLock` with a slot),
 * so one instance does the work of a given run, and another finishes it if that one dies.
 */
export function startScheduler(
  ctx: JobContext,
  schedule: JobSchedule = {},
): { stop: () => Promise<void> } {
  // Runs in flight, so that stopping waits for them before the pool under them ends.
  const running = new Set<Promise<void>>()
  // Ends the waits for another instance's runs when the scheduler stops.
  const stopping = new AbortController()
  const guarded =
    (name: string, log: Logger, run: (slot?: JobSlot) => Promise<unknown>) =>
    async (context?: TaskContext) => {
      const done = (async () => {
        try {
          const slot = context && { slot: context.date, signal: stopping.signal }
          log.info({ job: name, slot: slot?.slot, result: await run(slot) }, 'job run')
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
  const jobs: [string, string, (slot?: JobSlot) => Promise<unknown>][] = [
    [
      'ingest-readings',
      schedule.ingestReadings ?? INGEST_READINGS_CRON,
      (slot) => thenWatches(() => runIngestReadings(ctx, slot)),
    ],
    [
      'ingest-weather',
      schedule.ingestWeather ?? INGEST_WEATHER_CRON,
      (slot) => thenWatches(() => runIngestWeather(ctx, slot)),
    ],
    ['send-briefs', schedule.sendBriefs ?? SEND_BRIEFS_CRON, (slot) => runSendBriefs(ctx, slot)],
  ]
  void guarded('recompute-banks', ctx.log, () => runRecomputeBanks(ctx))()
  const tasks = jobs.map(([name, expression, run]) =>
    cron.schedule(expression, guarded(name, ctx.log, run), { name, noOverlap: true }),
  )
  return {
    stop: async () => {
      for (const task of tasks) await task.stop()
      stopping.abort()
      await Promise.all(running)
    },
  }
}
