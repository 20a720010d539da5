import { and, desc, eq, inArray, lt, lte, ne, or, sql, type SQL } from 'drizzle-orm'
import type { LakeDay } from '../../../shared/conditions/day-plan'
import type { BriefDelivery, BriefUnits } from '../../../shared/schemas/brief'
import type { LakeRead } from '../../../shared/schemas/lake-read'
import { isoOrNull } from '../../../shared/time'
import type { Db } from '../../db/index'
import { failedTry } from '../../lib/backoff'
import { RANKED_BANK } from '../banks/banks.repo'
import { UNIT_COLUMNS, unitsOrDefault } from '../settings/settings.repo'
import { banks, briefSends, briefSettings, userSettings, users } from '../../db/schema/index'

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

/** One claimed row. */
const of = (claim: Claim) =>
  and(eq(briefSends.userId, claim.userId), eq(briefSends.localDate, claim.localDate))

export function briefSendsRepo(db: Db) {
  const rows = async <T>(query: SQL) =>
    (await db.execute<T & Record<string, unknown>>(query)).rows as T[]
  return {
    /**
     * Subscribers due now: the brief on, the address verified, following a lake, today one of their
     * days, their local send time passed, and no row yet for their local date. Wall-clock time in
     * their zone is compared, so a send time inside a DST gap goes at the first minute after it, and a
     * repeated hour finds today's row already there. (An insert from a lateral join: the `sql` tag.)
     */
    claimDue: (now: Date, leaseUntil: Date, limit: number) =>
      rows<Claim>(sql`
        with due as (
          select b.user_id, (l.at)::date as local_date
          from brief_settings b
          join users u on u.id = b.user_id
          cross join lateral (select ${now}::timestamptz at time zone b.time_zone as at) l
          where b.enabled and u.email_verified_at is not null
            and exists (select 1 from subscriptions s where s.user_id = b.user_id and s.in_brief)
            and l.at::time >= b.send_time
            and extract(isodow from l.at)::int = any(b.days)
            and not exists (select 1 from brief_sends x where x.user_id = b.user_id and x.local_date = l.at::date)
          order by b.user_id
          limit ${limit}
        )
        insert into brief_sends (user_id, local_date, status, attempts, lease_until)
        select user_id, local_date, 'sending', 1, ${leaseUntil} from due
        on conflict do nothing
        returning user_id as "userId", local_date::text as "localDate", attempts`),

    /**
     * Briefs to try again: retries that are due, and sends whose runner died (lease run out). Rows
     * another runner is claiming are skipped, not waited for. Only today's: see `expirePast`.
     */
    claimAgain(now: Date, leaseUntil: Date, limit: number): Promise<Claim[]> {
      const due = db
        .select({ userId: briefSends.userId, localDate: briefSends.localDate })
        .from(briefSends)
        .where(
          or(
            and(eq(briefSends.status, 'retry'), lte(briefSends.nextAttemptAt, now)),
            and(eq(briefSends.status, 'sending'), lt(briefSends.leaseUntil, now)),
          ),
        )
        .orderBy(briefSends.userId)
        .limit(limit)
        .for('update', { skipLocked: true })
        .as('due')
      return db
        .update(briefSends)
        .set({
          status: 'sending',
          attempts: sql`${briefSends.attempts} + 1`,
          leaseUntil,
          nextAttemptAt: null,
          updatedAt: now,
        })
        .from(due)
        .where(and(eq(briefSends.userId, due.userId), eq(briefSends.localDate, due.localDate)))
        .returning({
          userId: briefSends.userId,
          localDate: briefSends.localDate,
          attempts: briefSends.attempts,
        })
    },

    /** A morning brief is for its morning: unsent ones from past local dates are given up. */
    expirePast: (now: Date) =>
      db
        .update(briefSends)
        .set({
          status: 'failed',
          leaseUntil: null,
          nextAttemptAt: null,
          updatedAt: now,
          lastError: sql`coalesce(${briefSends.lastError} || ' ', '') || 'The day passed before it could be sent.'`,
        })
        .from(briefSettings)
        .where(
          and(
            eq(briefSettings.userId, briefSends.userId),
            inArray(briefSends.status, ['retry', 'sending']),
            or(eq(briefSends.status, 'retry'), lt(briefSends.leaseUntil, now)),
            sql`${briefSends.localDate} < (${now}::timestamptz at time zone ${briefSettings.timeZone})::date`,
          ),
        ),

    /** Address, the account's units (the defaults without a row) and the lakes in the brief, in one query. */
    async recipients(userIds: string[]): Promise<Recipient[]> {
      const found = await db
        .select({
          userId: users.id,
          email: users.email,
          units: UNIT_COLUMNS,
          lakeIds: sql<string[]>`coalesce((select array_agg(s.lake_id order by l.name)
            from subscriptions s join lakes l on l.id = s.lake_id
            where s.user_id = ${users.id} and s.in_brief), '{}')`,
        })
        .from(users)
        .innerJoin(briefSettings, eq(briefSettings.userId, users.id))
        .leftJoin(userSettings, eq(userSettings.userId, users.id))
        .where(inArray(users.id, userIds))
      return found.map((r) => ({ ...r, units: unitsOrDefault(r.units) }))
    },

    /**
     * The cached read and day of each (lake, date): computed once per lake, never per subscriber.
     * (Pairs through `unnest` of two arrays: the `sql` tag.)
     */
    lakes: (pairs: { lakeId: string; date: string }[]) =>
      rows<CachedLake & { date: string }>(sql`
        select l.id, l.slug, l.name, l.time_zone as "timeZone", p.date::text as date, r.read, d.day
        from unnest(${sql.param(pairs.map((p) => p.lakeId))}::uuid[],
                    ${sql.param(pairs.map((p) => p.date))}::date[]) as p(lake_id, date)
        join lakes l on l.id = p.lake_id
        left join lake_reads r on r.lake_id = l.id
        left join lake_days d on d.lake_id = l.id and d.date = p.date`),

    /** The subscribers' banks with their stored exposure tables. */
    banks: (userIds: string[]) =>
      db
        .select({ userId: banks.userId, lakeId: banks.lakeId, ...RANKED_BANK })
        .from(banks)
        .where(inArray(banks.userId, userIds))
        .orderBy(banks.name),

    async markSent(claim: Claim, messageId: string, at: Date) {
      await db
        .update(briefSends)
        .set({
          status: 'sent',
          sentAt: at,
          messageId,
          leaseUntil: null,
          lastError: null,
          updatedAt: at,
        })
        .where(of(claim))
    },

    /** A failed try: `retryAt` schedules another, null gives up and leaves it for admins. */
    async markFailed(claim: Claim, error: string, at: Date, retryAt: Date | null) {
      await db
        .update(briefSends)
        .set(failedTry(error, at, retryAt))
        .where(of(claim))
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
