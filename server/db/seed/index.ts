import { inArray } from 'drizzle-orm'
import { lakeAreaM2, lakeCenter } from '../../../shared/geo/polygon'
import { hashPassword } from '../../features/auth/passwords'
import type { Db } from '../index'
import { briefSettings, lakes, stations, subscriptions, users } from '../schema/index'
import type { Role } from '../../../shared/schemas/auth'
import { DEMO_LAKES, demoShoreline } from './demo-lakes'
import { DEMO_STATIONS } from './demo-stations'

export { seedDemoLife } from './demo-life'

/** Development only: `npm start` refuses to seed these when NODE_ENV=production. */
export const DEMO_PASSWORD = 'chopline-demo'
const DEMO_ANGLER = { email: 'angler@chopline.test', role: 'angler' } as const
export const DEMO_USERS: { email: string; role: Role }[] = [
  DEMO_ANGLER,
  { email: 'guide@chopline.test', role: 'guide' },
  { email: 'admin@chopline.test', role: 'admin' },
]

/** Idempotent: a second run adds nothing and leaves edited users and lakes alone. */
export async function seedDemo(db: Db): Promise<void> {
  // Hashing costs about a tenth of a second, so a start with the users in place skips it.
  const existing = await db
    .select({ email: users.email })
    .from(users)
    .where(
      inArray(
        users.email,
        DEMO_USERS.map((u) => u.email),
      ),
    )
  const missing = DEMO_USERS.filter((u) => !existing.some((e) => e.email === u.email))
  let created: { id: string; email: string }[] = []
  if (missing.length) {
    const passwordHash = await hashPassword(DEMO_PASSWORD)
    created = await db
      .insert(users)
      // Demo addresses are confirmed, so the morning brief reaches the local inbox at once.
      .values(missing.map((u) => ({ ...u, passwordHash, emailVerifiedAt: new Date() })))
      .onConflictDoNothing({ target: users.email })
      .returning({ id: users.id, email: users.email })
  }

  const rows = DEMO_LAKES.map((shape) => {
    const shoreline = demoShoreline(shape)
    const [centerLon, centerLat] = lakeCenter(shoreline)
    return {
      slug: shape.slug,
      name: shape.name,
      region: shape.region,
      timeZone: shape.timeZone,
      normalPoolM: shape.normalPoolM,
      shoreline,
      areaKm2: Math.round(lakeAreaM2(shoreline) / 1e4) / 100,
      centerLon,
      centerLat,
    }
  })
  await db.insert(lakes).values(rows).onConflictDoNothing({ target: lakes.slug })

  const lakeIds = new Map(
    (await db.select({ id: lakes.id, slug: lakes.slug }).from(lakes)).map((l) => [l.slug, l.id]),
  )
  await db
    .insert(stations)
    .values(
      DEMO_STATIONS.flatMap((s) => {
        const lakeId = lakeIds.get(s.lake.slug)
        return lakeId ? [{ lakeId, name: s.name, feedThingId: String(s.thingId) }] : []
      }),
    )
    .onConflictDoNothing({ target: stations.feedThingId })

  // A new demo angler follows the first lake and takes the morning brief at the default hour.
  const angler = created.find((u) => u.email === DEMO_ANGLER.email)
  const firstLake = DEMO_LAKES[0]!
  if (angler) {
    await db
      .insert(subscriptions)
      .values({ userId: angler.id, lakeId: lakeIds.get(firstLake.slug)! })
    await db.insert(briefSettings).values({ userId: angler.id, timeZone: firstLake.timeZone })
  }
}
