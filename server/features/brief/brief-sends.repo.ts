import { and, desc, eq, ne } from 'drizzle-orm'
import type { LakeDay } from '../../../shared/conditions/day-plan'
import type { Bank } from '../../../shared/conditions/ranking'
import type { BriefDelivery, BriefUnits } from '../../../shared/schemas/brief'
import type { LakeRead } from '../../../shared/schemas/lake-read'
import { isoOrNull } from '../../../shared/time'
import type { Db } from '../../db/index'
import { briefSends, users } from '../../db/schema/index'

/** A claimed brief: this subscriber's brief for this local date is ours to send. */
export interface Claim {
  userId: string
  localDate: string
  attempts: number
}

export interface Recipient {
  userId: string
  email: string
  units: BriefUnits
  lakeIds: string[]
}

export interface CachedLake {
  id: string
  slug: string
  name: string
  timeZone: string
  read: LakeRead | null
  day: LakeDay | null
}

/**
 * Subscribers due now: the brief on, the address verified, following a lake, today one of their
 * days, their local send time passed, and no row yet for their local date. Wall-clock time in
 * their zone is compared, so a send time inside a DST gap goes at the first minute after it, and a
 * repeated hour finds today's row already there.
 */
const CLAIM_DUE = `
  with due as (
    select b.user_id, (l.at)::date as local_date
    from brief_settings b
    join users u on u.id = b.user_id
    cross join lateral (select $1::timestamptz at time zone b.time_zone as at) l
    where b.enabled and u.email_verified_at is not null
      and exists (select 1 from subscriptions s where s.user_id = b.user_id and s.in_brief)
      and l.at::time >= b.send_time
      and extract(isodow from l.at)::int = any(b.days)
      and not exists (select 1 from brief_sends x where x.user_id = b.user_id and x.local_date = l.at::date)
    order by b.user_id
    limit $3
  )
  insert into brief_sends (user_id, local_date, status, attempts, lease_until)
  select user_id, local_date, 'sending', 1, $2 from due
  on conflict do nothing
  returning user_id as "userId", local_date::text as "localDate", attempts`

/**
 * Briefs to try again: retries that are due, and sends whose runner died (lease run out). Rows
 * another runner is claiming are skipped, not waited for. Only today's: see `expirePast`.
 */
const CLAIM_AGAIN = `
  update brief_sends x set status = 'sending', attempts = x.attempts + 1, lease_until = $2,
    next_attempt_at = null, updated_at = $1
  from (
    select s.user_id, s.local_date from brief_sends s
    where ((s.status = 'retry' and s.next_attempt_at <= $1) or (s.status = 'sending' and s.lease_until < $1))
    order by s.user_id
    limit $3
    for update skip locked
  ) due
  where x.user_id = due.user_id and x.local_date = due.local_date
  returning x.user_id as "userId", x.local_date::text as "localDate", x.attempts`

/** A morning brief is for its morning: unsent ones from past local dates are given up. */
const EXPIRE_PAST = `
  update brief_sends s set status = 'failed', lease_until = null, next_attempt_at = null, updated_at = $1,
    last_error = coalesce(s.last_error || ' ', '') || 'The day passed before it could be sent.'
  from brief_settings b
  where b.user_id = s.user_id and s.status in ('retry', 'sending')
    and (s.status = 'retry' or s.lease_until < $1)
    and s.local_date < ($1::timestamptz at time zone b.time_zone)::date`

export function briefSendsRepo(db: Db) {
  const rows = async <T>(text: string, values: unknown[]) =>
    (await db.$client.query<T & Record<string, unknown>>(text, values)).rows as T[]
  return {
    claimDue: (now: Date, leaseUntil: Date, limit: number) =>
      rows<Claim>(CLAIM_DUE, [now, leaseUntil, limit]),
    claimAgain: (now: Date, leaseUntil: Date, limit: number) =>
      rows<Claim>(CLAIM_AGAIN, [now, leaseUntil, limit]),
    expirePast: (now: Date) => db.$client.query(EXPIRE_PAST, [now]),

    /** Address, the account's units (the defaults without a row) and the lakes in the brief, in one query. */
    recipients: (userIds: string[]) =>
      rows<Recipient>(
        `select u.id as "userId", u.email,
           json_build_object('temperature', coalesce(us.temperature, 'F'), 'length', coalesce(us.length, 'ft'),
             'speed', coalesce(us.speed, 'mph'), 'clock', coalesce(us.clock, '12h')) as units,
           coalesce((select array_agg(s.lake_id order by l.name) from subscriptions s join lakes l on l.id = s.lake_id
                     where s.user_id = u.id and s.in_brief), '{}') as "lakeIds"
         from users u join brief_settings b on b.user_id = u.id
         left join user_settings us on us.user_id = u.id
         where u.id = any($1::uuid[])`,
        [userIds],
      ),

    /** The cached read and day of each (lake, date): computed once per lake, never per subscriber. */
    lakes: (pairs: { lakeId: string; date: string }[]) =>
      rows<CachedLake & { date: string }>(
        `select l.id, l.slug, l.name, l.time_zone as "timeZone", p.date::text as date, r.read, d.day
         from unnest($1::uuid[], $2::date[]) as p(lake_id, date)
         join lakes l on l.id = p.lake_id
         left join lake_reads r on r.lake_id = l.id
         left join lake_days d on d.lake_id = l.id and d.date = p.date`,
        [pairs.map((p) => p.lakeId), pairs.map((p) => p.date)],
      ),

    /** The subscribers' banks with their stored exposure tables. */
    banks: (userIds: string[]) =>
      rows<Omit<Bank, 'depthM'> & { userId: string; lakeId: string; depthM: number | null }>(
        `select user_id as "userId", lake_id as "lakeId", id, name, points, cover,
           depth_m as "depthM", exposure
         from banks where user_id = any($1::uuid[]) order by name`,
        [userIds],
      ),

    async markSent(claim: Claim, messageId: string, at: Date) {
      await db.$client.query(
        `update brief_sends set status = 'sent', sent_at = $3, message_id = $4, lease_until = null,
           last_error = null, updated_at = $3
         where user_id = $1 and local_date = $2`,
        [claim.userId, claim.localDate, at, messageId],
      )
    },

    /** A failed try: `retryAt` schedules another, null gives up and leaves it for admins. */
    async markFailed(claim: Claim, error: string, at: Date, retryAt: Date | null) {
      await db.$client.query(
        `update brief_sends set status = $3, next_attempt_at = $4, last_error = $5, lease_until = null,
           updated_at = $6
         where user_id = $1 and local_date = $2`,
        [claim.userId, claim.localDate, retryAt ? 'retry' : 'failed', retryAt, error, at],
      )
    },

    /** Briefs not delivered (yet): failed, waiting to retry, or being sent. Newest first. */
    async undelivered(status?: BriefDelivery['status']): Promise<BriefDelivery[]> {
      const found = await db
        .select({
          email: users.email,
          localDate: briefSends.localDate,
          status: briefSends.status,
          attempts: briefSends.attempts,
          lastError: briefSends.lastError,
          nextAttemptAt: briefSends.nextAttemptAt,
          updatedAt: briefSends.updatedAt,
        })
        .from(briefSends)
        .innerJoin(users, eq(users.id, briefSends.userId))
        .where(
          and(ne(briefSends.status, 'sent'), status ? eq(briefSends.status, status) : undefined),
        )
        .orderBy(desc(briefSends.updatedAt))
        .limit(200)
      return found.map((r) => ({
        ...r,
        nextAttemptAt: isoOrNull(r.nextAttemptAt),
        updatedAt: r.updatedAt.toISOString(),
      }))
    },
  }
}
export type BriefSendsRepo = ReturnType<typeof briefSendsRepo>
