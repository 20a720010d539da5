import { setTimeout as sleep } from 'node:timers/promises'
import { eq } from 'drizzle-orm'
import pg from 'pg'
import { pino } from 'pino'
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { RUNNER, withJobLock } from '../../server/db/job-lock'
import { jobRuns } from '../../server/db/schema/index'
import { loadEnv } from '../../server/env'
import { createTestDb } from '../helpers/db'

let ctx: Awaited<ReturnType<typeof createTestDb>>
const log = pino({ level: 'silent' })
const FAST = { pollMs: 20, waitMs: 10_000 }

beforeAll(async () => {
  ctx = await createTestDb()
})
afterAll(async () => {
  await ctx.drop()
})
beforeEach(async () => {
  await ctx.db.delete(jobRuns)
})

/** Counts calls, each lasting `ms`. */
function work(ms: number) {
  const calls = { n: 0 }
  const fn = async () => {
    calls.n++
    await sleep(ms)
    return calls.n
  }
  return { calls, fn }
}

describe('withJobLock with a slot (the scheduler in every instance)', () => {
  it('runs a slot once when two instances fire it together: the second waits and skips', async () => {
    const slot = new Date('2026-06-01T10:15:00Z')
    const { calls, fn } = work(150)
    const runs = await Promise.all([
      withJobLock(ctx.db, 'job-a', log, fn, { slot, ...FAST }),
      withJobLock(ctx.db, 'job-a', log, fn, { slot, ...FAST }),
    ])
    expect(calls.n).toBe(1)
    expect(runs.map((r) => r.skipped).sort()).toEqual([false, true])
    const [row] = await ctx.db.select().from(jobRuns).where(eq(jobRuns.job, 'job-a'))
    expect(row).toMatchObject({ slot, runner: RUNNER, attempts: 1 })
    expect(row!.finishedAt).toBeInstanceOf(Date)
  })

  it('skips a slot another instance finished before this one fired, and runs the next slot', async () => {
    const slot = new Date('2026-06-01T10:30:00Z')
    const { calls, fn } = work(0)
    expect(await withJobLock(ctx.db, 'job-b', log, fn, { slot, ...FAST })).toMatchObject({
      skipped: false,
    })
    expect(await withJobLock(ctx.db, 'job-b', log, fn, { slot, ...FAST })).toEqual({
      skipped: true,
    })
    const next = new Date('2026-06-01T10:45:00Z')
    expect(await withJobLock(ctx.db, 'job-b', log, fn, { slot: next, ...FAST })).toMatchObject({
      skipped: false,
    })
    expect(calls.n).toBe(2)
  })

  it('takes over the slot of a runner whose connection died with the run unfinished', async () => {
    const slot = new Date('2026-06-01T11:00:00Z')
    // Another instance: it holds the lock on its own session and has started the slot.
    const dying = new pg.Client({ connectionString: ctx.url })
    await dying.connect()
    await dying.query('select pg_advisory_lock(hashtext($1))', ['job-c'])
    await ctx.db.insert(jobRuns).values({ job: 'job-c', slot, runner: 'elsewhere:1' })
    const { calls, fn } = work(0)
    const waiting = withJobLock(ctx.db, 'job-c', log, fn, { slot, ...FAST })
    await sleep(100)
    expect(calls.n).toBe(0)
    // The process is killed: PostgreSQL ends its session, and its advisory lock with it.
    await dying.end()
    expect(await waiting).toEqual({ skipped: false, result: 1 })
    const [row] = await ctx.db.select().from(jobRuns).where(eq(jobRuns.job, 'job-c'))
    expect(row).toMatchObject({ runner: RUNNER, attempts: 2 })
    expect(row!.finishedAt).toBeInstanceOf(Date)
  })

  it('stops waiting when the scheduler stops', async () => {
    const slot = new Date('2026-06-01T11:15:00Z')
    const holder = new pg.Client({ connectionString: ctx.url })
    await holder.connect()
    try {
      await holder.query('select pg_advisory_lock(hashtext($1))', ['job-d'])
      const stopping = new AbortController()
      const { calls, fn } = work(0)
      const waiting = withJobLock(ctx.db, 'job-d', log, fn, {
        slot,
        ...FAST,
        signal: stopping.signal,
      })
      await sleep(60)
      stopping.abort()
      expect(await waiting).toEqual({ skipped: true })
      expect(calls.n).toBe(0)
    } finally {
      await holder.end()
    }
  })

  it('without a slot (a run from the command line), skips at once while another holds the lock', async () => {
    const { calls, fn } = work(100)
    const runs = await Promise.all([
      withJobLock(ctx.db, 'job-e', log, fn),
      withJobLock(ctx.db, 'job-e', log, fn),
    ])
    expect(calls.n).toBe(1)
    expect(runs.map((r) => r.skipped).sort()).toEqual([false, true])
    expect(await ctx.db.select().from(jobRuns)).toEqual([])
  })
})

describe('job schedules from the environment', () => {
  it('takes cron expressions with or without seconds and refuses anything else by name', () => {
    const env = loadEnv({ INGEST_READINGS_CRON: '*/4 * * * * *', SEND_BRIEFS_CRON: '*/5 * * * *' })
    expect(env.INGEST_READINGS_CRON).toBe('*/4 * * * * *')
    expect(() => loadEnv({ SEND_BRIEFS_CRON: 'every five minutes' })).toThrow(/SEND_BRIEFS_CRON/)
  })
})
