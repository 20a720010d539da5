import { count, desc, eq } from 'drizzle-orm'
import type { AuditPage, AuditQuery } from '../../../shared/schemas/audit'
import type { User } from '../../../shared/schemas/auth'
import type { Db } from '../../db/index'
import { auditLog } from '../../db/schema/index'

/** A database or a transaction: audit entries are written inside the change they record. */
type Executor = Pick<Db, 'insert'>

export interface AuditRecord {
  action: string
  targetType: string
  targetId: string
  before: unknown
  after: unknown
}

/** Writes one entry for `actor`; call it with the transaction that makes the change. */
export function audit(tx: Executor, actor: Pick<User, 'id' | 'email'>, entry: AuditRecord) {
  return tx.insert(auditLog).values({ actorId: actor.id, actorEmail: actor.email, ...entry })
}

export function auditRepo(db: Db) {
  return {
    async list(query: AuditQuery): Promise<AuditPage> {
      const where = query.action ? eq(auditLog.action, query.action) : undefined
      const [rows, [total]] = await Promise.all([
        db
          .select()
          .from(auditLog)
          .where(where)
          .orderBy(desc(auditLog.at), desc(auditLog.id))
          .limit(query.pageSize)
          .offset((query.page - 1) * query.pageSize),
        db.select({ n: count() }).from(auditLog).where(where),
      ])
      return {
        items: rows.map(({ actorId: _actor, at, ...r }) => ({ ...r, at: at.toISOString() })),
        total: total?.n ?? 0,
        page: query.page,
        pageSize: query.pageSize,
      }
    },
  }
}
export type AuditRepo = ReturnType<typeof auditRepo>
