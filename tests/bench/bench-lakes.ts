import type { Db } from '../../server/db/index'
import { lakes } from '../../server/db/schema/index'
import { DEMO_LAKES, demoShoreline } from '../../server/db/seed/demo-lakes'
import { lakeCenter } from '../../shared/geo/polygon'
import type { Polygon } from '../../shared/geo/types'

/** `count` copies of the first demo lake, `bench-0` to `bench-{count-1}`, in one time zone. */
export async function insertBenchLakes(db: Db, count: number, timeZone: string) {
  const shoreline = demoShoreline(DEMO_LAKES[0]!) as Polygon
  const center = lakeCenter(shoreline)
  const rows = await db
    .insert(lakes)
    .values(
      Array.from({ length: count }, (_, i) => ({
        slug: `bench-${i}`,
        name: `Bench Lake ${i}`,
        region: 'Bench',
        timeZone,
        normalPoolM: 100,
        shoreline,
        areaKm2: 10,
        centerLon: center[0],
        centerLat: center[1],
      })),
    )
    .returning()
  return { rows, shoreline, center, shore: shoreline.coordinates[0]! }
}
