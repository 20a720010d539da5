import { spawn } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { lakes } from '../../../server/db/schema/index'
import { seedDemo } from '../../../server/db/seed/index'
import { backfillReadings } from '../../../server/features/ingest/readings.ingest'
import { createTestDb } from '../../helpers/db'
import {
  countReadings,
  ingestDeps,
  readingRows,
  startTestFeed,
  type TestFeed,
} from '../../helpers/feed'

const root = fileURLToPath(new URL('../../..', import.meta.url))
const UNTIL = '2026-04-10T12:00:00Z'
let feed: TestFeed

beforeAll(async () => {
  feed = await startTestFeed(UNTIL)
})
afterAll(() => feed.close())

async function freshDb() {
  const ctx = await createTestDb()
  await seedDemo(ctx.db)
  const [lake] = await ctx.db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
  return { ...ctx, lakeId: lake!.id }
}

describe('an ingest process killed mid-run', () => {
  it('ends, after a rerun, with the same table as one clean run', { timeout: 60_000 }, async () => {
    const clean = await freshDb()
    await backfillReadings(ingestDeps(clean.db, feed), clean.lakeId, 20)
    const expected = await readingRows(clean.db)
    await clean.drop()

    const crashed = await freshDb()
    // A slow feed keeps the real child process busy long enough to kill it between pages.
    feed.controls.setPlan({ latencyMs: 300 })
    const child = spawn(
      process.execPath,
      [
        '--import',
        'tsx',
        'jobs/backfill.ts',
        '--lake',
        'quillmere',
        '--days',
        '20',
        '--until',
        UNTIL,
      ],
      {
        cwd: root,
        env: { ...process.env, DATABASE_URL: crashed.url, FEED_URL: feed.url, LOG_LEVEL: 'silent' },
        stdio: 'ignore',
      },
    )
    const exited = new Promise<NodeJS.Signals | null>((resolve) =>
      child.once('exit', (_code, signal) => resolve(signal)),
    )
    const deadline = Date.now() + 30_000
    while ((await countReadings(crashed.db)) === 0 && Date.now() < deadline)
      await new Promise((r) => setTimeout(r, 50))
    child.kill('SIGKILL')
    expect(await exited).toBe('SIGKILL')
    const partial = await countReadings(crashed.db)
    expect(partial).toBeGreaterThan(0)
    expect(partial).toBeLessThan(expected.length)

    feed.controls.setPlan({ latencyMs: 0 })
    await backfillReadings(ingestDeps(crashed.db, feed), crashed.lakeId, 20)
    expect(await readingRows(crashed.db)).toEqual(expected)
    await crashed.drop()
  })
})
