import type { Me, Role } from '@shared/schemas/auth'
import type { UserPage, UserListQuery } from '@shared/schemas/users'
import { apiRequest } from './http'

export const usersApi = {
  list: (query: Partial<UserListQuery>) => apiRequest<UserPage>('/admin/users', { query }),
  setRole: (id: string, role: Role) =>
    apiRequest<Me>(`/admin/users/${encodeURIComponent(id)}`, { method: 'PATCH', body: { role } }),
}
