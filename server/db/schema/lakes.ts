import type { MultiPolygon, Polygon } from '../../../shared/geo/types'
import {
  doublePrecision,
  integer,
  jsonb,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core'
import { timestamps } from './columns'

export const lakes = pgTable(
  'lakes',
  {
    id: uuid().primaryKey().defaultRandom(),
    slug: text().notNull(),
    name: text().notNull(),
    region: text().notNull(),
    timeZone: text().notNull(),
    /** Normal pool elevation, metres above the datum. */
    normalPoolM: doublePrecision().notNull(),
    /** The shoreline as GeoJSON in WGS84; interior rings are islands. */
    shoreline: jsonb().$type<Polygon | MultiPolygon>().notNull(),
    areaKm2: doublePrecision().notNull(),
    centerLon: doublePrecision().notNull(),
    centerLat: doublePrecision().notNull(),
    ...timestamps,
  },
  (t) => [uniqueIndex('lakes_slug_key').on(t.slug)],
)

/**
 * Recomputing a lake's bank exposure tables after its shoreline is replaced: one row a lake,
 * the latest run, so any instance can report its progress.
 */
export const lakeRecomputes = pgTable('lake_recomputes', {
  lakeId: uuid()
    .primaryKey()
    .references(() => lakes.id, { onDelete: 'cascade' }),
  total: integer().notNull(),
  done: integer().notNull().default(0),
  detached: integer().notNull().default(0),
  startedAt: timestamp({ withTimezone: true }).notNull(),
  finishedAt: timestamp({ withTimezone: true }),
  error: text(),
})
