import { eq } from 'drizzle-orm'
import { DEFAULT_SETTINGS } from '../../../shared/format'
import type { BriefUnits } from '../../../shared/schemas/brief'
import type { Db } from '../../db/index'
import { lakes, userSettings } from '../../db/schema/index'

/** An account's units, to select (nested) beside a left join of user_settings. */
export const UNIT_COLUMNS = {
  temperature: userSettings.temperature,
  length: userSettings.length,
  speed: userSettings.speed,
  clock: userSettings.clock,
}

/** The selected units, or the defaults where the account has saved none (no user_settings row). */
export const unitsOrDefault = (u: BriefUnits | null): BriefUnits => {
  const { temperature, length, speed, clock } = u ?? DEFAULT_SETTINGS
  return { temperature, length, speed, clock }
}

export function settingsRepo(db: Db) {
  return {
    async get(userId: string) {
      const [row] = await db
        .select({
          ...UNIT_COLUMNS,
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
