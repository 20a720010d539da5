import type { User } from '../../../shared/schemas/auth'
import type { UserListQuery, UserPage, UserRoleInput } from '../../../shared/schemas/users'
import { conflict, notFound } from '../../http/errors'
import type { AuthRepo } from '../auth/auth.repo'
import { toUser } from '../auth/auth.service'
import type { UsersRepo } from './users.repo'

export function usersService(repo: UsersRepo, authRepo: AuthRepo) {
  return {
    async list(query: UserListQuery): Promise<UserPage> {
      const { rows, total } = await repo.list(query)
      return { items: rows.map(toUser), total, page: query.page, pageSize: query.pageSize }
    },

    /** A role change ends the user's sessions so the new role applies from their next sign-in. */
    async setRole(actor: User, id: string, input: UserRoleInput): Promise<User> {
      if (actor.id === id && input.role !== 'admin') {
        throw conflict('own_admin_role', 'You cannot remove your own admin role.')
      }
      const row = await repo.setRole(actor, id, input.role)
      if (!row) throw notFound('user')
      if (actor.id !== id) await authRepo.revokeAllSessions(id)
      return toUser(row)
    },
  }
}
export type UsersService = ReturnType<typeof usersService>
