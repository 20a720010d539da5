import { Settings } from '@shared/schemas/settings'
import { apiRequest } from './http'

export const settingsApi = {
  get: () => apiRequest(Settings, '/me/settings'),
  save: (body: Settings) => apiRequest(Settings, '/me/settings', { method: 'PUT', body }),
}
