import { boolean, pgTable, primaryKey, timestamp, uuid } from 'drizzle-orm/pg-core'
import { lakes } from './lakes'
import { users } from './users'

/** An angler follows a lake, and chooses whether it goes in the morning brief. */
export const subscriptions = pgTable(
  'subscriptions',
  {
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    lakeId: uuid()
      .notNull()
      .references(() => lakes.id, { onDelete: 'cascade' }),
    /** Whether the lake goes in the morning brief; a newly followed lake does. */
    inBrief: boolean().notNull().default(true),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.lakeId] })],
)
