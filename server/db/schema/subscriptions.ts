import { pgTable, primaryKey, timestamp, uuid } from 'drizzle-orm/pg-core'
import { lakes } from './lakes'
import { users } from './users'

/** An angler follows a lake; the morning brief adds its settings here. */
export const subscriptions = pgTable(
  'subscriptions',
  {
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    lakeId: uuid()
      .notNull()
      .references(() => lakes.id, { onDelete: 'cascade' }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.lakeId] })],
)
