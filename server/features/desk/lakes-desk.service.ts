import { exposureTable } from '../../../shared/conditions/exposure'
import { DomainError } from '../../../shared/errors'
import { shoreIndex } from '../../../shared/geo/fetch'
import { lakeCenter } from '../../../shared/geo/polygon'
import type { LakeGeometry } from '../../../shared/geo/types'
import type { User } from '../../../shared/schemas/auth'
import type {
  DeskLake,
  LakeCreateInput,
  LakeEditInput,
  RecomputeStatus,
  ShorelinePreview,
} from '../../../shared/schemas/desk'
import { isoOrNull } from '../../../shared/time'
import type { Db } from '../../db/index'
import { conflict, notFound } from '../../http/errors'
import type { Logger } from '../../logger'
import { audit } from '../audit/audit.repo'
import { SNAP_M } from '../banks/banks.service'
import { conditionsFor } from '../conditions/conditions.service'
import type { LakesDeskRepo } from './lakes-desk.repo'
import type { CheckOutline } from './outline-check'

type Actor = Pick<User, 'id' | 'email'>

/** The gauge desk's lakes: metadata, new outlines (checked, previewed, then saved), and the bank recompute. */
export function lakesDeskService(deps: {
  db: Db
  repo: LakesDeskRepo
  log: Logger
  /** Checks an uploaded outline off the request thread (`outlineChecker`). */
  checkOutline: CheckOutline
  now?: () => Date
}) {
  const { repo } = deps
  const now = () => deps.now?.() ?? new Date()

  async function lakeOf(slug: string) {
    const lake = await repo.bySlug(slug)
    if (!lake) throw notFound('lake')
    return lake
  }

  /**
   * Every bank on the lake against the new outline: points snapped again, exposure tables
   * recomputed; a bank whose points no longer touch the shore is kept and flagged. Progress is
   * written as it goes; the conditions cache is refreshed at the end.
   */
  async function recompute(
    lakeId: string,
    shoreline: LakeGeometry,
    banks: Awaited<ReturnType<LakesDeskRepo['banksOn']>>,
  ) {
    const index = shoreIndex(shoreline)
    let detached = 0
    try {
      for (const [i, bank] of banks.entries()) {
        const snapped = bank.points.map((p) => index.nearestShorePoint(p, SNAP_M)?.point)
        const onShore = snapped.every(Boolean)
        let exposure = null
        if (onShore) {
          try {
            exposure = exposureTable(shoreline, snapped as [number, number][])
          } catch (err) {
            if (!(err instanceof DomainError)) throw err
          }
        }
        if (!exposure) detached++
        await repo.saveBank(
          bank.id,
          exposure ? (snapped as [number, number][]) : bank.points,
          exposure,
          exposure ? null : now(),
        )
        if ((i + 1) % 25 === 0 || i === banks.length - 1)
          await repo.progress(lakeId, i + 1, detached)
      }
      await conditionsFor(deps.db).refresh(lakeId, now())
      await repo.finishRecompute(lakeId, now(), null)
    } catch (err) {
      deps.log.error({ err, lakeId }, 'bank recompute failed')
      await repo.finishRecompute(lakeId, now(), err instanceof Error ? err.message : String(err))
    }
  }

  async function status(lakeId: string): Promise<RecomputeStatus | null> {
    const row = await repo.recompute(lakeId)
    return row
      ? {
          total: row.total,
          done: row.done,
          detached: row.detached,
          startedAt: row.startedAt.toISOString(),
          finishedAt: isoOrNull(row.finishedAt),
          error: row.error,
        }
      : null
  }

  return {
    /** Checks an uploaded outline and returns it to draw, saving nothing. */
    preview: async (text: string): Promise<ShorelinePreview> => {
      const { shoreline, stats } = await deps.checkOutline(text)
      return { shoreline, stats }
    },

    async create(actor: Actor, input: LakeCreateInput, text: string) {
      const { shoreline, stats } = await deps.checkOutline(text)
      const lake = await repo.create({
        ...input,
        shoreline,
        areaKm2: stats.areaKm2,
        center: lakeCenter(shoreline),
      })
      if (!lake) throw conflict('slug_taken', 'Another lake has that slug.', 'slug')
      await audit(deps.db, actor, {
        action: 'lake.create',
        targetType: 'lake',
        targetId: lake.slug,
        before: null,
        after: { ...input, ...stats },
      })
      return { slug: lake.slug }
    },

    async edit(actor: Actor, slug: string, input: LakeEditInput) {
      const lake = await lakeOf(slug)
      await deps.db.transaction(async (tx) => {
        await repo.edit(lake.id, input, tx)
        await audit(tx, actor, {
          action: 'lake.edit',
          targetType: 'lake',
          targetId: slug,
          before: {
            name: lake.name,
            region: lake.region,
            timeZone: lake.timeZone,
            normalPoolM: lake.normalPoolM,
          },
          after: input,
        })
      })
      return { slug }
    },

    /** Replaces the outline, then recomputes the lake's banks in the background. */
    async replaceShoreline(actor: Actor, slug: string, text: string): Promise<RecomputeStatus> {
      const lake = await lakeOf(slug)
      const { shoreline, stats } = await deps.checkOutline(text)
      await repo.replaceShoreline(lake.id, shoreline, stats.areaKm2, lakeCenter(shoreline))
      await audit(deps.db, actor, {
        action: 'lake.shoreline',
        targetType: 'lake',
        targetId: slug,
        before: { areaKm2: lake.areaKm2 },
        after: stats,
      })
      // The progress row exists before the answer goes out; the banks are done in the background.
      const banks = await repo.banksOn(lake.id)
      await repo.startRecompute(lake.id, banks.length, now())
      void recompute(lake.id, shoreline, banks)
      return (await status(lake.id))!
    },

    async lake(slug: string): Promise<DeskLake> {
      const { name, region, timeZone, normalPoolM } = await lakeOf(slug)
      return { slug, name, region, timeZone, normalPoolM }
    },
    recomputeStatus: async (slug: string) => status((await lakeOf(slug)).id),
  }
}
export type LakesDeskService = ReturnType<typeof lakesDeskService>
