import { LakePage, type LakeListQuery } from '@shared/schemas/lakes'
import { apiRequest } from './http'

export const lakesApi = {
  list: (query: Partial<LakeListQuery>) => apiRequest(LakePage, '/lakes', { query }),
}
