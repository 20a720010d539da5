import { and, count, desc, eq, ilike, type SQL } from 'drizzle-orm'
import type { Role } from '../../../shared/schemas/auth'
import type { UserListQuery } from '../../../shared/schemas/users'
import type { Db } from '../../db/index'
import { users } from '../../db/schema/index'
import { publicUserColumns } from '../auth/auth.repo'

export function usersRepo(db: Db) {
  return {
    async list(query: UserListQuery) {
      const filters: SQL[] = []
      if (query.q) filters.push(ilike(users.email, `%${escapeLike(query.q)}%`))
      if (query.role) filters.push(eq(users.role, query.role))
      const where = filters.length ? and(...filters) : undefined
      const [rows, [total]] = await Promise.all([
        db
          .select(publicUserColumns)
          .from(users)
          .where(where)
          .orderBy(desc(users.createdAt), users.email)
          .limit(query.pageSize)
          .offset((query.page - 1) * query.pageSize),
        db.select({ n: count() }).from(users).where(where),
      ])
      return { rows, total: total?.n ?? 0 }
    },
    async setRole(id: string, role: Role) {
      const [row] = await db
        .update(users)
        .set({ role })
        .where(eq(users.id, id))
        .returning(publicUserColumns)
      return row
    },
  }
}
export type UsersRepo = ReturnType<typeof usersRepo>

export function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`)
}
