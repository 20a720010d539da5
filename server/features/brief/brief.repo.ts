import { and, asc, eq, sql } from 'drizzle-orm'
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
          .select({ slug: lakes.slug, name: lakes.name })
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
            units: {
              temperature: row.temperature,
              length: row.length,
              speed: row.speed,
              clock: row.clock,
            },
          }
        : null
      return { user, settings, lakes: followed }
    },

    async save(userId: string, s: BriefSettings) {
      const values = {
        enabled: s.enabled,
        sendTime: s.sendTime,
        days: [...s.days].sort(),
        timeZone: s.timeZone,
        ...s.units,
      }
      await db
        .insert(briefSettings)
        .values({ userId, ...values })
        .onConflictDoUpdate({ target: briefSettings.userId, set: values })
    },

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
