import { sql } from 'drizzle-orm'
import {
  boolean,
  date,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core'
import type { WatchMatch } from '../../../shared/conditions/watch'
import type { WatchConditions } from '../../../shared/schemas/watch'
import { banks } from './banks'
import { timestamps } from './columns'
import { trips } from './guides'
import { lakes } from './lakes'
import { users } from './users'

export const watchKind = pgEnum('watch_kind', ['angler', 'trip'])

/**
 * A bank watch: conditions an angler waits for on a bank or a whole lake, judged against each
 * lake's stored days after every refresh. A guide's trip has one of kind `trip`, made for it.
 */
export const watches = pgTable(
  'watches',
  {
    id: uuid().primaryKey().defaultRandom(),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    lakeId: uuid()
      .notNull()
      .references(() => lakes.id, { onDelete: 'cascade' }),
    bankId: uuid().references(() => banks.id, { onDelete: 'cascade' }),
    tripId: uuid().references(() => trips.id, { onDelete: 'cascade' }),
    kind: watchKind().notNull().default('angler'),
    name: text().notNull(),
    conditions: jsonb().$type<WatchConditions>().notNull(),
    channels: text().array().$type<('email' | 'push')[]>().notNull(),
    active: boolean().notNull().default(true),
    /**
     * Each window's last alert episode by `date/window`: positive while it matches, negative once
     * it stopped. What a run compares the new forecast against, read with the watch itself.
     */
    episodes: jsonb().$type<Record<string, number>>().notNull().default({}),
    ...timestamps,
  },
  (t) => [index('watches_user_idx').on(t.userId), uniqueIndex('watches_trip_key').on(t.tripId)],
)

export const watchAlertStatus = pgEnum('watch_alert_status', ['sending', 'retry', 'sent', 'failed'])

/**
 * One row per watch, forecast window and episode, inserted before anything is sent: the primary
 * key is what makes an alert go once across runs, restarts and instances. A window that stops
 * matching gets `cleared_at`; matching again starts the next episode, which is told again.
 * `window_id` is dawn, midday, afternoon, or `day` for a trip's day.
 */
export const watchAlerts = pgTable(
  'watch_alerts',
  {
    watchId: uuid()
      .notNull()
      .references(() => watches.id, { onDelete: 'cascade' }),
    date: date({ mode: 'string' }).notNull(),
    windowId: text().notNull(),
    episode: integer().notNull(),
    /** What matched, in SI, for the words of the alert. */
    match: jsonb().$type<WatchMatch | Record<string, unknown>>().notNull(),
    status: watchAlertStatus().notNull(),
    attempts: integer().notNull().default(1),
    /** The channels that took the alert: a retry never tells one twice. */
    delivered: text()
      .array()
      .$type<('email' | 'push')[]>()
      .notNull()
      .default(sql`'{}'`),
    leaseUntil: timestamp({ withTimezone: true }),
    nextAttemptAt: timestamp({ withTimezone: true }),
    sentAt: timestamp({ withTimezone: true }),
    lastError: text(),
    clearedAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    primaryKey({ columns: [t.watchId, t.date, t.windowId, t.episode] }),
    index('watch_alerts_open_idx')
      .on(t.status, t.nextAttemptAt)
      .where(sql`${t.status} <> 'sent'`),
  ],
)

/** A browser's Web Push subscription; dropped when the push service answers 404 or 410. */
export const pushSubscriptions = pgTable(
  'push_subscriptions',
  {
    id: uuid().primaryKey().defaultRandom(),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    endpoint: text().notNull(),
    p256dh: text().notNull(),
    auth: text().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('push_subscriptions_endpoint_key').on(t.endpoint),
    index('push_subscriptions_user_idx').on(t.userId),
  ],
)
