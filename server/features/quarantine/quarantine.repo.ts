import { and, count, desc, eq, sql } from 'drizzle-orm'
import type { QuarantineReason } from '../../../shared/readings'
import type { QuarantineQuery } from '../../../shared/schemas/quarantine'
import type { Db } from '../../db/index'
import { datastreams, lakes, quarantine, readings, stations } from '../../db/schema/index'

/** Refused values that a person may still accept: the value was read, it only looked implausible. */
export const RELEASABLE_REASONS: QuarantineReason[] = ['out_of_range', 'rate_of_change']

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0]

export function quarantineRepo(db: Db) {
  const filters = (q: QuarantineQuery) =>
    and(
      eq(quarantine.status, q.status),
      q.stationId ? eq(quarantine.stationId, q.stationId) : undefined,
      q.reason ? eq(quarantine.reason, q.reason) : undefined,
    )
  return {
    async list(q: QuarantineQuery) {
      const [rows, [total]] = await Promise.all([
        db
          .select({
            row: quarantine,
            stationName: stations.name,
            lakeName: lakes.name,
          })
          .from(quarantine)
          .leftJoin(stations, eq(stations.id, quarantine.stationId))
          .leftJoin(lakes, eq(lakes.id, sql`coalesce(${quarantine.lakeId}, ${stations.lakeId})`))
          .where(filters(q))
          .orderBy(desc(quarantine.receivedAt), desc(quarantine.id))
          .limit(q.pageSize)
          .offset((q.page - 1) * q.pageSize),
        db.select({ n: count() }).from(quarantine).where(filters(q)),
      ])
      return { rows, total: total?.n ?? 0 }
    },

    /** Runs `fn` in one transaction: the decision, the reading it stores and its audit entry. */
    transaction: <T>(fn: (tx: Tx) => Promise<T>) => db.transaction(fn),

    /** The held row with the unit its datastream publishes in, locked until the decision. */
    async held(tx: Tx, id: number) {
      const [found] = await tx
        .select({ row: quarantine, unit: datastreams.unit })
        .from(quarantine)
        .leftJoin(
          datastreams,
          and(
            eq(datastreams.stationId, quarantine.stationId),
            sql`${datastreams.parameter}::text = ${quarantine.parameter}`,
          ),
        )
        .where(and(eq(quarantine.id, id), eq(quarantine.status, 'held')))
        .for('update', { of: quarantine })
      return found
    },
    storeReading: (tx: Tx, reading: typeof readings.$inferInsert) =>
      tx.insert(readings).values(reading).onConflictDoNothing(),
    setStatus: (tx: Tx, id: number, status: 'released' | 'discarded') =>
      tx.update(quarantine).set({ status }).where(eq(quarantine.id, id)),
  }
}
export type QuarantineRepo = ReturnType<typeof quarantineRepo>
