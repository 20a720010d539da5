import { and, eq } from 'drizzle-orm'
import type { PushSubscriptionInput } from '../../../shared/schemas/push'
import type { Db } from '../../db/index'
import { pushSubscriptions } from '../../db/schema/index'

export function pushRepo(db: Db) {
  return {
    forUser: (userId: string) =>
      db.select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, userId)),
    /** A browser's subscription; the same endpoint signed in as someone else moves to them. */
    async save(userId: string, sub: PushSubscriptionInput) {
      const values = { userId, endpoint: sub.endpoint, ...sub.keys }
      await db
        .insert(pushSubscriptions)
        .values(values)
        .onConflictDoUpdate({ target: pushSubscriptions.endpoint, set: values })
    },
    remove: (userId: string, endpoint: string) =>
      db
        .delete(pushSubscriptions)
        .where(and(eq(pushSubscriptions.userId, userId), eq(pushSubscriptions.endpoint, endpoint))),
    /** The push service said the subscription is gone (404 or 410). */
    drop: (endpoint: string) =>
      db.delete(pushSubscriptions).where(eq(pushSubscriptions.endpoint, endpoint)),
  }
}
export type PushRepo = ReturnType<typeof pushRepo>
