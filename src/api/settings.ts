import type { Settings } from '@shared/schemas/settings'
import { apiRequest } from './http'

export const settingsApi = {
  get: () => apiRequest<Settings>('/me/settings'),
  save: (body: Settings) => apiRequest<Settings>('/me/settings', { method: 'PUT', body }),
}

/**
 * The signed-in user's settings, shared by every page (units and clock) and the router, which
 * starts it beside the sign-in check so a page renders once, in the right units. Settings change
 * only through the Settings page, which writes the answer into this cache.
 */
export const settingsQuery = {
  queryKey: ['settings'],
  queryFn: settingsApi.get,
  staleTime: 5 * 60_000,
}
