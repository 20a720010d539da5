import { Router, type RequestHandler } from 'express'
import { LakeListQuery } from '../../../shared/schemas/lakes'
import { currentUser, requireSignIn } from '../../http/access'
import { input, validate } from '../../http/validate'
import { LakeSlugParams } from '../../../shared/schemas/lake-read'
import { SeriesQuery } from '../../../shared/schemas/lake-series'
import type { LakeReadService } from './lake-read.service'
import type { LakesService } from './lakes.service'

export function lakesRoutes(lakes: LakesService, reads: LakeReadService): Router {
  const router = Router()
  router.get('/lakes', requireSignIn, validate({ query: LakeListQuery }), async (req, res) => {
    res.json(await lakes.list(input(LakeListQuery, req.query), currentUser(req).id))
  })
  // Pickers list every lake; the paged list above is for the Lakes screen.
  router.get('/lakes/names', requireSignIn, async (_req, res) => {
    res.json(await lakes.names())
  })
  router.get(
    '/lakes/:slug/shoreline',
    requireSignIn,
    validate({ params: LakeSlugParams }),
    async (req, res) => {
      // Express's ETag turns a repeat fetch into a 304; the outline changes only when an admin replaces it.
      res.set('cache-control', 'private, no-cache')
      res.json(await lakes.shape(input(LakeSlugParams, req.params).slug))
    },
  )
  router.get(
    '/lakes/:slug/series',
    requireSignIn,
    validate({ params: LakeSlugParams, query: SeriesQuery }),
    async (req, res) => {
      const { days } = input(SeriesQuery, req.query)
      res.json(await reads.series(input(LakeSlugParams, req.params).slug, days))
    },
  )
  // Subscribing is idempotent: PUT it twice, DELETE it twice, same result.
  const follow =
    (following: boolean): RequestHandler =>
    async (req, res) => {
      await lakes.setSubscription(
        currentUser(req).id,
        input(LakeSlugParams, req.params).slug,
        following,
      )
      res.status(204).end()
    }
  router
    .route('/lakes/:slug/subscription')
    .all(requireSignIn, validate({ params: LakeSlugParams }))
    .put(follow(true))
    .delete(follow(false))
  return router
}
