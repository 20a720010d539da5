import { eq } from 'drizzle-orm'
import type { GuideProfile } from '../../../shared/schemas/guides'
import type { Db } from '../../db/index'
import { guideProfiles } from '../../db/schema/index'

/** A guide's profile: the name and contact their shared trips show. */
export function profileRepo(db: Db) {
  return {
    async get(guideId: string): Promise<GuideProfile | null> {
      const [row] = await db
        .select({
          name: guideProfiles.name,
          phone: guideProfiles.phone,
          email: guideProfiles.email,
        })
        .from(guideProfiles)
        .where(eq(guideProfiles.userId, guideId))
      return row ?? null
    },
    async save(guideId: string, profile: GuideProfile) {
      await db
        .insert(guideProfiles)
        .values({ userId: guideId, ...profile })
        .onConflictDoUpdate({ target: guideProfiles.userId, set: profile })
    },
  }
}
export type ProfileRepo = ReturnType<typeof profileRepo>
