import { Router } from 'express'
import { DayPlanParams } from '../../../shared/schemas/day-plan'
import { LakeSlugParams } from '../../../shared/schemas/lake-read'
import { currentUser, requireSignIn } from '../../http/access'
import { sendPrepared } from '../../http/prepared-json'
import { input, validate } from '../../http/validate'
import type { ConditionsAnswers } from './conditions.cache'

/** The Lake read and the Day plan, both served from the cache the ingest jobs refresh. */
export function conditionsRoutes(answers: ConditionsAnswers): Router {
  const router = Router()
  router.get(
    '/lakes/:slug/read',
    requireSignIn,
    validate({ params: LakeSlugParams }),
    async (req, res) => {
      sendPrepared(res, (await answers.read(input(LakeSlugParams, req.params).slug)).answer)
    },
  )
  router.get(
    '/lakes/:slug/plan/:date',
    requireSignIn,
    validate({ params: DayPlanParams }),
    async (req, res) => {
      const { slug, date } = input(DayPlanParams, req.params)
      sendPrepared(res, (await answers.plan(currentUser(req).id, slug, date)).answer)
    },
  )
  return router
}
