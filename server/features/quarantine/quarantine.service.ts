import { parameterForKey, toSi } from '../../../shared/readings'
import type { User } from '../../../shared/schemas/auth'
import type { QuarantinePage, QuarantineQuery } from '../../../shared/schemas/quarantine'
import { isoOrNull } from '../../../shared/time'
import { conflict, notFound } from '../../http/errors'
import { audit } from '../audit/audit.repo'
import { RELEASABLE_REASONS, type QuarantineRepo } from './quarantine.repo'

type Actor = Pick<User, 'id' | 'email'>

/** The number an observation carried, when it carried one. */
const resultOf = (raw: unknown) => {
  const result = (raw as { result?: unknown } | null)?.result
  return typeof result === 'number' && Number.isFinite(result) ? result : null
}

const gone = () => notFound('row', 'No such row waiting for review (it may have been decided).')

export function quarantineService(repo: QuarantineRepo) {
  return {
    async list(query: QuarantineQuery): Promise<QuarantinePage> {
      const { rows, total } = await repo.list(query)
      return {
        items: rows.map(({ row, stationName, lakeName }) => ({
          id: row.id,
          station: row.stationId ? { id: row.stationId, name: stationName ?? '' } : null,
          lake: lakeName,
          parameter: row.parameter,
          observedAt: isoOrNull(row.observedAt),
          raw: row.raw,
          reason: row.reason,
          detail: row.detail,
          status: row.status,
          receivedAt: row.receivedAt.toISOString(),
          releasable:
            !!row.stationId &&
            RELEASABLE_REASONS.includes(row.reason) &&
            resultOf(row.raw) !== null,
        })),
        total,
        page: query.page,
        pageSize: query.pageSize,
      }
    },

    /**
     * After review, a value that only looked implausible is stored as a reading after all (in SI,
     * as the job would have), and the decision is audited, all in one transaction.
     */
    release: (actor: Actor, id: number) =>
      repo.transaction(async (tx) => {
        const found = await repo.held(tx, id)
        if (!found) throw gone()
        const { row, unit } = found
        const value = resultOf(row.raw)
        const parameter = parameterForKey(row.parameter)
        const si = value !== null && parameter && unit ? toSi(parameter, value, unit) : null
        if (
          !row.stationId ||
          !RELEASABLE_REASONS.includes(row.reason) ||
          si === null ||
          !row.observedAt
        )
          throw conflict(
            'not_releasable',
            'This row holds no value that can be stored as a reading; discard it instead.',
          )
        const reading = {
          stationId: row.stationId,
          parameter: parameter!,
          observedAt: row.observedAt,
          value: si,
          originalValue: value!,
          originalUnit: unit!,
        }
        await repo.storeReading(tx, reading)
        await repo.setStatus(tx, id, 'released')
        await audit(tx, actor, {
          action: 'quarantine.release',
          targetType: 'quarantine',
          targetId: String(id),
          before: { status: 'held', reason: row.reason, raw: row.raw },
          after: {
            status: 'released',
            reading: { ...reading, observedAt: reading.observedAt.toISOString() },
          },
        })
      }),

    discard: (actor: Actor, id: number) =>
      repo.transaction(async (tx) => {
        const found = await repo.held(tx, id)
        if (!found) throw gone()
        await repo.setStatus(tx, id, 'discarded')
        await audit(tx, actor, {
          action: 'quarantine.discard',
          targetType: 'quarantine',
          targetId: String(id),
          before: { status: 'held', reason: found.row.reason, raw: found.row.raw },
          after: { status: 'discarded' },
        })
      }),
  }
}
export type QuarantineService = ReturnType<typeof quarantineService>
