import { sql } from 'drizzle-orm'
import {
  boolean,
  date,
  index,
  integer,
  pgEnum,
  pgTable,
  primaryKey,
  smallint,
  text,
  time,
  timestamp,
  uuid,
} from 'drizzle-orm/pg-core'
import { BRIEF_SEND_STATUSES, DEFAULT_SEND_TIME } from '../../../shared/schemas/brief'
import { timestamps } from './columns'
import { users } from './users'

/** A subscriber's morning brief: when and in which zone (units are the account's). No row: no brief. */
export const briefSettings = pgTable('brief_settings', {
  userId: uuid()
    .primaryKey()
    .references(() => users.id, { onDelete: 'cascade' }),
  enabled: boolean().notNull().default(true),
  /** Local wall-clock time in `time_zone`; compared as wall-clock time, so DST shifts nothing. */
  sendTime: time().notNull().default(DEFAULT_SEND_TIME),
  /** ISO weekdays (Monday 1 … Sunday 7), as PostgreSQL's `isodow`. */
  days: smallint()
    .array()
    .notNull()
    .default(sql`'{1,2,3,4,5,6,7}'`),
  timeZone: text().notNull(),
  ...timestamps,
})

export const briefSendStatus = pgEnum('brief_send_status', BRIEF_SEND_STATUSES)

/**
 * One row per subscriber and local date, claimed before the brief is sent: the primary key is
 * what makes it once a day across runs, restarts and instances. `sending` holds a lease; a
 * runner that dies leaves it to expire and the next run takes the row over.
 */
export const briefSends = pgTable(
  'brief_sends',
  {
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    localDate: date({ mode: 'string' }).notNull(),
    status: briefSendStatus().notNull(),
    attempts: integer().notNull().default(1),
    leaseUntil: timestamp({ withTimezone: true }),
    nextAttemptAt: timestamp({ withTimezone: true }),
    sentAt: timestamp({ withTimezone: true }),
    messageId: text(),
    lastError: text(),
    ...timestamps,
  },
  (t) => [
    primaryKey({ columns: [t.userId, t.localDate] }),
    // The retry scan and the admin list read only rows that are not done.
    index('brief_sends_open_idx')
      .on(t.status, t.nextAttemptAt)
      .where(sql`${t.status} <> 'sent'`),
  ],
)
