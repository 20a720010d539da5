import { and, eq, inArray } from 'drizzle-orm'
import type { Cover } from '../../../shared/conditions/tackle-rules'
import { fetchLength } from '../../../shared/geo/fetch'
import { lakeCenter, lakeProjection } from '../../../shared/geo/polygon'
import type { LakeGeometry, Position } from '../../../shared/geo/types'
import type { BANK_SLOPES } from '../../../shared/schemas/banks'
import { addDays, localDate, localDayBounds } from '../../../shared/time'
import { banksRepo } from '../../features/banks/banks.repo'
import { banksService } from '../../features/banks/banks.service'
import type { Db } from '../index'
import { seedDemoSeason } from './demo-season'
import {
  banks,
  clients,
  guideProfiles,
  lakes,
  subscriptions,
  tripBanks,
  trips,
  tripShares,
  users,
} from '../schema/index'

/** A demo bank: where the shore lies from the lake's centre, and what it is like. */
interface DemoBank {
  name: string
  bearingDeg: number
  cover: Cover[]
  depthM: number
  slope: (typeof BANK_SLOPES)[number]
  notes: string
}

/** Five banks around each lake, facing every way, with the covers and depths the ranking weighs. */
const ANGLER_BANKS: DemoBank[] = [
  {
    name: 'Boulder point',
    bearingDeg: 20,
    cover: ['rock', 'sparse-grass'],
    depthM: 3,
    slope: 'gradual',
    notes: 'Chunk rock out to a grass edge; a flat behind it.',
  },
  {
    name: 'Fallen timber bank',
    bearingDeg: 95,
    cover: ['wood'],
    depthM: 2,
    slope: 'steep',
    notes: 'Laydowns every few casts.',
  },
  {
    name: 'Grass flat',
    bearingDeg: 165,
    cover: ['dense-grass', 'sparse-grass'],
    depthM: 1.2,
    slope: 'flat',
    notes: '',
  },
  {
    name: 'Cabin docks',
    bearingDeg: 235,
    cover: ['docks', 'wood'],
    depthM: 2.5,
    slope: 'gradual',
    notes: 'Shade under the walkways at midday.',
  },
  {
    name: 'Channel swing bank',
    bearingDeg: 305,
    cover: ['rock'],
    depthM: 6,
    slope: 'drop-off',
    notes: 'The creek channel swings in close here.',
  },
]

/** The guide's own banks on the first lake, for the trips. */
const GUIDE_BANKS: DemoBank[] = [
  { ...ANGLER_BANKS[0]!, name: 'Morning rocks', notes: '' },
  { ...ANGLER_BANKS[1]!, name: 'Timber run', notes: '' },
  { ...ANGLER_BANKS[3]!, name: 'Marina docks', notes: '' },
]

export const DEMO_GUIDE_PROFILE = {
  name: 'Tamsin Reedley',
  phone: '+1 555 0147',
  email: 'trips@reedley-guiding.test',
}

const DEMO_CLIENTS = [
  { name: 'Orrin Casterby', email: 'orrin@client.test', phone: '+1 555 0181', notes: 'First trip' },
  { name: 'Lise Varnock', email: 'lise@client.test', phone: '', notes: 'Fishes left-handed' },
  { name: 'Pell Hadrow', email: 'pell@client.test', phone: '+1 555 0193', notes: '' },
]

/** Two points on the shore 4° apart where it lies `bearingDeg` from the centre, so the bank faces back across. */
function shorePoints(lake: LakeGeometry, bearingDeg: number): Position[] {
  const center = lakeCenter(lake)
  const { unproject } = lakeProjection(lake)
  const onShore = (deg: number) => {
    const d = fetchLength(lake, center, deg) - 1
    const rad = (deg * Math.PI) / 180
    return unproject([d * Math.sin(rad), d * Math.cos(rad)])
  }
  return [onShore(bearingDeg - 2), onShore(bearingDeg + 2)]
}

async function saveBanks(
  db: Db,
  userId: string,
  lake: typeof lakes.$inferSelect,
  list: DemoBank[],
) {
  const service = banksService(banksRepo(db))
  const have = new Set(
    (
      await db
        .select({ name: banks.name })
        .from(banks)
        .where(and(eq(banks.userId, userId), eq(banks.lakeId, lake.id)))
    ).map((b) => b.name),
  )
  const ids = new Map<string, string>()
  for (const b of list) {
    if (have.has(b.name)) continue
    const saved = await service.create(userId, lake.slug, {
      name: b.name,
      points: shorePoints(lake.shoreline, b.bearingDeg),
      cover: b.cover,
      depthM: b.depthM,
      slope: b.slope,
      notes: b.notes,
    })
    ids.set(b.name, saved.id)
  }
  return ids
}

/**
 * The lived-in part of the demo, for `npm start` and `npm run dev`: the demo angler follows every
 * demo lake, has banks on each and a season of catches (`seedDemoSeason`); the guide has a profile, clients, banks, an upcoming trip shared
 * by link and a past one. Idempotent: what exists is left alone.
 */
export async function seedDemoLife(db: Db, now = new Date()): Promise<void> {
  const people = await db
    .select({ id: users.id, email: users.email })
    .from(users)
    .where(inArray(users.email, ['angler@chopline.test', 'guide@chopline.test']))
  const angler = people.find((p) => p.email === 'angler@chopline.test')
  const guide = people.find((p) => p.email === 'guide@chopline.test')
  const demoLakes = await db.select().from(lakes).orderBy(lakes.name)
  const first = demoLakes.find((l) => l.slug === 'quillmere') ?? demoLakes[0]
  if (!first) return

  if (angler) {
    // Every demo lake followed; the brief keeps to the first unless the angler picks more.
    await db
      .insert(subscriptions)
      .values(
        demoLakes.map((l) => ({ userId: angler.id, lakeId: l.id, inBrief: l.id === first.id })),
      )
      .onConflictDoNothing()
    for (const lake of demoLakes) await saveBanks(db, angler.id, lake, ANGLER_BANKS)
    // A season of catches on those banks, so the insights and the Day plan's log have something.
    await seedDemoSeason(db, angler.id, now)
  }
  if (!guide) return

  await db
    .insert(guideProfiles)
    .values({ userId: guide.id, ...DEMO_GUIDE_PROFILE })
    .onConflictDoNothing()
  await db
    .insert(clients)
    .values(DEMO_CLIENTS.map((c) => ({ guideId: guide.id, ...c })))
    .onConflictDoNothing()
  await saveBanks(db, guide.id, first, GUIDE_BANKS)

  // Trips once: a guide who has planned any keeps their own.
  const [planned] = await db.select({ id: trips.id }).from(trips).where(eq(trips.guideId, guide.id))
  if (planned) return
  const guideBanks = await db
    .select({ id: banks.id, name: banks.name })
    .from(banks)
    .where(and(eq(banks.userId, guide.id), eq(banks.lakeId, first.id)))
  const today = localDate(now, first.timeZone)
  const endOf = (date: string) => localDayBounds(date, first.timeZone)[1]
  const plan = async (date: string, values: Partial<typeof trips.$inferInsert>) => {
    const [trip] = await db
      .insert(trips)
      .values({
        guideId: guide.id,
        lakeId: first.id,
        date,
        meetingPoint: 'North ramp, by the fuel dock',
        meetingTime: '05:45',
        ...values,
      })
      .returning({ id: trips.id })
    await db
      .insert(tripBanks)
      .values(guideBanks.map((b, position) => ({ tripId: trip!.id, bankId: b.id, position })))
    return trip!.id
  }
  const upcoming = await plan(addDays(today, 1), {
    tackle:
      'Rain gear, polarised glasses, a life jacket that fits. Rods and baits are on the boat.',
    notes: 'We run the rocks first while the wind is light, then tuck into the docks.',
  })
  await db.insert(tripShares).values({ tripId: upcoming, expiresAt: endOf(addDays(today, 2)) })
  const past = await plan(addDays(today, -6), { meetingTime: '06:15', notes: 'Half day.' })
  await db.insert(tripShares).values({ tripId: past, expiresAt: endOf(addDays(today, -5)) })
}
