import { Router } from 'express'
import { LakeListQuery } from '../../../shared/schemas/lakes'
import { requireSignIn } from '../../http/access'
import { input, validate } from '../../http/validate'
import type { LakesService } from './lakes.service'

export function lakesRoutes(lakes: LakesService): Router {
  const router = Router()
  router.get('/lakes', requireSignIn, validate({ query: LakeListQuery }), async (req, res) => {
    res.json(await lakes.list(input(LakeListQuery, req.query)))
  })
  return router
}
