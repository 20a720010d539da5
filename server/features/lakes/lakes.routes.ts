import { Router } from 'express'
import { LakeListQuery } from '../../../shared/schemas/lakes'
import { requireSignIn } from '../../http/access'
import { input, validate } from '../../http/validate'
import { LakeSlugParams } from '../../../shared/schemas/lake-read'
import type { LakeReadService } from './lake-read.service'
import type { LakesService } from './lakes.service'

export function lakesRoutes(lakes: LakesService, reads: LakeReadService): Router {
  const router = Router()
  router.get('/lakes', requireSignIn, validate({ query: LakeListQuery }), async (req, res) => {
    res.json(await lakes.list(input(LakeListQuery, req.query)))
  })
  router.get(
    '/lakes/:slug/read',
    requireSignIn,
    validate({ params: LakeSlugParams }),
    async (req, res) => {
      res.json(await reads.read(input(LakeSlugParams, req.params).slug))
    },
  )
  return router
}
