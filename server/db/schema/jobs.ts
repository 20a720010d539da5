import { integer, pgTable, primaryKey, text, timestamp } from 'drizzle-orm/pg-core'

/**
 * One row per scheduled run of a job (its name and the time the schedule named), written by
 * `withJobLock` under the job's lock: a run whose row is finished is not done again by another
 * instance whose clock fired a moment later, and one left unfinished by a runner that died is
 * taken over by the next instance to get the lock.
 */
export const jobRuns = pgTable(
  'job_runs',
  {
    job: text().notNull(),
    slot: timestamp({ withTimezone: true }).notNull(),
    /** host:pid of the process that took it last. */
    runner: text().notNull(),
    /** 1 for the first runner; more when a runner died and another took the run over. */
    attempts: integer().notNull().default(1),
    startedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    finishedAt: timestamp({ withTimezone: true }),
  },
  (t) => [primaryKey({ columns: [t.job, t.slot] })],
)
