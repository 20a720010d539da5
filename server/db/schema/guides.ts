import {
  index,
  integer,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  time,
  timestamp,
  uniqueIndex,
  uuid,
  date,
} from 'drizzle-orm/pg-core'
import { timestamps } from './columns'
import { banks } from './banks'
import { lakes } from './lakes'
import { users } from './users'

/** How a guide appears on the trips they share: the name clients know and how to reach them. */
export const guideProfiles = pgTable('guide_profiles', {
  userId: uuid()
    .primaryKey()
    .references(() => users.id, { onDelete: 'cascade' }),
  name: text().notNull(),
  phone: text().notNull().default(''),
  email: text().notNull().default(''),
  ...timestamps,
})

/** A guide's client: the guide's own address book, seen by nobody else. */
export const clients = pgTable(
  'clients',
  {
    id: uuid().primaryKey().defaultRandom(),
    guideId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    // Lower-cased by the zod schema, so the unique index is case-insensitive in effect.
    email: text().notNull(),
    phone: text().notNull().default(''),
    notes: text().notNull().default(''),
    ...timestamps,
  },
  (t) => [uniqueIndex('clients_guide_email_key').on(t.guideId, t.email)],
)

/** A guided day on a lake: where and when to meet, what to bring, and the banks to fish. */
export const trips = pgTable(
  'trips',
  {
    id: uuid().primaryKey().defaultRandom(),
    guideId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    lakeId: uuid()
      .notNull()
      .references(() => lakes.id, { onDelete: 'cascade' }),
    date: date({ mode: 'string' }).notNull(),
    meetingPoint: text().notNull(),
    /** Local time at the lake. */
    meetingTime: time().notNull(),
    tackle: text().notNull().default(''),
    notes: text().notNull().default(''),
    ...timestamps,
  },
  (t) => [
    index('trips_guide_date_idx').on(t.guideId, t.date),
    // A lake's refresh keeps the past days that have a trip on them: looked up by lake and date.
    index('trips_lake_date_idx').on(t.lakeId, t.date),
  ],
)

/** The guide's banks a trip will fish, in order; deleting a bank takes it off its trips. */
export const tripBanks = pgTable(
  'trip_banks',
  {
    tripId: uuid()
      .notNull()
      .references(() => trips.id, { onDelete: 'cascade' }),
    bankId: uuid()
      .notNull()
      .references(() => banks.id, { onDelete: 'cascade' }),
    position: integer().notNull(),
  },
  (t) => [primaryKey({ columns: [t.tripId, t.bankId] })],
)

/** A link that opens one trip read-only without an account, until it expires or is revoked. */
export const tripShares = pgTable(
  'trip_shares',
  {
    id: uuid().primaryKey().defaultRandom(),
    tripId: uuid()
      .notNull()
      .references(() => trips.id, { onDelete: 'cascade' }),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    revokedAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('trip_shares_trip_idx').on(t.tripId)],
)

export const shareSendStatus = pgEnum('share_send_status', ['sent', 'failed'])

/** Who was sent which link, and when: the address is kept as it was when sent. */
export const tripShareSends = pgTable(
  'trip_share_sends',
  {
    id: uuid().primaryKey().defaultRandom(),
    shareId: uuid()
      .notNull()
      .references(() => tripShares.id, { onDelete: 'cascade' }),
    clientId: uuid().references(() => clients.id, { onDelete: 'set null' }),
    name: text().notNull(),
    email: text().notNull(),
    status: shareSendStatus().notNull(),
    error: text(),
    sentAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('trip_share_sends_share_idx').on(t.shareId)],
)
