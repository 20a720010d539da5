import {
  bigserial,
  boolean,
  doublePrecision,
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
import { PARAMETER_KEYS, type QuarantineReason } from '../../../shared/readings'
import { timestamps } from './columns'
import { lakes } from './lakes'

export const parameter = pgEnum('parameter', PARAMETER_KEYS)
export const stationState = pgEnum('station_state', ['ok', 'stale', 'failing'])
export const quarantineStatus = pgEnum('quarantine_status', ['held', 'released', 'discarded'])
export const weatherKind = pgEnum('weather_kind', ['observed', 'forecast'])

/** A gauge station on a lake, with the health the ingest job keeps up to date. */
export const stations = pgTable(
  'stations',
  {
    id: uuid().primaryKey().defaultRandom(),
    lakeId: uuid()
      .notNull()
      .references(() => lakes.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    /** The station's Thing id in the feed. */
    feedThingId: text().notNull(),
    active: boolean().notNull().default(true),
    state: stationState().notNull().default('stale'),
    lastGoodAt: timestamp({ withTimezone: true }),
    lastRunAt: timestamp({ withTimezone: true }),
    lastError: text(),
    gapCount: integer().notNull().default(0),
    rejected24h: integer().notNull().default(0),
    consecutiveFailures: integer().notNull().default(0),
    /** Circuit breaker: the job leaves the station alone until then. */
    circuitOpenUntil: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('stations_feed_thing_id_key').on(t.feedThingId),
    index('stations_lake_id_idx').on(t.lakeId),
  ],
)

/** One parameter a station publishes, and how far the job has read it. */
export const datastreams = pgTable(
  'datastreams',
  {
    id: uuid().primaryKey().defaultRandom(),
    stationId: uuid()
      .notNull()
      .references(() => stations.id, { onDelete: 'cascade' }),
    parameter: parameter().notNull(),
    feedDatastreamId: text().notNull(),
    /** The unit the feed publishes in; readings are stored in SI. */
    unit: text().notNull(),
    /** Latest phenomenon time fetched and committed (good or quarantined). */
    highWaterMark: timestamp({ withTimezone: true }),
    /** Where a history backfill has got to, so an interrupted one resumes. */
    backfillCursor: timestamp({ withTimezone: true }),
  },
  (t) => [
    uniqueIndex('datastreams_station_parameter_key').on(t.stationId, t.parameter),
    uniqueIndex('datastreams_feed_id_key').on(t.feedDatastreamId),
  ],
)

/**
 * Good readings in SI units. The primary key makes re-ingesting a window a no-op and serves both
 * "range for one station and parameter" and "latest per station and parameter" (read backwards).
 * At scale this table is partitioned by month on observed_at (PARTITION BY RANGE), with the same key.
 */
export const readings = pgTable(
  'readings',
  {
    stationId: uuid()
      .notNull()
      .references(() => stations.id, { onDelete: 'cascade' }),
    parameter: parameter().notNull(),
    observedAt: timestamp({ withTimezone: true }).notNull(),
    value: doublePrecision().notNull(),
    originalValue: doublePrecision().notNull(),
    originalUnit: text().notNull(),
    ingestedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    primaryKey({ columns: [t.stationId, t.parameter, t.observedAt] }),
    index('readings_station_latest_idx').on(t.stationId, t.observedAt.desc()),
  ],
)

/** Rows the feed sent that failed validation, kept with the raw value and why. */
export const quarantine = pgTable(
  'quarantine',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    stationId: uuid().references(() => stations.id, { onDelete: 'cascade' }),
    lakeId: uuid().references(() => lakes.id, { onDelete: 'cascade' }),
    parameter: text().notNull(),
    /** The feed's own id for the row, so a refetch does not quarantine it twice. */
    feedId: text().notNull(),
    observedAt: timestamp({ withTimezone: true }),
    raw: jsonb().notNull(),
    reason: text().$type<QuarantineReason>().notNull(),
    detail: text().notNull(),
    status: quarantineStatus().notNull().default('held'),
    receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('quarantine_source_feed_id_key').on(t.parameter, t.feedId, t.reason),
    index('quarantine_station_received_idx').on(t.stationId, t.receivedAt),
  ],
)

/** Hourly weather per lake: what was observed, and the latest forecast for hours to come. */
export const weatherHours = pgTable(
  'weather_hours',
  {
    lakeId: uuid()
      .notNull()
      .references(() => lakes.id, { onDelete: 'cascade' }),
    kind: weatherKind().notNull(),
    at: timestamp({ withTimezone: true }).notNull(),
    issuedAt: timestamp({ withTimezone: true }),
    windMs: doublePrecision().notNull(),
    gustMs: doublePrecision().notNull(),
    windFromDeg: doublePrecision().notNull(),
    airC: doublePrecision().notNull(),
    relativeHumidityPct: doublePrecision().notNull(),
    pressureHpa: doublePrecision().notNull(),
    precipitationMm: doublePrecision().notNull(),
    cloudCoverPct: doublePrecision().notNull(),
    precipitationProbabilityPct: doublePrecision(),
    thunderProbabilityPct: doublePrecision(),
  },
  (t) => [primaryKey({ columns: [t.lakeId, t.kind, t.at] })],
)
