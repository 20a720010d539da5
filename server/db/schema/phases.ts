import { SEASONAL_PHASES } from '../../../shared/conditions/season'
import { check, date, doublePrecision, pgEnum, pgTable, smallint, uuid } from 'drizzle-orm/pg-core'
import { sql } from 'drizzle-orm'
import { timestamps } from './columns'
import { lakes } from './lakes'

export const seasonalPhase = pgEnum('seasonal_phase', SEASONAL_PHASES)

/**
 * Each lake's seasonal phase as state that carries from day to day (`PhaseState` in
 * shared/conditions/season.ts): each refresh advances it over the days after `last_day`, so the
 * hysteresis and the days spent in a phase survive from one day to the next. Not a cache: it
 * cannot be recomputed from a month of readings without losing that.
 */
export const lakePhases = pgTable(
  'lake_phases',
  {
    lakeId: uuid()
      .primaryKey()
      .references(() => lakes.id, { onDelete: 'cascade' }),
    phase: seasonalPhase().notNull(),
    /** The local date the phase began, or the first day judged when it began before the history. */
    since: date({ mode: 'string' }).notNull(),
    /** The neighbouring phase the days call for, and how many days in a row they have. */
    pendingPhase: seasonalPhase(),
    pendingDays: smallint().notNull().default(0),
    /** The last local day judged, with its 5-day mean (°C) and 7-day trend (°C a day). */
    lastDay: date({ mode: 'string' }).notNull(),
    meanC: doublePrecision().notNull(),
    trendCPerDay: doublePrecision().notNull(),
    ...timestamps,
  },
  (t) => [
    check(
      'lake_phases_pending',
      sql`(${t.pendingPhase} is null and ${t.pendingDays} = 0) or (${t.pendingPhase} is not null and ${t.pendingDays} > 0)`,
    ),
    check('lake_phases_since', sql`${t.since} <= ${t.lastDay}`),
  ],
)
