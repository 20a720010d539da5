import { and, count, desc, eq, ilike, type SQL } from 'drizzle-orm'
import type { Role, User } from '../../../shared/schemas/auth'
import type { UserListQuery } from '../../../shared/schemas/users'
import type { Db } from '../../db/index'
import { escapeLike } from '../../db/like'
import { users } from '../../db/schema/index'
import { audit } from '../audit/audit.repo'
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
    /** Changes the role and writes the audit entry in one transaction. */
    setRole: (actor: Pick<User, 'id' | 'email'>, id: string, role: Role) =>
      db.transaction(async (tx) => {
        const [before] = await tx
          .select({ role: users.role })
          .from(users)
          .where(eq(users.id, id))
          .for('update')
        if (!before) return undefined
        const [row] = await tx
          .update(users)
          .set({ role })
          .where(eq(users.id, id))
          .returning(publicUserColumns)
        await audit(tx, actor, {
          action: 'user.role',
          targetType: 'user',
          targetId: id,
          before,
          after: { role },
        })
        return row
      }),
  }
}
export type UsersRepo = ReturnType<typeof usersRepo>
