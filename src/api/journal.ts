import type {
  CatchInput,
  CatchList,
  CatchView,
  Insights,
  InsightsQuery,
  PhotoUpload,
} from '@shared/schemas/journal'
import type { MaybeRef } from 'vue'
import { apiCommand, apiRequest, upload } from './http'
import type { CsvImportReport } from '@shared/schemas/csv-import'

type TripCatches = { items: CatchView[] }

const JOURNAL = ['journal'] as const
/**
 * The journal's query keys; a trip's catches sit under `journal` too, so logging a catch refreshes
 * them with the list.
 */
export const journalKeys = {
  all: JOURNAL,
  catches: [...JOURNAL, 'catches'] as const,
  entry: (id: MaybeRef<string>) => [...JOURNAL, 'catch', id] as const,
  insights: (lake: MaybeRef<string | null>, season: MaybeRef<string | null>) =>
    [...JOURNAL, 'insights', lake, season] as const,
  trip: (id: MaybeRef<string>) => [...JOURNAL, 'trip', id] as const,
  shared: (token: MaybeRef<string>) => ['shared-trip', token, 'catches'] as const,
}

export const journalApi = {
  list: (query: { lake?: string; page?: number; pageSize?: number } = {}) =>
    apiRequest<CatchList>('/journal/catches', { query }),
  get: (id: string) => apiRequest<CatchView>(`/journal/catches/${id}`),
  create: (input: CatchInput) =>
    apiRequest<CatchView>('/journal/catches', { method: 'POST', body: input }),
  update: (id: string, input: CatchInput) =>
    apiRequest<CatchView>(`/journal/catches/${id}`, { method: 'PUT', body: input }),
  remove: (id: string) => apiCommand(`/journal/catches/${id}`, { method: 'DELETE' }),
  uploadPhoto: (file: File, lake?: string) =>
    apiRequest<PhotoUpload>('/journal/photos', {
      method: 'POST',
      body: upload(file),
      query: { lake },
    }),
  /** A preview (nothing saved) unless `commit`. */
  importCsv: (file: File, commit: boolean) =>
    apiRequest<CsvImportReport>('/journal/import', {
      method: 'POST',
      body: upload(file),
      query: { commit: String(commit) },
    }),
  /** Where the browser downloads the journal as CSV. */
  exportUrl: '/api/journal/export.csv',
  insights: (query: InsightsQuery) => apiRequest<Insights>('/journal/insights', { query }),
  /** A guide's catches on one of their trips. */
  tripCatches: (tripId: string) => apiRequest<TripCatches>(`/guide/trips/${tripId}/catches`),
  /** A trip's catches as its clients see them through the share link. */
  sharedCatches: (token: string) =>
    apiRequest<TripCatches>(`/shared/trips/${encodeURIComponent(token)}/catches`),
}
