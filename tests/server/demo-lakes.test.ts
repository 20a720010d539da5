import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { inWaterXy, lakeAreaM2, lakeProjection } from '../../shared/geo/polygon'
import type { Position } from '../../shared/geo/types'
import { addDays, localDate } from '../../shared/time'
import {
  banks,
  clients,
  guideProfiles,
  lakes,
  subscriptions,
  users,
} from '../../server/db/schema/index'
import { DEMO_GUIDE_PROFILE } from '../../server/db/seed/demo-life'
import { DEMO_LAKES, demoShoreline } from '../../server/db/seed/demo-lakes'
import { seedDemo, seedDemoLife } from '../../server/db/seed/index'
import { tokenKey } from '../../server/features/auth/auth.tokens'
import { clientsRepo } from '../../server/features/guides/clients.repo'
import { profileRepo } from '../../server/features/guides/profile.repo'
import { tripsRepo } from '../../server/features/guides/trips.repo'
import { tripsService } from '../../server/features/guides/trips.service'
import type { MailContext } from '../../server/features/mail/mailer'
import { DEMO_SEASON_DAYS } from '../../server/db/seed/demo-season'
import { DEMO_FEED_SEED, DEMO_STATIONS } from '../../server/db/seed/demo-stations'
import { LakeWorld } from '../../server/fakes/feed/model'
import { journalRepo } from '../../server/features/journal/journal.repo'
import { journalService } from '../../server/features/journal/journal.service'
import { createTestDb } from '../helpers/db'

/** A fixed clock for the seeded trips: mid-morning in the demo lakes' zone. */
const NOW = new Date('2026-05-12T15:00:00Z')

type Seg = [Position, Position]

function properlyCross([a, b]: Seg, [c, d]: Seg): boolean {
  const orient = (p: Position, q: Position, r: Position) =>
    Math.sign((q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0]))
  return orient(a, b, c) * orient(a, b, d) < 0 && orient(c, d, a) * orient(c, d, b) < 0
}

describe.each(DEMO_LAKES.map((shape) => [shape.name, shape] as const))(
  'demo lake %s',
  (_name, shape) => {
    const lake = demoShoreline(shape)
    const [shore, ...islands] = lake.coordinates

    it('has a closed shoreline of 300+ vertices and at least one island', () => {
      expect(shore!.length).toBeGreaterThan(300)
      expect(shore![0]).toEqual(shore![shore!.length - 1])
      expect(islands.length).toBeGreaterThanOrEqual(1)
    })

    it('covers 5 to 40 km² of water', () => {
      const km2 = lakeAreaM2(lake) / 1e6
      expect(km2).toBeGreaterThan(5)
      expect(km2).toBeLessThan(40)
    })

    it('keeps every island inside the shoreline and the shoreline free of self-crossings', () => {
      const { project } = lakeProjection(lake)
      const shoreXy = [shore!.map(project)]
      for (const island of islands)
        for (const p of island) expect(inWaterXy(shoreXy, project(p))).toBe(true)
      const segs: Seg[] = shore!.slice(1).map((p, i) => [shore![i]!, p])
      let crossings = 0
      for (let i = 0; i < segs.length; i++) {
        for (let j = i + 2; j < segs.length; j++) if (properlyCross(segs[i]!, segs[j]!)) crossings++
      }
      expect(crossings).toBe(0)
    })
  },
)

describe('the lived-in demo (npm start)', () => {
  let ctx: Awaited<ReturnType<typeof createTestDb>>
  beforeAll(async () => {
    ctx = await createTestDb()
    await seedDemo(ctx.db)
    await seedDemoLife(ctx.db, NOW)
    // Re-runnable: a second start adds nothing.
    await seedDemo(ctx.db)
    await seedDemoLife(ctx.db, NOW)
  }, 60_000)
  afterAll(() => ctx?.drop())

  const userId = async (email: string) =>
    (await ctx.db.select().from(users).where(eq(users.email, email)))[0]!.id

  it('gives the demo angler several banks on every demo lake, snapped, facing every way, with varied cover and depth', async () => {
    const angler = await userId('angler@chopline.test')
    const rows = await ctx.db
      .select({ lake: lakes.slug, bank: banks })
      .from(banks)
      .innerJoin(lakes, eq(lakes.id, banks.lakeId))
      .where(eq(banks.userId, angler))
    for (const shape of DEMO_LAKES) {
      const mine = rows.filter((r) => r.lake === shape.slug).map((r) => r.bank)
      expect(mine.length, shape.slug).toBeGreaterThanOrEqual(4)
      expect(new Set(mine.map((b) => b.name)).size).toBe(mine.length)
      // Each stored with its exposure table, none detached, facing at least four ways.
      for (const b of mine) expect(b.exposure.rows).toHaveLength(16)
      expect(mine.every((b) => b.detachedAt === null)).toBe(true)
      const facings = new Set(mine.map((b) => Math.round(b.exposure.facingDeg / 90) % 4))
      expect(facings.size).toBeGreaterThanOrEqual(3)
      expect(new Set(mine.flatMap((b) => b.cover)).size).toBeGreaterThanOrEqual(4)
      expect(new Set(mine.map((b) => b.depthM)).size).toBeGreaterThanOrEqual(3)
    }
    // The angler follows every demo lake; the brief covers the first unless more are picked.
    const follows = await ctx.db
      .select()
      .from(subscriptions)
      .where(eq(subscriptions.userId, angler))
    expect(follows).toHaveLength(DEMO_LAKES.length)
    expect(follows.filter((f) => f.inBrief)).toHaveLength(1)
  })

  it('gives the demo guide a profile, clients, an upcoming trip shared by link and a past one', async () => {
    const guide = await userId('guide@chopline.test')
    const [profile] = await ctx.db
      .select()
      .from(guideProfiles)
      .where(eq(guideProfiles.userId, guide))
    expect(profile!.name).toBe(DEMO_GUIDE_PROFILE.name)
    expect(await ctx.db.select().from(clients).where(eq(clients.guideId, guide))).toHaveLength(3)
    const service = tripsService({
      repo: tripsRepo(ctx.db),
      clients: clientsRepo(ctx.db),
      profiles: profileRepo(ctx.db),
      mail: { origin: 'http://app.test' } as MailContext,
      linkKey: tokenKey('a demo test secret that is long enough to sign'),
      now: () => NOW,
    })
    const list = (await service.list(guide)).items
    const today = localDate(NOW, 'America/Chicago')
    expect(list.map((t) => t.date)).toEqual([addDays(today, 1), addDays(today, -6)])
    expect(list.every((t) => t.bankCount === 3)).toBe(true)
    const [upcoming, past] = await Promise.all(list.map((t) => service.view(guide, t.id)))
    const live = (s: { revokedAt: string | null; expiresAt: string }) =>
      !s.revokedAt && Date.parse(s.expiresAt) > NOW.getTime()
    expect(upcoming!.shares.filter(live)).toHaveLength(1)
    expect(upcoming!.shares[0]!.expiresOn).toBe(addDays(today, 2))
    expect(upcoming!.guide).toEqual(DEMO_GUIDE_PROFILE)
    expect(past!.shares.filter(live)).toHaveLength(0)
    expect(past!.unavailable).toBe('This day has passed, and no plan was kept for it.')
  })
  it('gives the demo angler a season of catches on their banks, with patterns the insights show', async () => {
    const angler = await userId('angler@chopline.test')
    const rows = await journalRepo(ctx.db).all(angler)
    // Run twice above: the season went in once.
    expect(rows.length).toBeGreaterThan(60)
    expect(rows.length).toBeLessThan(400)
    const first = addDays(localDate(NOW, 'America/Chicago'), -DEMO_SEASON_DAYS - 1)
    for (const r of rows) {
      expect(r.catch.conditions!.localDate >= first).toBe(true)
      expect(r.catch.caughtAt.getTime()).toBeLessThan(NOW.getTime())
      expect(r.catch.bankId && r.bankName).toBeTruthy()
    }
    // The conditions are the local feed's own world at that moment.
    const worlds = new Map(
      [...new Map(DEMO_STATIONS.map((st) => [st.lake.slug, st.lake])).values()].map((l, i) => [
        l.slug,
        new LakeWorld(l, DEMO_FEED_SEED, i),
      ]),
    )
    for (const r of rows.slice(0, 20))
      expect(r.catch.conditions!.waterC).toBeCloseTo(
        worlds.get(r.lakeSlug)!.waterC(r.catch.caughtAt.getTime()),
        1,
      )
    const service = journalService({ repo: journalRepo(ctx.db) })
    const found = await service.insights(angler, {})
    const enough = found.dimensions.flatMap((d) => d.groups.filter((g) => g.enough))
    expect(enough.length).toBeGreaterThan(5)
    expect(new Set(rows.map((r) => r.catch.lure.family)).size).toBeGreaterThan(3)
  })
})
