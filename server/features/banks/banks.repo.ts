import { and, asc, eq, inArray, isNull, ne, sql } from 'drizzle-orm'
import type { ExposureTable } from '../../../shared/conditions/exposure'
import type { Db } from '../../db/index'
import { banks, lakes } from '../../db/schema/index'

export type BankRow = typeof banks.$inferSelect
export type BankValues = Omit<typeof banks.$inferInsert, 'id' | 'userId' | 'lakeId'>

/** What ranking a bank reads (`Bank` in shared/conditions/ranking.ts, with a null depth): no geometry work. */
export const RANKED_BANK = {
  id: banks.id,
  name: banks.name,
  points: banks.points,
  cover: banks.cover,
  depthM: banks.depthM,
  exposure: banks.exposure,
}

export function banksRepo(db: Db) {
  const owned = (userId: string, lakeId: string, id: string) =>
    and(eq(banks.id, id), eq(banks.userId, userId), eq(banks.lakeId, lakeId))
  // Tables stored before they carried a version are version 1.
  const olderThan = (version: number) =>
    sql`coalesce((${banks.exposure}->>'version')::int, 1) < ${version}`
  // A recompute is not the angler's edit: the bank keeps its updated_at.
  const unedited = { updatedAt: sql`${banks.updatedAt}` }
  return {
    async lake(slug: string) {
      const [row] = await db
        .select({ id: lakes.id, name: lakes.name, shoreline: lakes.shoreline })
        .from(lakes)
        .where(eq(lakes.slug, slug))
      return row
    },
    list: (userId: string, lakeId: string) =>
      db
        .select()
        .from(banks)
        .where(and(eq(banks.userId, userId), eq(banks.lakeId, lakeId)))
        .orderBy(asc(banks.name)),
    async nameTaken(userId: string, lakeId: string, name: string, exceptId?: string) {
      const [row] = await db
        .select({ id: banks.id })
        .from(banks)
        .where(
          and(
            eq(banks.userId, userId),
            eq(banks.lakeId, lakeId),
            eq(banks.name, name),
            exceptId ? ne(banks.id, exceptId) : undefined,
          ),
        )
      return !!row
    },
    /** Inserts unless the angler already has a bank of that name on the lake. */
    async insert(userId: string, lakeId: string, values: BankValues) {
      const [row] = await db
        .insert(banks)
        .values({ ...values, userId, lakeId })
        .onConflictDoNothing()
        .returning()
      return row
    },
    async update(userId: string, lakeId: string, id: string, values: BankValues) {
      const [row] = await db
        .update(banks)
        .set(values)
        .where(owned(userId, lakeId, id))
        .returning()
      return row
    },
    async remove(userId: string, lakeId: string, id: string) {
      const gone = await db
        .delete(banks)
        .where(owned(userId, lakeId, id))
        .returning({ id: banks.id })
      return gone.length > 0
    },

    /** Lakes with banks, not flagged to redraw, whose exposure table is older than `version`. */
    lakesWithOldExposure: (version: number) =>
      db
        .select({ id: lakes.id, shoreline: lakes.shoreline })
        .from(lakes)
        .where(
          inArray(
            lakes.id,
            db
              .select({ id: banks.lakeId })
              .from(banks)
              .where(and(isNull(banks.detachedAt), olderThan(version))),
          ),
        ),
    oldExposure: (lakeId: string, version: number) =>
      db
        .select({ id: banks.id, points: banks.points })
        .from(banks)
        .where(and(eq(banks.lakeId, lakeId), isNull(banks.detachedAt), olderThan(version))),
    /** Unless the angler saved the bank again meanwhile (with a table of today's version). */
    saveExposure: (id: string, exposure: ExposureTable, version: number) =>
      db
        .update(banks)
        .set({ exposure, ...unedited })
        .where(and(eq(banks.id, id), olderThan(version))),
    flagToRedraw: (id: string, at: Date, version: number) =>
      db
        .update(banks)
        .set({ detachedAt: at, ...unedited })
        .where(and(eq(banks.id, id), olderThan(version))),
  }
}
export type BanksRepo = ReturnType<typeof banksRepo>
