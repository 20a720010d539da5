import { bigserial, index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'

/**
 * Every admin action: who, what, when, the row before and after. Append-only: a trigger in the
 * migration refuses UPDATE, DELETE and TRUNCATE, so nobody (admins included) can edit it. The
 * actor is kept by id and e-mail without a foreign key, so deleting a user leaves the log whole.
 */
export const auditLog = pgTable(
  'audit_log',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    actorId: uuid().notNull(),
    actorEmail: text().notNull(),
    action: text().notNull(),
    targetType: text().notNull(),
    targetId: text().notNull(),
    before: jsonb(),
    after: jsonb(),
    at: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('audit_log_at_idx').on(t.at)],
)
