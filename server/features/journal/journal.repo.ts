import { and, count, desc, eq, inArray, isNull, sql, type SQL } from 'drizzle-orm'
import type { Db } from '../../db/index'
import { banks, catches, catchPhotos, lakes, trips } from '../../db/schema/index'

export type CatchValues = Omit<typeof catches.$inferInsert, 'id' | 'userId'>

/** The catch journal's queries; every one names the angler, so another's catch is never found. */
export function journalRepo(db: Db) {
  const view = {
    catch: catches,
    lakeSlug: lakes.slug,
    lakeName: lakes.name,
    timeZone: lakes.timeZone,
    bankName: banks.name,
    photo: catchPhotos,
  }
  const listed = (where: SQL | undefined) =>
    db
      .select(view)
      .from(catches)
      .innerJoin(lakes, eq(lakes.id, catches.lakeId))
      .leftJoin(banks, eq(banks.id, catches.bankId))
      .leftJoin(catchPhotos, eq(catchPhotos.catchId, catches.id))
      .where(where)
  return {
    async lakeBySlug(slug: string) {
      const [row] = await db.select().from(lakes).where(eq(lakes.slug, slug))
      return row
    },
    async ownBank(userId: string, lakeId: string, id: string) {
      const [row] = await db
        .select()
        .from(banks)
        .where(and(eq(banks.id, id), eq(banks.userId, userId), eq(banks.lakeId, lakeId)))
      return row
    },
    /** The angler's banks, on one lake or on every lake, with their lake's slug. */
    banks: (userId: string, lakeId?: string) =>
      db
        .select({
          id: banks.id,
          name: banks.name,
          points: banks.points,
          lakeId: banks.lakeId,
          lakeSlug: lakes.slug,
          timeZone: lakes.timeZone,
        })
        .from(banks)
        .innerJoin(lakes, eq(lakes.id, banks.lakeId))
        .where(and(eq(banks.userId, userId), lakeId ? eq(banks.lakeId, lakeId) : undefined)),
    async ownTrip(guideId: string, id: string) {
      const [row] = await db
        .select({ id: trips.id, lakeId: trips.lakeId, date: trips.date })
        .from(trips)
        .where(and(eq(trips.id, id), eq(trips.guideId, guideId)))
      return row
    },
    async list(userId: string, lakeId: string | undefined, page: number, pageSize: number) {
      const where = and(eq(catches.userId, userId), lakeId ? eq(catches.lakeId, lakeId) : undefined)
      const [rows, [total]] = await Promise.all([
        listed(where)
          .orderBy(desc(catches.caughtAt), desc(catches.createdAt))
          .limit(pageSize)
          .offset((page - 1) * pageSize),
        db.select({ n: count() }).from(catches).where(where),
      ])
      return { rows, total: total?.n ?? 0 }
    },
    async get(userId: string, id: string) {
      const [row] = await listed(and(eq(catches.id, id), eq(catches.userId, userId)))
      return row
    },
    /** The catch the angler's phone logged with this id, if it has been. */
    async byClientId(userId: string, clientId: string) {
      const [row] = await listed(and(eq(catches.userId, userId), eq(catches.clientId, clientId)))
      return row
    },
    /** A trip's catches, for its guide's trip page and the clients' shared page. */
    ofTrip: (tripId: string) => listed(eq(catches.tripId, tripId)).orderBy(desc(catches.caughtAt)),
    /** Every catch of an angler, oldest first (export, insights). */
    all: (userId: string, lakeId?: string) =>
      listed(
        and(eq(catches.userId, userId), lakeId ? eq(catches.lakeId, lakeId) : undefined),
      ).orderBy(catches.caughtAt),

    /** What insights need of each catch: its conditions, lure and lake's latitude. */
    forInsights: (userId: string, lakeId?: string) =>
      db
        .select({
          conditions: catches.conditions,
          lureFamily: sql<string>`${catches.lure}->>'family'`,
          latitude: lakes.centerLat,
        })
        .from(catches)
        .innerJoin(lakes, eq(lakes.id, catches.lakeId))
        .where(and(eq(catches.userId, userId), lakeId ? eq(catches.lakeId, lakeId) : undefined)),

    /**
     * The catch and its photo in one transaction: a photo belongs to one catch at most. A catch
     * whose `clientId` the angler already logged (the same phone's send, racing) is that one,
     * with `created: false`, and its photo is left alone.
     */
    async insert(userId: string, values: CatchValues, photoId: string | null) {
      const taken = new Error('photo taken')
      return db
        .transaction(async (tx) => {
          const [row] = await tx
            .insert(catches)
            .values({ ...values, userId })
            .onConflictDoNothing({ target: [catches.userId, catches.clientId] })
            .returning()
          if (!row) {
            const [sent] = await tx
              .select({ id: catches.id })
              .from(catches)
              .where(and(eq(catches.userId, userId), eq(catches.clientId, values.clientId!)))
            return { id: sent!.id, created: false }
          }
          if (photoId) {
            const attached = await tx
              .update(catchPhotos)
              .set({ catchId: row!.id })
              .where(
                and(
                  eq(catchPhotos.id, photoId),
                  eq(catchPhotos.userId, userId),
                  isNull(catchPhotos.catchId),
                ),
              )
              .returning({ id: catchPhotos.id })
            // Another catch took the photo meanwhile: nothing is saved.
            if (!attached.length) throw taken
          }
          return { id: row.id, created: true }
        })
        .catch((err: unknown) => {
          if (err === taken) return undefined
          throw err
        })
    },
    /** Catches of an import, all in one transaction. */
    async insertAll(userId: string, values: CatchValues[]) {
      if (!values.length) return
      await db.transaction(async (tx) => {
        for (let i = 0; i < values.length; i += 500)
          await tx.insert(catches).values(values.slice(i, i + 500).map((v) => ({ ...v, userId })))
      })
    },
    async update(userId: string, id: string, values: CatchValues) {
      const [row] = await db
        .update(catches)
        .set(values)
        .where(and(eq(catches.id, id), eq(catches.userId, userId)))
        .returning()
      return row
    },
    async remove(userId: string, id: string) {
      return db.transaction(async (tx) => {
        const photos = await tx
          .select({ displayKey: catchPhotos.displayKey, thumbKey: catchPhotos.thumbKey })
          .from(catchPhotos)
          .innerJoin(catches, eq(catches.id, catchPhotos.catchId))
          .where(and(eq(catches.id, id), eq(catches.userId, userId)))
        const gone = await tx
          .delete(catches)
          .where(and(eq(catches.id, id), eq(catches.userId, userId)))
          .returning({ id: catches.id })
        return gone.length ? photos : null
      })
    },

    async insertPhoto(values: typeof catchPhotos.$inferInsert) {
      const [row] = await db.insert(catchPhotos).values(values).returning()
      return row!
    },
    async ownPhoto(userId: string, id: string) {
      const [row] = await db
        .select()
        .from(catchPhotos)
        .where(and(eq(catchPhotos.id, id), eq(catchPhotos.userId, userId)))
      return row
    },
    async photoOfTrip(tripId: string, id: string) {
      const [row] = await db
        .select({ photo: catchPhotos })
        .from(catchPhotos)
        .innerJoin(catches, eq(catches.id, catchPhotos.catchId))
        .where(and(eq(catchPhotos.id, id), eq(catches.tripId, tripId)))
      return row?.photo
    },
    photosOf: (ids: string[]) =>
      ids.length
        ? db.select().from(catchPhotos).where(inArray(catchPhotos.id, ids))
        : Promise.resolve([]),
  }
}
export type JournalRepo = ReturnType<typeof journalRepo>
export type CatchListRow = Awaited<ReturnType<JournalRepo['get']>> & {}
