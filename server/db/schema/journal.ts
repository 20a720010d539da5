import type { Position } from '../../../shared/geo/types'
import { SPECIES, type CatchConditions, type LureInput } from '../../../shared/schemas/journal'
import {
  boolean,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core'
import { timestamps } from './columns'
import { banks } from './banks'
import { trips } from './guides'
import { lakes } from './lakes'
import { users } from './users'

export const species = pgEnum('species', SPECIES)

/**
 * A fish an angler logged, private to them. A guide's catch on a trip names the trip, so the
 * trip's clients see it on the trip page. `conditions` is computed by the server from the stored
 * readings and weather at the catch's time and place, never typed.
 */
export const catches = pgTable(
  'catches',
  {
    id: uuid().primaryKey().defaultRandom(),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    lakeId: uuid()
      .notNull()
      .references(() => lakes.id, { onDelete: 'cascade' }),
    // A deleted trip or bank leaves the catch in its angler's journal.
    tripId: uuid().references(() => trips.id, { onDelete: 'set null' }),
    bankId: uuid().references(() => banks.id, { onDelete: 'set null' }),
    caughtAt: timestamp({ withTimezone: true }).notNull(),
    species: species().notNull(),
    lengthM: doublePrecision(),
    weightKg: doublePrecision(),
    released: boolean().notNull(),
    lure: jsonb().$type<LureInput>().notNull(),
    /** Where it was caught, WGS84 [lon, lat], when the phone or the angler said. */
    position: jsonb().$type<Position>(),
    note: text().notNull().default(''),
    conditions: jsonb().$type<CatchConditions>(),
    /**
     * The id the phone gave the catch when it was logged (offline, it waits on the phone): sent
     * again, it finds this catch instead of logging the fish twice.
     */
    clientId: uuid(),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('catches_user_client_id_key').on(t.userId, t.clientId),
    // An angler's journal, newest first, and their insights: both read by these two columns.
    index('catches_user_caught_idx').on(t.userId, t.caughtAt.desc()),
    index('catches_trip_idx').on(t.tripId),
  ],
)

/**
 * A photo's stored copies in object storage (a display size and a thumbnail, both without
 * location metadata). Uploaded before its catch is saved, so `catchId` is null until then.
 */
export const catchPhotos = pgTable(
  'catch_photos',
  {
    id: uuid().primaryKey().defaultRandom(),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    catchId: uuid().references(() => catches.id, { onDelete: 'cascade' }),
    displayKey: text().notNull(),
    thumbKey: text().notNull(),
    width: integer().notNull(),
    height: integer().notNull(),
    bytes: integer().notNull(),
    /** When the camera says it was taken; the GPS position is never kept. */
    takenAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('catch_photos_catch_idx').on(t.catchId),
    index('catch_photos_user_idx').on(t.userId),
  ],
)
