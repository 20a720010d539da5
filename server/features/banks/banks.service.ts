import { SHORE_SNAP_M } from '../../../shared/conditions/bank-stretch'
import {
  EXPOSURE_TABLE_VERSION,
  exposureTable,
  type ExposureTable,
} from '../../../shared/conditions/exposure'
import { DomainError } from '../../../shared/errors'
import { shoreIndex } from '../../../shared/geo/fetch'
import type { LakeGeometry } from '../../../shared/geo/types'
import type { BankInput, BankView } from '../../../shared/schemas/banks'
import { conflict, invalid, notFound } from '../../http/errors'
import type { BankRow, BankValues, BanksRepo } from './banks.repo'

/** A picked point this close to the shore counts as on it, and is moved onto it. */
export const SNAP_M = SHORE_SNAP_M

export function toBankView(row: BankRow): BankView {
  return {
    id: row.id,
    name: row.name,
    points: row.points,
    cover: row.cover,
    depthM: row.depthM,
    slope: row.slope,
    notes: row.notes,
    exposure: row.exposure,
    detached: row.detachedAt !== null,
    updatedAt: row.updatedAt.toISOString(),
  }
}

/** The stored form of a bank: points snapped onto the shore and the exposure table worked out. */
function withExposure(shoreline: LakeGeometry, input: BankInput): BankValues {
  const index = shoreIndex(shoreline)
  const points = input.points.map((p, i) => {
    const near = index.nearestShorePoint(p, SNAP_M)
    if (!near)
      throw invalid(
        'points',
        `Point ${i + 1} is not on the shore. Pick points along the shoreline.`,
      )
    return near.point
  })
  // Saved again on today's shore, a bank flagged by a new outline is whole again. Points too close
  // together, on two shores, or too far apart along one make no bank: a DomainError on `points`,
  // which the error handler answers as that field's message.
  return { ...input, points, exposure: exposureTable(shoreline, points), detachedAt: null }
}

/**
 * Brings every stored exposure table up to `EXPOSURE_TABLE_VERSION`, lake by lake, from the bank's
 * stored points. A bank today's rules refuse (points on two shores, or more than 1.5 km along one)
 * keeps its old table and is flagged for its angler to pick again; banks already flagged wait for
 * their angler.
 */
export async function recomputeOldExposure(repo: BanksRepo, now = () => new Date()) {
  let recomputed = 0
  let flagged = 0
  for (const lake of await repo.lakesWithOldExposure(EXPOSURE_TABLE_VERSION)) {
    for (const bank of await repo.oldExposure(lake.id, EXPOSURE_TABLE_VERSION)) {
      let exposure: ExposureTable | null = null
      try {
        exposure = exposureTable(lake.shoreline, bank.points)
      } catch (err) {
        if (!(err instanceof DomainError)) throw err
      }
      if (exposure) {
        await repo.saveExposure(bank.id, exposure, EXPOSURE_TABLE_VERSION)
        recomputed++
      } else {
        await repo.flagToRedraw(bank.id, now(), EXPOSURE_TABLE_VERSION)
        flagged++
      }
    }
  }
  return { recomputed, flagged }
}

export function banksService(repo: BanksRepo) {
  async function lakeOf(slug: string) {
    const lake = await repo.lake(slug)
    if (!lake) throw notFound('lake')
    return lake
  }
  const nameTaken = () =>
    conflict('name_taken', 'You already have a bank of that name on this lake.', 'name')
  const noBank = () => notFound('bank')

  return {
    async list(userId: string, slug: string) {
      const lake = await lakeOf(slug)
      return { items: (await repo.list(userId, lake.id)).map(toBankView) }
    },

    async create(userId: string, slug: string, input: BankInput) {
      const lake = await lakeOf(slug)
      const row = await repo.insert(userId, lake.id, withExposure(lake.shoreline, input))
      if (!row) throw nameTaken()
      return toBankView(row)
    },

    async update(userId: string, slug: string, id: string, input: BankInput) {
      const lake = await lakeOf(slug)
      if (await repo.nameTaken(userId, lake.id, input.name, id)) throw nameTaken()
      const row = await repo.update(userId, lake.id, id, withExposure(lake.shoreline, input))
      if (!row) throw noBank()
      return toBankView(row)
    },

    async remove(userId: string, slug: string, id: string) {
      const lake = await lakeOf(slug)
      if (!(await repo.remove(userId, lake.id, id))) throw noBank()
    },
  }
}
export type BanksService = ReturnType<typeof banksService>
