import type { DayPlanResponse } from '@shared/schemas/day-plan'
import type { LakeRead, LakeShape } from '@shared/schemas/lake-read'
import type { LakeSeries } from '@shared/schemas/lake-series'
import type { LakePage, LakeListQuery } from '@shared/schemas/lakes'
import { apiCommand, apiRequest } from './http'

/** API paths of the answers a page marks when they were saved (see OfflineMark). */
export const lakeApiPaths = {
  read: (slug: string) => `/lakes/${encodeURIComponent(slug)}/read`,
  plan: (slug: string, date: string) => `/lakes/${encodeURIComponent(slug)}/plan/${date}`,
}

export const lakesApi = {
  list: (query: Partial<LakeListQuery>) => apiRequest<LakePage>('/lakes', { query }),
  subscribe: (slug: string) =>
    apiCommand(`/lakes/${encodeURIComponent(slug)}/subscription`, { method: 'PUT' }),
  unsubscribe: (slug: string) =>
    apiCommand(`/lakes/${encodeURIComponent(slug)}/subscription`, { method: 'DELETE' }),
  series: (slug: string, days: 7 | 30) =>
    apiRequest<LakeSeries>(`/lakes/${encodeURIComponent(slug)}/series`, { query: { days } }),
  read: (slug: string) => apiRequest<LakeRead>(lakeApiPaths.read(slug)),
  shape: (slug: string) => apiRequest<LakeShape>(`/lakes/${encodeURIComponent(slug)}/shoreline`),
  plan: (slug: string, date: string) => apiRequest<DayPlanResponse>(lakeApiPaths.plan(slug, date)),
}

/**
 * The Lake read's query, shared by the page and the router, which starts it while the sign-in
 * check and the page's code are still loading. Gauges report every 15 minutes.
 */
export const lakeReadQuery = (slug: string) => ({
  queryKey: ['lake-read', slug],
  queryFn: () => lakesApi.read(slug),
  staleTime: 60_000,
  refetchInterval: 5 * 60_000,
})

/** The Day plan's query, shared by the page and the router, which starts it alongside the page's code. */
export const dayPlanQuery = (slug: string, date: string) => ({
  queryKey: ['day-plan', slug, date],
  queryFn: () => lakesApi.plan(slug, date),
})
