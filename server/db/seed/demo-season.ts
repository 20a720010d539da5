import { and, count, eq } from 'drizzle-orm'
import { clarityClass } from '../../../shared/conditions/clarity'
import { skyFromCloud } from '../../../shared/conditions/day-plan'
import { bankExposure } from '../../../shared/conditions/exposure'
import { seasonalPhase } from '../../../shared/conditions/season'
import type { Blade } from '../../../shared/conditions/tackle-rules'
import type { CatchConditions, LureInput, Species } from '../../../shared/schemas/journal'
import { addDays, HOUR_MS, localDate, zonedMidnight } from '../../../shared/time'
import { LakeWorld, rand } from '../../fakes/feed/model'
import { timeOfDay } from '../../features/journal/catch-conditions'
import type { Db } from '../index'
import { banks, catches, lakes } from '../schema/index'
import { DEMO_FEED_SEED, DEMO_STATIONS } from './demo-stations'

/** How far back the demo angler's season reaches, and how many of those days they fished. */
export const DEMO_SEASON_DAYS = 150
const FISHED_SHARE = 0.3
const DAY_MS = 24 * HOUR_MS

/** The local feed's worlds, made as the feed makes them: same seed, same lake order. */
function demoWorlds(): Map<string, LakeWorld> {
  const feedLakes = [...new Map(DEMO_STATIONS.map((s) => [s.lake.slug, s.lake])).values()]
  return new Map(feedLakes.map((l, i) => [l.slug, new LakeWorld(l, DEMO_FEED_SEED, i)]))
}

const lure = (family: string, details: Partial<LureInput> = {}): LureInput => ({
  family,
  blade: null,
  color: '',
  size: '',
  trailer: '',
  trailerHook: null,
  retrieve: '',
  ...details,
})

/**
 * What the demo angler tied on, so the insights show patterns: in dirty water a Colorado-bladed
 * spinnerbait, in cold clear water a jerkbait, in warm water topwater at dawn and a worm later,
 * on windy banks a bladed jig, otherwise a jig; one fish in five on something else.
 */
function lureFor(c: CatchConditions, pick: number): LureInput {
  if (pick > 0.8) {
    const others = ['squarebill crankbait', 'swimbait', 'lipless crankbait', 'jig']
    return lure(others[Math.floor(((pick - 0.8) / 0.2) * others.length)]!)
  }
  const dirty = c.clarity?.class === 'muddy' || c.clarity?.class === 'stained'
  const water = c.waterC ?? 15
  if (dirty)
    return lure('spinnerbait', { blade: 'colorado' as Blade, color: 'chartreuse and white' })
  if (water < 12) return lure('jerkbait', { color: 'ghost shad' })
  if (water >= 21)
    return c.timeOfDay === 'dawn'
      ? lure('topwater', { color: 'bone' })
      : lure('soft-plastic worm', { color: 'green pumpkin' })
  if ((c.wind?.ms ?? 0) >= 5) return lure('bladed jig', { color: 'white', trailer: 'swimbait' })
  return lure('jig', { color: 'green pumpkin', trailer: 'craw' })
}

/**
 * A season of invented catches for the demo angler on the demo lakes, the conditions of each read
 * from the local feed's own world at that moment (the weather and water the demo serves), so the
 * insights page shows patterns on first open. Once: an angler with any catch keeps their journal.
 */
export async function seedDemoSeason(db: Db, userId: string, now = new Date()): Promise<number> {
  const [has] = await db.select({ n: count() }).from(catches).where(eq(catches.userId, userId))
  if (has?.n) return 0
  const worlds = demoWorlds()
  const demoLakes = (await db.select().from(lakes).orderBy(lakes.name)).filter((l) =>
    worlds.has(l.slug),
  )
  if (!demoLakes.length) return 0
  const rows: (typeof catches.$inferInsert)[] = []
  for (let d = DEMO_SEASON_DAYS; d >= 1; d--) {
    if (rand(DEMO_FEED_SEED, d, 101) >= FISHED_SHARE) continue
    const lake = demoLakes[Math.floor(rand(DEMO_FEED_SEED, d, 102) * demoLakes.length)]!
    const world = worlds.get(lake.slug)!
    const date = addDays(localDate(now, lake.timeZone), -d)
    const midnight = zonedMidnight(date, lake.timeZone).getTime()
    const lakeBanks = await db
      .select({ id: banks.id, exposure: banks.exposure })
      .from(banks)
      .where(and(eq(banks.userId, userId), eq(banks.lakeId, lake.id)))
    // Daily means of the three weeks before, for the phase as the read would judge it.
    const means = Array.from({ length: 21 }, (_, k) => {
      const day = midnight - (20 - k) * DAY_MS
      return [3, 9, 15, 21].reduce((s, h) => s + world.waterC(day + h * HOUR_MS), 0) / 4
    })
    const phase = seasonalPhase({
      dailyMeanWaterC: means,
      lastDay: date,
      latitude: lake.centerLat,
    }).phase
    const fish = 1 + Math.floor(rand(DEMO_FEED_SEED, d, 103) * 4)
    for (let k = 0; k < fish; k++) {
      // Between 6:00 and 18:00 on the lake's clock.
      const at = new Date(midnight + (6 + rand(DEMO_FEED_SEED, d, 104, k) * 12) * HOUR_MS)
      const t = at.getTime()
      const w = world.weather(t)
      const secchiM = world.secchiM(t)
      const dayBefore = world.secchiM(t - DAY_MS)
      const change = w.pressureHpa - world.weather(t - 3 * HOUR_MS).pressureHpa
      const bank = lakeBanks[Math.floor(rand(DEMO_FEED_SEED, d, 105, k) * lakeBanks.length)]
      const conditions: CatchConditions = {
        waterC: Math.round(world.waterC(t) * 10) / 10,
        clarity: {
          class: clarityClass(secchiM),
          secchiM: Math.round(secchiM * 100) / 100,
          trend:
            secchiM > dayBefore * 1.1
              ? 'clearing'
              : secchiM < dayBefore * 0.8
                ? 'staining'
                : 'steady',
        },
        phase,
        wind: { ms: w.windMs, gustMs: w.gustMs, fromDeg: w.windFromDeg },
        bankExposure: bank ? bankExposure(bank.exposure, w.windFromDeg, w.windMs).exposure : null,
        sky: skyFromCloud(w.cloudCoverPct),
        cloudCoverPct: Math.round(w.cloudCoverPct),
        airC: Math.round(w.airC * 10) / 10,
        pressure: {
          hPa: Math.round(w.pressureHpa * 10) / 10,
          changeHpa3h: Math.round(change * 10) / 10,
          label: Math.abs(change) < 1 ? 'steady' : change > 0 ? 'rising' : 'falling',
        },
        // An invented day: a breeze past small-boat comfort reads as a caution.
        verdict: w.gustMs >= 11 ? 'caution' : 'go',
        timeOfDay: timeOfDay(at, lake),
        localDate: date,
        computedAt: at.toISOString(),
      }
      const pick = rand(DEMO_FEED_SEED, d, 106, k)
      const size = rand(DEMO_FEED_SEED, d, 107, k)
      const species: Species = pick < 0.75 ? 'largemouth' : pick < 0.92 ? 'smallmouth' : 'spotted'
      const lengthM = Math.round((0.28 + size * 0.25) * 1000) / 1000
      rows.push({
        userId,
        lakeId: lake.id,
        bankId: bank?.id ?? null,
        caughtAt: at,
        species,
        lengthM,
        // Weight from length for a healthy bass (common practice: about 0.0000113 × mm³ g).
        weightKg: Math.round(11.3e-6 * (lengthM * 1000) ** 3) / 1000,
        released: rand(DEMO_FEED_SEED, d, 108, k) < 0.9,
        lure: lureFor(conditions, rand(DEMO_FEED_SEED, d, 109, k)),
        note: '',
        conditions,
      })
    }
  }
  if (rows.length) await db.insert(catches).values(rows)
  return rows.length
}
