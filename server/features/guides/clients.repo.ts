import { and, asc, eq, inArray, ne } from 'drizzle-orm'
import type { ClientInput } from '../../../shared/schemas/guides'
import type { Db } from '../../db/index'
import { clients } from '../../db/schema/index'

/** A guide's clients; every query is scoped to the guide, so another guide's client is not found. */
export function clientsRepo(db: Db) {
  const owned = (guideId: string, id: string) =>
    and(eq(clients.guideId, guideId), eq(clients.id, id))
  return {
    list: (guideId: string) =>
      db.select().from(clients).where(eq(clients.guideId, guideId)).orderBy(asc(clients.name)),
    byIds: (guideId: string, ids: string[]) =>
      db
        .select()
        .from(clients)
        .where(and(eq(clients.guideId, guideId), inArray(clients.id, ids))),
    /** Inserts unless the guide already has a client with that address; undefined then. */
    async insert(guideId: string, values: ClientInput) {
      const [row] = await db
        .insert(clients)
        .values({ ...values, guideId })
        .onConflictDoNothing()
        .returning()
      return row
    },
    /** All rows or none: a unique clash anywhere rolls the whole file back. */
    insertAll: (guideId: string, rows: ClientInput[]) =>
      db.transaction((tx) => tx.insert(clients).values(rows.map((r) => ({ ...r, guideId })))),
    async emailTaken(guideId: string, email: string, exceptId: string) {
      const [row] = await db
        .select({ id: clients.id })
        .from(clients)
        .where(
          and(eq(clients.guideId, guideId), eq(clients.email, email), ne(clients.id, exceptId)),
        )
      return !!row
    },
    async update(guideId: string, id: string, values: ClientInput) {
      const [row] = await db.update(clients).set(values).where(owned(guideId, id)).returning()
      return row
    },
    async remove(guideId: string, id: string) {
      const gone = await db.delete(clients).where(owned(guideId, id)).returning({ id: clients.id })
      return gone.length > 0
    },
  }
}
export type ClientsRepo = ReturnType<typeof clientsRepo>
