import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { toSi } from '../../../shared/readings'
import { DEMO_STATIONS } from '../../../server/db/seed/demo-stations'
import { seedDemo } from '../../../server/db/seed/index'
import { ITEM_FAULTS, REQUEST_FAULTS } from '../../../server/fakes/feed/faults'
import { ingestReadings } from '../../../server/features/ingest/readings.ingest'
import { createTestDb } from '../../helpers/db'
import {
  ingestDeps,
  quarantineIds,
  readingRows,
  startTestFeed,
  type TestFeed,
} from '../../helpers/feed'

let ctx: Awaited<ReturnType<typeof createTestDb>>
let feed: TestFeed

beforeAll(async () => {
  ctx = await createTestDb()
  await seedDemo(ctx.db)
  feed = await startTestFeed('2026-05-01T00:00:00Z', 11)
})
afterAll(async () => {
  await feed.close()
  await ctx.drop()
})

/** The fake's own record of a good observation, as the readings table should hold it. */
function expectedRow(datastreamId: number, at: string, value: number, unit: string): string {
  const station = DEMO_STATIONS.find((s) => s.thingId === Math.floor(datastreamId / 10))!
  const { parameter } = station.datastreams[datastreamId % 10]!
  return `${station.thingId}|${parameter}|${at}|${toSi(parameter, value, unit)!.toFixed(6)}`
}

describe('a chaos run against the fake feed', () => {
  it(
    'after 1,000+ faults of every kind, holds each good observation served exactly once and each bad one in quarantine',
    { timeout: 120_000 },
    async () => {
      const deps = ingestDeps(ctx.db, feed, { pageSize: 20 })
      await ingestReadings(deps)
      feed.controls.setPlan({
        requestRate: 0.2,
        itemRate: 0.12,
        kinds: [...REQUEST_FAULTS, ...ITEM_FAULTS],
        slowMs: 300,
      })
      for (let run = 0; run < 40; run++) {
        feed.advance(6)
        // One station vanishes from the feed for a while.
        if (run >= 10 && run < 14) feed.controls.disappeared.add(102)
        else feed.controls.disappeared.delete(102)
        await ingestReadings(deps)
      }
      const injected = Object.fromEntries(feed.controls.faults.injected)
      expect(feed.controls.faults.total).toBeGreaterThanOrEqual(1000)
      for (const kind of [...REQUEST_FAULTS, ...ITEM_FAULTS, 'disappeared'])
        expect(injected[kind] ?? 0).toBeGreaterThan(0)

      // The feed recovers; open breakers close after their rest and the stations catch up.
      feed.controls.setPlan({ requestRate: 0, itemRate: 0 })
      for (let run = 0; run < 2; run++) {
        feed.advance(1)
        await ingestReadings(deps)
      }

      const { good, bad } = feed.controls.truth
      const expected = [...good.values()]
        .map((o) => expectedRow(o.datastreamId, o.at, o.value, o.unit))
        .sort()
      const stored = (await readingRows(ctx.db)).map((r) => r.replace('.000Z', 'Z')).sort()
      expect(stored.length).toBe(expected.length)
      expect(stored).toEqual(expected.map((r) => r.replace('.000Z', 'Z')))
      const held = await quarantineIds(ctx.db)
      const missing = [...bad.keys()].filter((id) => !held.has(id))
      expect(bad.size).toBeGreaterThan(50)
      expect(missing).toEqual([])
    },
  )
})
