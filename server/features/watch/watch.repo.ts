import { and, eq } from 'drizzle-orm'
import type { LakeDay } from '../../../shared/conditions/day-plan'
import type { ExposureTable } from '../../../shared/conditions/exposure'
import type { SentAlert, Watch, WatchConditions } from '../../../shared/schemas/watch'
import type { Db } from '../../db/index'
import { banks, lakes, watches } from '../../db/schema/index'

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

/** A watch as the matcher reads it: its conditions, its bank, its trip's date, its episodes. */
export interface WatchRow {
  id: string
  lakeId: string
  kind: 'angler' | 'trip'
  conditions: WatchConditions
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
  units: {
    temperature: 'F' | 'C'
    length: 'ft' | 'm'
    speed: 'mph' | 'kmh' | 'knots'
    clock: '12h' | '24h'
  }
  kind: 'angler' | 'trip'
  watchName: string
  channels: Channel[]
  lakeSlug: string
  lakeName: string
  timeZone: string
  bankName: string | null
  tripId: string | null
}

const WATCH_VIEW = `
  select w.id, w.kind, w.name, w.conditions, w.channels, w.active, w.created_at as "createdAt",
    json_build_object('slug', l.slug, 'name', l.name) as lake,
    case when b.id is null then null else json_build_object('id', b.id, 'name', b.name) end as bank,
    case when t.id is null then null else json_build_object('id', t.id, 'date', t.date::text) end as trip,
    (select json_build_object('date', a.date::text, 'windowId', a.window_id, 'sentAt', a.sent_at)
       from watch_alerts a where a.watch_id = w.id and a.status = 'sent'
       order by a.sent_at desc limit 1) as "lastAlert"
  from watches w
  join lakes l on l.id = w.lake_id
  left join banks b on b.id = w.bank_id
  left join trips t on t.id = w.trip_id`

/** A trip watch waits for a no-go day or a danger: none of an angler's conditions. */
const TRIP_CONDITIONS: WatchConditions = {
  wind: null,
  clarity: [],
  phases: [],
  windows: [],
  notNoGo: false,
}

export function watchRepo(db: Db) {
  const rows = async <T>(text: string, values: unknown[]) =>
    (await db.$client.query<T & Record<string, unknown>>(text, values)).rows as T[]
  const view = (row: Record<string, unknown>): Watch => ({
    ...(row as unknown as Watch),
    createdAt: (row.createdAt as Date).toISOString(),
    lastAlert: row.lastAlert
      ? {
          ...(row.lastAlert as NonNullable<Watch['lastAlert']>),
          sentAt: new Date((row.lastAlert as { sentAt: string }).sentAt).toISOString(),
        }
      : null,
  })

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
      const [row] = await rows<{ verified: boolean }>(
        'select email_verified_at is not null as verified from users where id = $1',
        [userId],
      )
      return row?.verified ?? false
    },

    async list(userId: string): Promise<Watch[]> {
      const found = await rows<Record<string, unknown>>(
        `${WATCH_VIEW} where w.user_id = $1 order by w.kind, l.name, w.name, w.created_at`,
        [userId],
      )
      return found.map(view)
    },
    async one(userId: string, id: string): Promise<Watch | undefined> {
      const [row] = await rows<Record<string, unknown>>(
        `${WATCH_VIEW} where w.user_id = $1 and w.id = $2`,
        [userId, id],
      )
      return row && view(row)
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
        .set(values)
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
      db.$client.query(
        `insert into watches (user_id, lake_id, trip_id, kind, name, conditions, channels)
         select t.guide_id, t.lake_id, t.id, 'trip', 'Trip on ' || t.date::text, $2::jsonb, '{email,push}'
         from trips t
         where t.date >= $1::date and not exists (select 1 from watches w where w.trip_id = t.id)
         on conflict do nothing`,
        [fromDate, JSON.stringify(TRIP_CONDITIONS)],
      ),

    /** Each lake's stored days from its own local today on. */
    lakeDays: (now: Date) =>
      rows<{ lakeId: string; date: string; day: LakeDay }>(
        `select d.lake_id as "lakeId", d.date::text as date, d.day
         from lake_days d join lakes l on l.id = d.lake_id
         where d.date >= ($1::timestamptz at time zone l.time_zone)::date
         order by d.lake_id, d.date`,
        [now],
      ),

    /** Active watches after `afterId`, by id: a run reads them in pages of `limit`. */
    watchPage: (afterId: string, limit: number) =>
      rows<WatchRow>(
        `select w.id, w.lake_id as "lakeId", w.kind, w.conditions, w.bank_id as "bankId",
           t.date::text as "tripDate", w.episodes
         from watches w
         left join trips t on t.id = w.trip_id
         where w.active and w.id > $1::uuid
         order by w.id
         limit $2`,
        [afterId, limit],
      ),

    /**
     * These banks' exposure tables, only what judging needs (facing and the 16 effective fetches,
     * picked out by PostgreSQL): read only for watches the rest of whose conditions hold.
     */
    async bankTables(ids: string[]): Promise<{ id: string; exposure: ExposureTable }[]> {
      const found = await rows<{ id: string; facing: number; fetch: number[] }>(
        `select id, (exposure->>'facingDeg')::float8 as facing,
           array(select (r->>'effectiveFetchM')::float8 from jsonb_array_elements(exposure->'rows') r) as fetch
         from banks where id = any($1::uuid[])`,
        [ids],
      )
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
      db.$client.query(
        `update watches w set episodes = x.episodes
         from unnest($1::uuid[], $2::jsonb[]) as x(id, episodes) where w.id = x.id`,
        [changed.map((c) => c.id), changed.map((c) => JSON.stringify(c.episodes))],
      ),

    /**
     * Claims new alerts: a row each, inserted before anything is sent. A row another runner
     * inserted first is skipped (the key is taken), so each alert is claimed by one runner only.
     */
    claimNew: (alerts: (AlertKey & { match: object })[], now: Date, leaseUntil: Date) =>
      rows<AlertKey>(
        `insert into watch_alerts (watch_id, date, window_id, episode, match, status, lease_until, created_at, updated_at)
         select x.watch_id, x.date, x.window_id, x.episode, x.match, 'sending', $6, $5, $5
         from unnest($1::uuid[], $2::date[], $3::text[], $4::int[], $7::jsonb[])
           as x(watch_id, date, window_id, episode, match)
         on conflict do nothing
         returning watch_id as "watchId", date::text as date, window_id as "windowId", episode`,
        [
          alerts.map((a) => a.watchId),
          alerts.map((a) => a.date),
          alerts.map((a) => a.windowId),
          alerts.map((a) => a.episode),
          now,
          leaseUntil,
          alerts.map((a) => JSON.stringify(a.match)),
        ],
      ),

    /** Windows that no longer match: their open episode ends, so a new match is told again. */
    clear: (alerts: AlertKey[], now: Date) =>
      db.$client.query(
        `update watch_alerts a set cleared_at = $5, updated_at = $5
         from unnest($1::uuid[], $2::date[], $3::text[], $4::int[]) as x(watch_id, date, window_id, episode)
         where a.watch_id = x.watch_id and a.date = x.date and a.window_id = x.window_id
           and a.episode = x.episode and a.cleared_at is null`,
        [
          alerts.map((a) => a.watchId),
          alerts.map((a) => a.date),
          alerts.map((a) => a.windowId),
          alerts.map((a) => a.episode),
          now,
        ],
      ),

    /** Retries that are due and sends whose runner died, skipping rows another runner holds. */
    claimAgain: (now: Date, leaseUntil: Date, limit: number) =>
      rows<AlertKey>(
        `update watch_alerts x set status = 'sending', attempts = x.attempts + 1, lease_until = $2,
           next_attempt_at = null, updated_at = $1
         from (
           select a.watch_id, a.date, a.window_id, a.episode from watch_alerts a
           where (a.status = 'retry' and a.next_attempt_at <= $1) or (a.status = 'sending' and a.lease_until < $1)
           order by a.watch_id
           limit $3
           for update skip locked
         ) due
         where x.watch_id = due.watch_id and x.date = due.date and x.window_id = due.window_id
           and x.episode = due.episode
         returning x.watch_id as "watchId", x.date::text as date, x.window_id as "windowId", x.episode`,
        [now, leaseUntil, limit],
      ),

    /** The claimed alerts with their watch, owner, units and lake, in one query. */
    toSend: (keys: AlertKey[]) =>
      rows<AlertToSend>(
        `select a.watch_id as "watchId", a.date::text as date, a.window_id as "windowId", a.episode,
           a.attempts, a.match, a.delivered, u.id as "userId", u.email,
           u.email_verified_at is not null as verified,
           json_build_object('temperature', coalesce(s.temperature, 'F'), 'length', coalesce(s.length, 'ft'),
             'speed', coalesce(s.speed, 'mph'), 'clock', coalesce(s.clock, '12h')) as units,
           w.kind, w.name as "watchName", w.channels, w.trip_id as "tripId",
           l.slug as "lakeSlug", l.name as "lakeName", l.time_zone as "timeZone", b.name as "bankName"
         from unnest($1::uuid[], $2::date[], $3::text[], $4::int[]) as x(watch_id, date, window_id, episode)
         join watch_alerts a on a.watch_id = x.watch_id and a.date = x.date and a.window_id = x.window_id
           and a.episode = x.episode
         join watches w on w.id = a.watch_id
         join users u on u.id = w.user_id
         join lakes l on l.id = w.lake_id
         left join user_settings s on s.user_id = u.id
         left join banks b on b.id = w.bank_id`,
        [
          keys.map((a) => a.watchId),
          keys.map((a) => a.date),
          keys.map((a) => a.windowId),
          keys.map((a) => a.episode),
        ],
      ),

    /** One channel took the alert: recorded at once, so a retry of the others skips it. */
    markDelivered: (key: AlertKey, channel: Channel, at: Date) =>
      db.$client.query(
        `update watch_alerts set delivered = array_append(delivered, $5), updated_at = $6
         where watch_id = $1 and date = $2 and window_id = $3 and episode = $4
           and not ($5 = any(delivered))`,
        [key.watchId, key.date, key.windowId, key.episode, channel, at],
      ),
    markSent: (key: AlertKey, at: Date) =>
      db.$client.query(
        `update watch_alerts set status = 'sent', sent_at = $5, lease_until = null, last_error = null,
           updated_at = $5
         where watch_id = $1 and date = $2 and window_id = $3 and episode = $4`,
        [key.watchId, key.date, key.windowId, key.episode, at],
      ),
    /** A failed try: `retryAt` schedules another, null gives up. */
    markFailed: (key: AlertKey, error: string, at: Date, retryAt: Date | null) =>
      db.$client.query(
        `update watch_alerts set status = $5, next_attempt_at = $6, last_error = $7, lease_until = null,
           updated_at = $8
         where watch_id = $1 and date = $2 and window_id = $3 and episode = $4`,
        [
          key.watchId,
          key.date,
          key.windowId,
          key.episode,
          retryAt ? 'retry' : 'failed',
          retryAt,
          error,
          at,
        ],
      ),

    /** The latest alerts, for admins beside the caught mail. */
    async recent(limit = 200): Promise<SentAlert[]> {
      const found = await rows<SentAlert & { sentAt: Date | null; createdAt: Date }>(
        `select a.watch_id as "watchId", w.name as "watchName", w.kind, u.email, l.slug as "lakeSlug",
           a.date::text as date, a.window_id as "windowId", a.episode, a.status, a.delivered,
           a.last_error as "lastError", a.sent_at as "sentAt", a.created_at as "createdAt"
         from watch_alerts a
         join watches w on w.id = a.watch_id
         join users u on u.id = w.user_id
         join lakes l on l.id = w.lake_id
         order by a.created_at desc
         limit $1`,
        [limit],
      )
      return found.map((r) => ({
        ...r,
        sentAt: r.sentAt ? r.sentAt.toISOString() : null,
        createdAt: r.createdAt.toISOString(),
      }))
    },
  }
}
export type WatchRepo = ReturnType<typeof watchRepo>
