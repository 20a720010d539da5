import { LakeRead } from '@shared/schemas/lake-read'
import { LakePage, type LakeListQuery } from '@shared/schemas/lakes'
import { apiCommand, apiRequest } from './http'

export const lakesApi = {
  list: (query: Partial<LakeListQuery>) => apiRequest(LakePage, '/lakes', { query }),
  subscribe: (slug: string) =>
    apiCommand(`/lakes/${encodeURIComponent(slug)}/subscription`, { method: 'PUT' }),
  unsubscribe: (slug: string) =>
    apiCommand(`/lakes/${encodeURIComponent(slug)}/subscription`, { method: 'DELETE' }),
  read: (slug: string) => apiRequest(LakeRead, `/lakes/${encodeURIComponent(slug)}/read`),
}
