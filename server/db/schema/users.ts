import { index, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { ROLES } from '../../../shared/roles'
import { timestamps } from './columns'

export const role = pgEnum('role', ROLES)

export const users = pgTable(
  'users',
  {
    id: uuid().primaryKey().defaultRandom(),
    // Stored lower-cased by the zod schema, so a plain unique index is case-insensitive in effect.
    email: text().notNull(),
    passwordHash: text().notNull(),
    role: role().notNull().default('angler'),
    /** Set when the owner opens a verification link; the morning brief goes only to verified addresses. */
    emailVerifiedAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [uniqueIndex('users_email_key').on(t.email)],
)

/** A signed-in browser. The JWT names the row; revoking the row ends the session at once. */
export const sessions = pgTable(
  'sessions',
  {
    id: uuid().primaryKey().defaultRandom(),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    revokedAt: timestamp({ withTimezone: true }),
  },
  (t) => [index('sessions_user_id_idx').on(t.userId)],
)
