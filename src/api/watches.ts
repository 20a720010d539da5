import type { CaughtPush } from '@shared/schemas/push'
import type { SentAlert, Watch, WatchInput, WatchList, WatchPatch } from '@shared/schemas/watch'
import { apiCommand, apiRequest } from './http'

/** The watches domain's query keys: an angler's watches; for admins, alerts sent and pushes caught. */
export const watchKeys = {
  list: ['watches'] as const,
  alerts: ['admin', 'alerts'] as const,
  pushbox: ['admin', 'pushbox'] as const,
}

export const watchesApi = {
  list: () => apiRequest<WatchList>('/watches'),
  create: (body: WatchInput) => apiRequest<Watch>('/watches', { method: 'POST', body }),
  update: (id: string, body: WatchInput) =>
    apiRequest<Watch>(`/watches/${encodeURIComponent(id)}`, { method: 'PUT', body }),
  patch: (id: string, body: WatchPatch) =>
    apiRequest<Watch>(`/watches/${encodeURIComponent(id)}`, { method: 'PATCH', body }),
  remove: (id: string) => apiCommand(`/watches/${encodeURIComponent(id)}`, { method: 'DELETE' }),
  /** Admins: alerts sent or being sent, and what the local push stand-in caught. */
  alerts: () => apiRequest<{ items: SentAlert[] }>('/admin/alerts'),
  pushbox: () => apiRequest<{ items: CaughtPush[] }>('/admin/pushbox'),
  /** The stop link in an alert's mail: pauses the watch the signed token names. */
  stop: (token: string) => apiCommand('/watch/unsubscribe', { query: { token } }),
}

export const watchesQuery = { queryKey: watchKeys.list, queryFn: watchesApi.list }
