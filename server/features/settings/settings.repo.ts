import { eq } from 'drizzle-orm'
import type { Db } from '../../db/index'
import { lakes, userSettings } from '../../db/schema/index'

export function settingsRepo(db: Db) {
  return {
    async get(userId: string) {
      const [row] = await db
        .select({
          temperature: userSettings.temperature,
          length: userSettings.length,
          speed: userSettings.speed,
          clock: userSettings.clock,
          homeLakeSlug: lakes.slug,
        })
        .from(userSettings)
        .leftJoin(lakes, eq(lakes.id, userSettings.homeLakeId))
        .where(eq(userSettings.userId, userId))
      return row
    },
    async lakeId(slug: string) {
      const [row] = await db.select({ id: lakes.id }).from(lakes).where(eq(lakes.slug, slug))
      return row?.id
    },
    save: (userId: string, values: Omit<typeof userSettings.$inferInsert, 'userId'>) =>
      db
        .insert(userSettings)
        .values({ userId, ...values })
        .onConflictDoUpdate({ target: userSettings.userId, set: values }),
  }
}
export type SettingsRepo = ReturnType<typeof settingsRepo>
