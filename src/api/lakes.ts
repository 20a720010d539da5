import { LakeRead } from '@shared/schemas/lake-read'
import { LakePage, type LakeListQuery } from '@shared/schemas/lakes'
import { apiRequest } from './http'

export const lakesApi = {
  list: (query: Partial<LakeListQuery>) => apiRequest(LakePage, '/lakes', { query }),
  read: (slug: string) => apiRequest(LakeRead, `/lakes/${encodeURIComponent(slug)}/read`),
}
