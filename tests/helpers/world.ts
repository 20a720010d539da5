import { eq } from 'drizzle-orm'
import { lakes } from '../../server/db/schema/index'
import { seedDemo } from '../../server/db/seed/index'
import { conditionsFor } from '../../server/features/conditions/conditions.service'
import { backfillReadings } from '../../server/features/ingest/readings.ingest'
import { ingestWeather } from '../../server/features/ingest/weather.ingest'
import { createTestDb } from './db'
import { ingestDeps, startTestFeed } from './feed'

/**
 * A database as `npm start` leaves it after its first ingest: the demo data, `days` of Quillmere
 * readings and the weather from the fake feed, and the conditions cache refreshed.
 */
export async function startWorld(days: number) {
  const ctx = await createTestDb()
  await seedDemo(ctx.db)
  const feed = await startTestFeed(new Date().toISOString())
  const [quillmere] = await ctx.db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
  await backfillReadings(ingestDeps(ctx.db, feed), quillmere!.id, days)
  await ingestWeather(ingestDeps(ctx.db, feed))
  // As the ingest jobs do after each run.
  await conditionsFor(ctx.db).refreshAll(feed.now())
  return {
    ...ctx,
    feed,
    quillmere: quillmere!,
    close: async () => {
      await feed.close()
      await ctx.drop()
    },
  }
}
export type World = Awaited<ReturnType<typeof startWorld>>
