import type {
  CatchInput,
  CatchList,
  CatchView,
  Insights,
  InsightsQuery,
  PhotoUpload,
} from '@shared/schemas/journal'
import { apiCommand, apiRequest, upload } from './http'
import type { CsvImportReport } from '@shared/schemas/csv-import'

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
}
