import type { DayPlanResponse } from '@shared/schemas/day-plan'
import type { LakeRead, LakeShape } from '@shared/schemas/lake-read'
import type { LakeSeries } from '@shared/schemas/lake-series'
import type { LakeNames, LakePage, LakeListQuery } from '@shared/schemas/lakes'
import type { MaybeRef } from 'vue'
import { apiCommand, apiRequest } from './http'

const LAKES = ['lakes'] as const
/** The lakes domain's query keys; invalidating `all` refreshes every list, picker and desk entry. */
export const lakeKeys = {
  all: LAKES,
  names: () => [...LAKES, 'names'] as const,
  desk: (slug: MaybeRef<string | null>) => [...LAKES, 'desk', slug] as const,
  recompute: (slug: MaybeRef<string | null>) => [...LAKES, 'recompute', slug] as const,
  read: (slug: string) => ['lake-read', slug] as const,
  plan: (slug: string, date: string) => ['day-plan', slug, date] as const,
  series: (slug: MaybeRef<string>, days: MaybeRef<number>) => ['lake-series', slug, days] as const,
  shoreline: (slug: MaybeRef<string>) => ['shoreline', slug] as const,
}

/** API paths of the answers a page marks when they were saved (see OfflineMark). */
export const lakeApiPaths = {
  read: (slug: string) => `/lakes/${encodeURIComponent(slug)}/read`,
  plan: (slug: string, date: string) => `/lakes/${encodeURIComponent(slug)}/plan/${date}`,
}

export const lakesApi = {
  list: (query: Partial<LakeListQuery>) => apiRequest<LakePage>('/lakes', { query }),
  /** Every lake's name and slug, for pickers (the list above is paged). */
  names: () => apiRequest<LakeNames>('/lakes/names'),
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

/** Every lake for a picker, as `{ label: name, value: slug }` options. */
export const lakeOptionsQuery = () => ({
  queryKey: lakeKeys.names(),
  queryFn: lakesApi.names,
  select: (data: LakeNames) => data.items.map((l) => ({ label: l.name, value: l.slug })),
  staleTime: 5 * 60_000,
})

/**
 * The Lake read's query, shared by the page and the router, which starts it while the sign-in
 * check and the page's code are still loading. Gauges report every 15 minutes.
 */
export const lakeReadQuery = (slug: string) => ({
  queryKey: lakeKeys.read(slug),
  queryFn: () => lakesApi.read(slug),
  staleTime: 60_000,
  refetchInterval: 5 * 60_000,
})

/** The Day plan's query, shared by the page and the router, which starts it alongside the page's code. */
export const dayPlanQuery = (slug: string, date: string) => ({
  queryKey: lakeKeys.plan(slug, date),
  queryFn: () => lakesApi.plan(slug, date),
})
