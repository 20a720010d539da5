import { DEFAULT_SETTINGS } from '../../../shared/format'
import type { Settings } from '../../../shared/schemas/settings'
import { invalid } from '../../http/errors'
import type { SettingsRepo } from './settings.repo'

export function settingsService(repo: SettingsRepo) {
  return {
    async get(userId: string): Promise<Settings> {
      return (await repo.get(userId)) ?? DEFAULT_SETTINGS
    },
    async save(userId: string, input: Settings): Promise<Settings> {
      const { homeLakeSlug, ...units } = input
      const homeLakeId = homeLakeSlug ? await repo.lakeId(homeLakeSlug) : null
      if (homeLakeSlug && !homeLakeId) {
        throw invalid('homeLakeSlug', 'No such lake.')
      }
      await repo.save(userId, { ...units, homeLakeId })
      return input
    },
  }
}
export type SettingsService = ReturnType<typeof settingsService>
