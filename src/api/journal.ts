import type {
  CatchInput,
  CatchList,
  CatchView,
  Insights,
  InsightsQuery,
  PhotoUpload,
} from '@shared/schemas/journal'
import { apiCommand, apiRequest, upload } from './http'

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
  insights: (query: InsightsQuery) => apiRequest<Insights>('/journal/insights', { query }),
}
