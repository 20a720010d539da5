import { and, asc, eq, inArray, sql } from 'drizzle-orm'
import type { BriefSettings } from '../../../shared/schemas/brief'
import type { Db } from '../../db/index'
import { briefSettings, lakes, subscriptions, users } from '../../db/schema/index'

/** A subscriber's brief settings, their address and the lakes they follow. */
export function briefRepo(db: Db) {
  return {
    async view(userId: string) {
      const [[user], [row], followed] = await Promise.all([
        db
          .select({ email: users.email, verifiedAt: users.emailVerifiedAt })
          .from(users)
          .where(eq(users.id, userId)),
        db.select().from(briefSettings).where(eq(briefSettings.userId, userId)),
        db
          .select({ slug: lakes.slug, name: lakes.name, inBrief: subscriptions.inBrief })
          .from(subscriptions)
          .innerJoin(lakes, eq(lakes.id, subscriptions.lakeId))
          .where(eq(subscriptions.userId, userId))
          .orderBy(asc(lakes.name)),
      ])
      const settings: BriefSettings | null = row
        ? {
            enabled: row.enabled,
            // PostgreSQL's time comes back as HH:MM:SS.
            sendTime: row.sendTime.slice(0, 5),
            days: row.days,
            timeZone: row.timeZone,
            lakes: followed.filter((l) => l.inBrief).map((l) => l.slug),
          }
        : null
      return { user, settings, lakes: followed }
    },

    /** Followed lakes among `slugs`, by slug: what a brief may include. */
    followedSlugs: async (userId: string, slugs: string[]) =>
      slugs.length
        ? (
            await db
              .select({ slug: lakes.slug })
              .from(subscriptions)
              .innerJoin(lakes, eq(lakes.id, subscriptions.lakeId))
              .where(and(eq(subscriptions.userId, userId), inArray(lakes.slug, slugs)))
          ).map((r) => r.slug)
        : [],

    /** The settings, and which followed lakes go in the brief (all of `lakes` and none other). */
    save: (userId: string, s: BriefSettings) =>
      db.transaction(async (tx) => {
        const values = {
          enabled: s.enabled,
          sendTime: s.sendTime,
          days: [...s.days].sort(),
          timeZone: s.timeZone,
        }
        await tx
          .insert(briefSettings)
          .values({ userId, ...values })
          .onConflictDoUpdate({ target: briefSettings.userId, set: values })
        if (!s.lakes) return
        const chosen = s.lakes.length
          ? tx.select({ id: lakes.id }).from(lakes).where(inArray(lakes.slug, s.lakes))
          : undefined
        await tx
          .update(subscriptions)
          .set({ inBrief: chosen ? inArray(subscriptions.lakeId, chosen) : sql`false` })
          .where(eq(subscriptions.userId, userId))
      }),

    /** Marks the address verified if it is still the one the link was made for. */
    async markVerified(userId: string, email: string, at: Date) {
      const rows = await db
        .update(users)
        .set({ emailVerifiedAt: sql`coalesce(${users.emailVerifiedAt}, ${at})` })
        .where(and(eq(users.id, userId), eq(users.email, email)))
        .returning({ id: users.id })
      return rows.length > 0
    },

    /** Turns the brief off; false when there was no brief to turn off. */
    async disable(userId: string) {
      const rows = await db
        .update(briefSettings)
        .set({ enabled: false })
        .where(eq(briefSettings.userId, userId))
        .returning({ id: briefSettings.userId })
      return rows.length > 0
    },
  }
}
export type BriefRepo = ReturnType<typeof briefRepo>
