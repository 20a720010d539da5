import { Router } from 'express'
import { DayPlanParams } from '../../../shared/schemas/day-plan'
import { LakeSlugParams } from '../../../shared/schemas/lake-read'
import { currentUser, requireSignIn } from '../../http/access'
import { input, validate } from '../../http/validate'
import type { ConditionsService } from './conditions.service'

/**
 * The Lake read and the Day plan, both served from the cache the ingest jobs refresh. Express
 * tags each answer with a weak ETag (and answers 304 to a client that holds it); the compression
 * middleware gzips it for a client that asks.
 */
export function conditionsRoutes(conditions: ConditionsService): Router {
  const router = Router()
  router.get(
    '/lakes/:slug/read',
    requireSignIn,
    validate({ params: LakeSlugParams }),
    async (req, res) => {
      res.json(await conditions.read(input(LakeSlugParams, req.params).slug))
    },
  )
  router.get(
    '/lakes/:slug/plan/:date',
    requireSignIn,
    validate({ params: DayPlanParams }),
    async (req, res) => {
      const { slug, date } = input(DayPlanParams, req.params)
      res.json(await conditions.plan(currentUser(req).id, slug, date))
    },
  )
  return router
}
