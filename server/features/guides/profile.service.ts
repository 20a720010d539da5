import type { GuideProfile, GuideProfileView } from '../../../shared/schemas/guides'
import type { ProfileRepo } from './profile.repo'

/** The guide's name and contact, as every trip they share shows it. */
export function profileService(repo: ProfileRepo) {
  return {
    view: async (guideId: string): Promise<GuideProfileView> => ({
      profile: await repo.get(guideId),
    }),
    async save(guideId: string, profile: GuideProfile): Promise<GuideProfileView> {
      await repo.save(guideId, profile)
      return { profile: await repo.get(guideId) }
    },
  }
}
export type ProfileService = ReturnType<typeof profileService>
