import { and, asc, desc, eq, gt, inArray, sql } from 'drizzle-orm'
import type { ExposureTable } from '../../../shared/conditions/exposure'
import type { BriefUnits } from '../../../shared/schemas/brief'
import type { SentAlert, Watch, WatchConditions } from '../../../shared/schemas/watch'
import type { Db } from '../../db/index'
import { failedTry } from '../../lib/backoff'
import { UNIT_COLUMNS, unitsOrDefault } from '../settings/settings.repo'
import {
  banks,
  lakeDays,
  lakes,
  trips,
  users,
  userSettings,
  watchAlerts,
  watches,
} from '../../db/schema/index'

export type Channel = 'email' | 'push'
export type WatchValues = Pick<
  typeof watches.$inferInsert,
  'name' | 'lakeId' | 'bankId' | 'conditions' | 'channels' | 'active'
>

/** One alert row: a watch, a forecast window (or a trip's `day`) and its episode. */
export interface AlertKey {
  watchId: string
  date: string
  windowId: string
  episode: number
}

/**
 * A watch as the matcher reads it: its conditions (as stored text, the key under which identical
 * conditions are judged once), its bank, its trip's date, its episodes.
 */
export interface WatchRow {
  id: string
  lakeId: string
  kind: 'angler' | 'trip'
  conditions: string
  bankId: string | null
  tripDate: string | null
  /** `date/window` → last episode, negative once cleared. */
  episodes: Record<string, number>
}

/** Everything an alert's delivery needs, in one row. */
export interface AlertToSend extends AlertKey {
  attempts: number
  match: Record<string, unknown>
  delivered: Channel[]
  userId: string
  email: string
  verified: boolean
  units: BriefUnits
  kind: 'angler' | 'trip'
  watchName: string
  channels: Channel[]
  lakeSlug: string
  lakeName: string
  timeZone: string
  bankName: string | null
  tripId: string | null
}

/** A trip watch waits for a no-go day or a danger: none of an angler's conditions. */
const TRIP_CONDITIONS: WatchConditions = {
  wind: null,
  clarity: [],
  phases: [],
  windows: [],
  notNoGo: false,
  daysAhead: null,
}

/** Columns of a batch of alert keys, each one array parameter, for `unnest`. */
function keyColumns(keys: AlertKey[]) {
  return {
    watchIds: sql.param(keys.map((a) => a.watchId)),
    dates: sql.param(keys.map((a) => a.date)),
    windowIds: sql.param(keys.map((a) => a.windowId)),
    episodes: sql.param(keys.map((a) => a.episode)),
  }
}

const isKey = (key: AlertKey) =>
  and(
    eq(watchAlerts.watchId, key.watchId),
    eq(watchAlerts.date, key.date),
    eq(watchAlerts.windowId, key.windowId),
    eq(watchAlerts.episode, key.episode),
  )

/** Conditions stored before a field existed read as its default. */
const WITH_DEFAULTS: Pick<WatchConditions, 'daysAhead'> = { daysAhead: null }

export function watchRepo(db: Db) {
  /** Watches as their owner sees them, last alert aside. */
  const viewRows = (userId: string, id?: string) =>
    db
      .select({
        id: watches.id,
        kind: watches.kind,
        name: watches.name,
        conditions: watches.conditions,
        channels: watches.channels,
        active: watches.active,
        createdAt: watches.createdAt,
        lake: { slug: lakes.slug, name: lakes.name },
        bank: { id: banks.id, name: banks.name },
        trip: { id: trips.id, date: trips.date },
      })
      .from(watches)
      .innerJoin(lakes, eq(lakes.id, watches.lakeId))
      .leftJoin(banks, eq(banks.id, watches.bankId))
      .leftJoin(trips, eq(trips.id, watches.tripId))
      .where(and(eq(watches.userId, userId), id ? eq(watches.id, id) : undefined))
      .orderBy(watches.kind, lakes.name, watches.name, watches.createdAt)

  /** Each watch's latest alert that went out. */
  async function lastAlerts(ids: string[]) {
    if (!ids.length) return new Map<string, NonNullable<Watch['lastAlert']>>()
    const found = await db
      .selectDistinctOn([watchAlerts.watchId], {
        watchId: watchAlerts.watchId,
        date: watchAlerts.date,
        windowId: watchAlerts.windowId,
        sentAt: watchAlerts.sentAt,
      })
      .from(watchAlerts)
      .where(and(inArray(watchAlerts.watchId, ids), eq(watchAlerts.status, 'sent')))
      .orderBy(watchAlerts.watchId, desc(watchAlerts.sentAt))
    return new Map(
      found.map((a) => [
        a.watchId,
        { date: a.date, windowId: a.windowId, sentAt: a.sentAt?.toISOString() ?? null },
      ]),
    )
  }

  async function views(rows: Awaited<ReturnType<typeof viewRows>>): Promise<Watch[]> {
    const last = await lastAlerts(rows.map((r) => r.id))
    return rows.map((r) => ({
      ...r,
      conditions: { ...WITH_DEFAULTS, ...r.conditions },
      createdAt: r.createdAt.toISOString(),
      lastAlert: last.get(r.id) ?? null,
    }))
  }

  return {
    async lake(slug: string) {
      const [row] = await db.select({ id: lakes.id }).from(lakes).where(eq(lakes.slug, slug))
      return row
    },
    async bankOf(userId: string, bankId: string) {
      const [row] = await db
        .select({ id: banks.id, lakeId: banks.lakeId })
        .from(banks)
        .where(and(eq(banks.id, bankId), eq(banks.userId, userId)))
      return row
    },
    async verified(userId: string) {
      const [row] = await db
        .select({ at: users.emailVerifiedAt })
        .from(users)
        .where(eq(users.id, userId))
      return row?.at != null
    },

    list: async (userId: string): Promise<Watch[]> => views(await viewRows(userId)),
    async one(userId: string, id: string): Promise<Watch | undefined> {
      const [row] = await views(await viewRows(userId, id))
      return row
    },
    async kindOf(userId: string, id: string) {
      const [row] = await db
        .select({ kind: watches.kind })
        .from(watches)
        .where(and(eq(watches.id, id), eq(watches.userId, userId)))
      return row?.kind
    },
    async insert(userId: string, values: WatchValues) {
      const [row] = await db
        .insert(watches)
        .values({ ...values, userId })
        .returning({ id: watches.id })
      return row!.id
    },
    async update(userId: string, id: string, values: Partial<WatchValues>) {
      const found = await db
        .update(watches)
        .set({ ...values, updatedAt: new Date() })
        .where(and(eq(watches.id, id), eq(watches.userId, userId)))
        .returning({ id: watches.id })
      return found.length > 0
    },
    async remove(userId: string, id: string) {
      const gone = await db
        .delete(watches)
        .where(and(eq(watches.id, id), eq(watches.userId, userId)))
        .returning({ id: watches.id })
      return gone.length > 0
    },
    /** An unsubscribe link pauses its watch, whoever follows it. */
    async pause(id: string) {
      await db.update(watches).set({ active: false }).where(eq(watches.id, id))
    },

    /** Every trip from `fromDate` on gets its watch, once: the trip's guide is its owner. */
    ensureTripWatches: (fromDate: string) =>
      db.execute(sql`
        insert into ${watches} (user_id, lake_id, trip_id, kind, name, conditions, channels)
        select t.guide_id, t.lake_id, t.id, 'trip', 'Trip on ' || t.date::text,
          ${JSON.stringify(TRIP_CONDITIONS)}::jsonb, '{email,push}'
        from ${trips} t
        where t.date >= ${fromDate}::date and not exists (select 1 from ${watches} w where w.trip_id = t.id)
        on conflict do nothing`),

    /** Each lake's stored days from its own local today on, with its time zone. */
    lakeDays: (now: Date) =>
      db
        .select({
          lakeId: lakeDays.lakeId,
          timeZone: lakes.timeZone,
          date: lakeDays.date,
          day: lakeDays.day,
        })
        .from(lakeDays)
        .innerJoin(lakes, eq(lakes.id, lakeDays.lakeId))
        .where(
          sql`${lakeDays.date} >= (${now.toISOString()}::timestamptz at time zone ${lakes.timeZone})::date`,
        )
        .orderBy(lakeDays.lakeId, lakeDays.date),

    /** Active watches after `afterId`, by id: a run reads them in pages of `limit`. */
    watchPage: (afterId: string, limit: number): Promise<WatchRow[]> =>
      db
        .select({
          id: watches.id,
          lakeId: watches.lakeId,
          kind: watches.kind,
          conditions: sql<string>`${watches.conditions}::text`,
          bankId: watches.bankId,
          tripDate: trips.date,
          episodes: watches.episodes,
        })
        .from(watches)
        .leftJoin(trips, eq(trips.id, watches.tripId))
        .where(and(eq(watches.active, true), gt(watches.id, afterId)))
        .orderBy(asc(watches.id))
        .limit(limit),

    /**
     * These banks' exposure tables, only what judging needs (facing and the 16 effective fetches,
     * picked out by PostgreSQL as one small JSON array): read only for watches the rest of whose
     * conditions hold.
     */
    async bankTables(ids: string[]): Promise<{ id: string; exposure: ExposureTable }[]> {
      const found = await db
        .select({
          id: banks.id,
          facing: sql<number>`(${banks.exposure}->>'facingDeg')::float8`,
          fetch: sql<
            number[]
          >`jsonb_path_query_array(${banks.exposure}, '$.rows[*].effectiveFetchM')`,
        })
        .from(banks)
        .where(inArray(banks.id, ids))
      return found.map((b) => ({
        id: b.id,
        exposure: {
          point: [0, 0],
          facingDeg: b.facing,
          rows: b.fetch.map((m, i) => ({ windFromDeg: i * 22.5, fetchM: m, effectiveFetchM: m })),
        },
      }))
    },

    /** The watches' episodes after a run, for those that changed. */
    saveEpisodes: (changed: { id: string; episodes: Record<string, number> }[]) =>
      db.execute(sql`
        update ${watches} w set episodes = x.episodes
        from unnest(${sql.param(changed.map((c) => c.id))}::uuid[],
          ${sql.param(changed.map((c) => JSON.stringify(c.episodes)))}::jsonb[]) as x(id, episodes)
        where w.id = x.id`),

    /**
     * Claims new alerts: a row each, inserted before anything is sent. A row another runner
     * inserted first is skipped (the key is taken), so each alert is claimed by one runner only.
     */
    async claimNew(alerts: (AlertKey & { match: object })[], now: Date, leaseUntil: Date) {
      const k = keyColumns(alerts)
      const matches = sql.param(alerts.map((a) => JSON.stringify(a.match)))
      const { rows } = await db.execute<AlertKey & Record<string, unknown>>(sql`
        insert into ${watchAlerts} (watch_id, date, window_id, episode, match, status, lease_until, created_at, updated_at)
        select x.watch_id, x.date, x.window_id, x.episode, x.match, 'sending',
          ${leaseUntil.toISOString()}::timestamptz, ${now.toISOString()}::timestamptz, ${now.toISOString()}::timestamptz
        from unnest(${k.watchIds}::uuid[], ${k.dates}::date[], ${k.windowIds}::text[], ${k.episodes}::int[],
          ${matches}::jsonb[]) as x(watch_id, date, window_id, episode, match)
        on conflict do nothing
        returning watch_id as "watchId", date::text as date, window_id as "windowId", episode`)
      return rows
    },

    /** Windows that no longer match: their open episode ends, so a new match is told again. */
    async clear(alerts: AlertKey[], now: Date) {
      const k = keyColumns(alerts)
      const at = now.toISOString()
      const result = await db.execute(sql`
        update ${watchAlerts} a set cleared_at = ${at}::timestamptz, updated_at = ${at}::timestamptz
        from unnest(${k.watchIds}::uuid[], ${k.dates}::date[], ${k.windowIds}::text[], ${k.episodes}::int[])
          as x(watch_id, date, window_id, episode)
        where a.watch_id = x.watch_id and a.date = x.date and a.window_id = x.window_id
          and a.episode = x.episode and a.cleared_at is null`)
      return result.rowCount ?? 0
    },

    /** Retries that are due and sends whose runner died, skipping rows another runner holds. */
    async claimAgain(now: Date, leaseUntil: Date, limit: number) {
      const at = now.toISOString()
      const { rows } = await db.execute<AlertKey & Record<string, unknown>>(sql`
        update ${watchAlerts} x set status = 'sending', attempts = x.attempts + 1,
          lease_until = ${leaseUntil.toISOString()}::timestamptz, next_attempt_at = null,
          updated_at = ${at}::timestamptz
        from (
          select a.watch_id, a.date, a.window_id, a.episode from ${watchAlerts} a
          where (a.status = 'retry' and a.next_attempt_at <= ${at}::timestamptz)
            or (a.status = 'sending' and a.lease_until < ${at}::timestamptz)
          order by a.watch_id
          limit ${limit}
          for update skip locked
        ) due
        where x.watch_id = due.watch_id and x.date = due.date and x.window_id = due.window_id
          and x.episode = due.episode
        returning x.watch_id as "watchId", x.date::text as date, x.window_id as "windowId", x.episode`)
      return rows
    },

    /** The claimed alerts with their watch, owner, units and lake, in one query. */
    async toSend(keys: AlertKey[]): Promise<AlertToSend[]> {
      const k = keyColumns(keys)
      const found = await db
        .select({
          watchId: watchAlerts.watchId,
          date: watchAlerts.date,
          windowId: watchAlerts.windowId,
          episode: watchAlerts.episode,
          attempts: watchAlerts.attempts,
          match: watchAlerts.match,
          delivered: watchAlerts.delivered,
          userId: users.id,
          email: users.email,
          verifiedAt: users.emailVerifiedAt,
          units: UNIT_COLUMNS,
          kind: watches.kind,
          watchName: watches.name,
          channels: watches.channels,
          tripId: watches.tripId,
          lakeSlug: lakes.slug,
          lakeName: lakes.name,
          timeZone: lakes.timeZone,
          bankName: banks.name,
        })
        .from(watchAlerts)
        .innerJoin(watches, eq(watches.id, watchAlerts.watchId))
        .innerJoin(users, eq(users.id, watches.userId))
        .innerJoin(lakes, eq(lakes.id, watches.lakeId))
        .leftJoin(userSettings, eq(userSettings.userId, users.id))
        .leftJoin(banks, eq(banks.id, watches.bankId))
        .where(
          sql`(${watchAlerts.watchId}, ${watchAlerts.date}, ${watchAlerts.windowId}, ${watchAlerts.episode})
            in (select * from unnest(${k.watchIds}::uuid[], ${k.dates}::date[], ${k.windowIds}::text[], ${k.episodes}::int[]))`,
        )
      return found.map(({ verifiedAt, units, ...a }) => ({
        ...a,
        match: a.match as Record<string, unknown>,
        verified: verifiedAt !== null,
        units: unitsOrDefault(units),
      }))
    },

    /** One channel took the alert: recorded at once, so a retry of the others skips it. */
    markDelivered: (key: AlertKey, channel: Channel, at: Date) =>
      db
        .update(watchAlerts)
        .set({ delivered: sql`array_append(${watchAlerts.delivered}, ${channel})`, updatedAt: at })
        .where(and(isKey(key), sql`not (${channel} = any(${watchAlerts.delivered}))`)),
    markSent: (key: AlertKey, at: Date) =>
      db
        .update(watchAlerts)
        .set({ status: 'sent', sentAt: at, leaseUntil: null, lastError: null, updatedAt: at })
        .where(isKey(key)),
    /** A failed try: `retryAt` schedules another, null gives up. */
    markFailed: (key: AlertKey, error: string, at: Date, retryAt: Date | null) =>
      db
        .update(watchAlerts)
        .set(failedTry(error, at, retryAt))
        .where(isKey(key)),

    /** The latest alerts, for admins beside the caught mail. */
    async recent(limit = 200): Promise<SentAlert[]> {
      const found = await db
        .select({
          watchId: watchAlerts.watchId,
          watchName: watches.name,
          kind: watches.kind,
          email: users.email,
          lakeSlug: lakes.slug,
          date: watchAlerts.date,
          windowId: watchAlerts.windowId,
          episode: watchAlerts.episode,
          status: watchAlerts.status,
          delivered: watchAlerts.delivered,
          lastError: watchAlerts.lastError,
          sentAt: watchAlerts.sentAt,
          createdAt: watchAlerts.createdAt,
        })
        .from(watchAlerts)
        .innerJoin(watches, eq(watches.id, watchAlerts.watchId))
        .innerJoin(users, eq(users.id, watches.userId))
        .innerJoin(lakes, eq(lakes.id, watches.lakeId))
        .orderBy(desc(watchAlerts.createdAt))
        .limit(limit)
      return found.map((r) => ({
        ...r,
        sentAt: r.sentAt?.toISOString() ?? null,
        createdAt: r.createdAt.toISOString(),
      }))
    },
  }
}
export type WatchRepo = ReturnType<typeof watchRepo>
