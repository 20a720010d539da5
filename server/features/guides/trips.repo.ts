import { and, asc, count, desc, eq, inArray } from 'drizzle-orm'
import type { LakeDay } from '../../../shared/conditions/day-plan'
import type { TripInput } from '../../../shared/schemas/guides'
import type { Db } from '../../db/index'
import { RANKED_BANK } from '../banks/banks.repo'
import {
  banks,
  lakeDays,
  lakes,
  tripBanks,
  trips,
  tripShares,
  tripShareSends,
} from '../../db/schema/index'

export type TripValues = Omit<TripInput, 'lakeSlug' | 'bankIds'> & { lakeId: string }

/** A guide's trips and their share links; every trip query is scoped to its guide. */
export function tripsRepo(db: Db) {
  const tripColumns = {
    id: trips.id,
    guideId: trips.guideId,
    date: trips.date,
    meetingPoint: trips.meetingPoint,
    meetingTime: trips.meetingTime,
    tackle: trips.tackle,
    notes: trips.notes,
    lakeId: lakes.id,
    lakeSlug: lakes.slug,
    lakeName: lakes.name,
    timeZone: lakes.timeZone,
  }
  return {
    list: (guideId: string) =>
      db
        .select({ ...tripColumns, bankCount: count(tripBanks.bankId) })
        .from(trips)
        .innerJoin(lakes, eq(lakes.id, trips.lakeId))
        .leftJoin(tripBanks, eq(tripBanks.tripId, trips.id))
        .where(eq(trips.guideId, guideId))
        .groupBy(trips.id, lakes.id)
        .orderBy(desc(trips.date), asc(trips.meetingTime)),

    /** The trip if `guideId` owns it; any trip when `guideId` is null (a share link names it). */
    async get(id: string, guideId: string | null) {
      const [row] = await db
        .select(tripColumns)
        .from(trips)
        .innerJoin(lakes, eq(lakes.id, trips.lakeId))
        .where(and(eq(trips.id, id), guideId ? eq(trips.guideId, guideId) : undefined))
      return row
    },

    lake: async (slug: string) =>
      (
        await db
          .select({ id: lakes.id, timeZone: lakes.timeZone })
          .from(lakes)
          .where(eq(lakes.slug, slug))
      )[0],

    /** Of `ids`, the guide's banks on the lake, with the stored tables the plan ranks. */
    ownedBanks: (guideId: string, lakeId: string, ids: string[]) =>
      ids.length
        ? db
            .select({ id: banks.id })
            .from(banks)
            .where(and(eq(banks.userId, guideId), eq(banks.lakeId, lakeId), inArray(banks.id, ids)))
        : Promise.resolve([]),

    tripBanks: (tripId: string) =>
      db
        .select(RANKED_BANK)
        .from(tripBanks)
        .innerJoin(banks, eq(banks.id, tripBanks.bankId))
        .where(eq(tripBanks.tripId, tripId))
        .orderBy(asc(tripBanks.position)),

    /** Creates (no `id`) or replaces a trip with its banks, in one transaction; undefined if not the guide's. */
    save: (guideId: string, id: string | null, values: TripValues, bankIds: string[]) =>
      db.transaction(async (tx) => {
        const [row] = id
          ? await tx
              .update(trips)
              .set(values)
              .where(and(eq(trips.id, id), eq(trips.guideId, guideId)))
              .returning({ id: trips.id })
          : await tx
              .insert(trips)
              .values({ ...values, guideId })
              .returning({ id: trips.id })
        if (!row) return undefined
        await tx.delete(tripBanks).where(eq(tripBanks.tripId, row.id))
        if (bankIds.length)
          await tx
            .insert(tripBanks)
            .values(bankIds.map((bankId, position) => ({ tripId: row.id, bankId, position })))
        return row.id
      }),

    async remove(guideId: string, id: string) {
      const gone = await db
        .delete(trips)
        .where(and(eq(trips.id, id), eq(trips.guideId, guideId)))
        .returning({ id: trips.id })
      return gone.length > 0
    },

    async day(lakeId: string, date: string) {
      const [row] = await db
        .select({ day: lakeDays.day, computedAt: lakeDays.computedAt })
        .from(lakeDays)
        .where(and(eq(lakeDays.lakeId, lakeId), eq(lakeDays.date, date)))
      return row as { day: LakeDay; computedAt: Date } | undefined
    },

    shares: (tripId: string) =>
      db
        .select()
        .from(tripShares)
        .where(eq(tripShares.tripId, tripId))
        .orderBy(desc(tripShares.createdAt)),
    sends: (shareIds: string[]) =>
      shareIds.length
        ? db
            .select()
            .from(tripShareSends)
            .where(inArray(tripShareSends.shareId, shareIds))
            .orderBy(desc(tripShareSends.sentAt))
        : Promise.resolve([]),
    async share(id: string) {
      const [row] = await db.select().from(tripShares).where(eq(tripShares.id, id))
      return row
    },
    async createShare(tripId: string, expiresAt: Date) {
      const [row] = await db.insert(tripShares).values({ tripId, expiresAt }).returning()
      return row!
    },
    async revokeShare(tripId: string, shareId: string, at: Date) {
      const rows = await db
        .update(tripShares)
        .set({ revokedAt: at })
        .where(and(eq(tripShares.id, shareId), eq(tripShares.tripId, tripId)))
        .returning({ id: tripShares.id })
      return rows.length > 0
    },
    recordSends: (rows: (typeof tripShareSends.$inferInsert)[]) =>
      db.insert(tripShareSends).values(rows),
  }
}
export type TripsRepo = ReturnType<typeof tripsRepo>
