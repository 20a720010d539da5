import { eq } from 'drizzle-orm'
import type { ExposureTable } from '../../../shared/conditions/exposure'
import type { LakeGeometry, Position } from '../../../shared/geo/types'
import type { LakeCreateInput, LakeEditInput } from '../../../shared/schemas/desk'
import type { Db } from '../../db/index'
import { banks, lakeRecomputes, lakes } from '../../db/schema/index'

/** Lakes as the gauge desk changes them, and the bank recompute a new outline starts. */
export function lakesDeskRepo(db: Db) {
  return {
    async bySlug(slug: string) {
      const [row] = await db.select().from(lakes).where(eq(lakes.slug, slug))
      return row
    },
    /** Inserts unless the slug is taken; undefined then. */
    async create(
      values: LakeCreateInput & { shoreline: LakeGeometry; areaKm2: number; center: Position },
    ) {
      const { center, ...rest } = values
      const [row] = await db
        .insert(lakes)
        .values({ ...rest, centerLon: center[0], centerLat: center[1] })
        .onConflictDoNothing({ target: lakes.slug })
        .returning()
      return row
    },
    /** In the caller's transaction, with its audit entry. */
    edit: (id: string, values: LakeEditInput, tx: Pick<Db, 'update'> = db) =>
      tx.update(lakes).set(values).where(eq(lakes.id, id)),
    async replaceShoreline(id: string, shoreline: LakeGeometry, areaKm2: number, center: Position) {
      await db
        .update(lakes)
        .set({ shoreline, areaKm2, centerLon: center[0], centerLat: center[1] })
        .where(eq(lakes.id, id))
    },

    banksOn: (lakeId: string) =>
      db.select({ id: banks.id, points: banks.points }).from(banks).where(eq(banks.lakeId, lakeId)),
    saveBank: (
      id: string,
      points: Position[],
      exposure: ExposureTable | null,
      detachedAt: Date | null,
    ) =>
      db
        .update(banks)
        .set({ points, detachedAt, ...(exposure ? { exposure } : {}) })
        .where(eq(banks.id, id)),

    startRecompute: (lakeId: string, total: number, at: Date) => {
      const values = { total, done: 0, detached: 0, startedAt: at, finishedAt: null, error: null }
      return db
        .insert(lakeRecomputes)
        .values({ lakeId, ...values })
        .onConflictDoUpdate({ target: lakeRecomputes.lakeId, set: values })
    },
    progress: (lakeId: string, done: number, detached: number) =>
      db.update(lakeRecomputes).set({ done, detached }).where(eq(lakeRecomputes.lakeId, lakeId)),
    finishRecompute: (lakeId: string, at: Date, error: string | null) =>
      db
        .update(lakeRecomputes)
        .set({ finishedAt: at, error })
        .where(eq(lakeRecomputes.lakeId, lakeId)),
    async recompute(lakeId: string) {
      const [row] = await db.select().from(lakeRecomputes).where(eq(lakeRecomputes.lakeId, lakeId))
      return row
    },
  }
}
export type LakesDeskRepo = ReturnType<typeof lakesDeskRepo>
