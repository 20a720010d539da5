import { Router } from 'express'
import { CatchInput, CatchListQuery, CatchParams } from '../../../shared/schemas/journal'
import { IdParams, ShareToken } from '../../../shared/schemas/guides'
import { currentUser, requireRole, requireSignIn } from '../../http/access'
import { input, validate } from '../../http/validate'
import type { JournalService } from './journal.service'

/** An angler's own catch journal; another angler's catch is a 404, admins' included. */
export function journalRoutes(journal: JournalService): Router {
  const router = Router()
  router
    .route('/journal/catches')
    .get(requireSignIn, validate({ query: CatchListQuery }), async (req, res) => {
      res.json(await journal.list(currentUser(req).id, input(CatchListQuery, req.query)))
    })
    .post(requireSignIn, validate({ body: CatchInput }), async (req, res) => {
      res.status(201).json(await journal.create(currentUser(req), input(CatchInput, req.body)))
    })
  router
    .route('/journal/catches/:id')
    .get(requireSignIn, validate({ params: CatchParams }), async (req, res) => {
      res.json(await journal.get(currentUser(req).id, input(CatchParams, req.params).id))
    })
    .put(requireSignIn, validate({ params: CatchParams, body: CatchInput }), async (req, res) => {
      const { id } = input(CatchParams, req.params)
      res.json(await journal.update(currentUser(req), id, input(CatchInput, req.body)))
    })
    .delete(requireSignIn, validate({ params: CatchParams }), async (req, res) => {
      await journal.remove(currentUser(req).id, input(CatchParams, req.params).id)
      res.status(204).end()
    })

  // A guide's trip: the catches logged on it, for the guide and, through the link, its clients.
  router.get(
    '/guide/trips/:id/catches',
    requireRole('guide'),
    validate({ params: IdParams }),
    async (req, res) => {
      res.json(await journal.tripCatches(currentUser(req).id, input(IdParams, req.params).id))
    },
  )
  router.get('/shared/trips/:token/catches', validate({ params: ShareToken }), async (req, res) => {
    res.setHeader('cache-control', 'no-store')
    res.json(await journal.sharedCatches(input(ShareToken, req.params).token))
  })
  return router
}
