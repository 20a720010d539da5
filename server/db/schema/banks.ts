import type { ExposureTable } from '../../../shared/conditions/exposure'
import type { Cover } from '../../../shared/conditions/tackle-rules'
import type { Position } from '../../../shared/geo/types'
import { BANK_SLOPES } from '../../../shared/schemas/banks'
import {
  doublePrecision,
  jsonb,
  pgEnum,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core'
import { timestamps } from './columns'
import { lakes } from './lakes'
import { users } from './users'

export const bankSlope = pgEnum('bank_slope', BANK_SLOPES)

/**
 * A stretch of shore an angler fishes, private to that angler. The exposure table (fetch and
 * effective fetch for 16 wind directions) is computed when the bank is saved, so ranking banks on
 * a page view never touches the geometry.
 */
export const banks = pgTable(
  'banks',
  {
    id: uuid().primaryKey().defaultRandom(),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    lakeId: uuid()
      .notNull()
      .references(() => lakes.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    /** Points along the shoreline, snapped to it, WGS84 [lon, lat]. */
    points: jsonb().$type<Position[]>().notNull(),
    cover: text().array().$type<Cover[]>().notNull(),
    depthM: doublePrecision(),
    slope: bankSlope(),
    notes: text().notNull().default(''),
    exposure: jsonb().$type<ExposureTable>().notNull(),
    /** Set when a new shoreline left the bank's points off the shore: kept, but flagged to redraw. */
    detachedAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  // Also serves "an angler's banks on a lake" by its first two columns.
  (t) => [uniqueIndex('banks_user_lake_name_key').on(t.userId, t.lakeId, t.name)],
)
