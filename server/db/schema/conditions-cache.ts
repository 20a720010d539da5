import type { LakeDay } from '../../../shared/conditions/day-plan'
import type { LakeRead } from '../../../shared/schemas/lake-read'
import { date, jsonb, pgTable, primaryKey, timestamp, uuid } from 'drizzle-orm/pg-core'
import { lakes } from './lakes'

/**
 * The Lake read as of the last ingest, one row a lake: page views read it instead of recomputing
 * trends over a month of readings. Ages and stale flags are re-judged against the clock on read.
 */
export const lakeReads = pgTable('lake_reads', {
  lakeId: uuid()
    .primaryKey()
    .references(() => lakes.id, { onDelete: 'cascade' }),
  read: jsonb().$type<LakeRead>().notNull(),
  computedAt: timestamp({ withTimezone: true }).notNull(),
  /** Until then the stored stale flags are right and the read is served as stored; null: for good. */
  flagsHoldUntil: timestamp({ withTimezone: true }),
})

/** A lake's day (windows, wind, waves, phase) for today and each forecast day, after each ingest. */
export const lakeDays = pgTable(
  'lake_days',
  {
    lakeId: uuid()
      .notNull()
      .references(() => lakes.id, { onDelete: 'cascade' }),
    date: date({ mode: 'string' }).notNull(),
    day: jsonb().$type<LakeDay>().notNull(),
    computedAt: timestamp({ withTimezone: true }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.lakeId, t.date] })],
)
