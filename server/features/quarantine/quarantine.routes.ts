import { Router } from 'express'
import { QuarantineParams, QuarantineQuery } from '../../../shared/schemas/quarantine'
import { currentUser, requireRole } from '../../http/access'
import { input, validate } from '../../http/validate'
import type { QuarantineService } from './quarantine.service'

/** Admins review refused readings: list and filter, release one after review, or discard it. */
export function quarantineRoutes(quarantine: QuarantineService): Router {
  const router = Router()
  router.use('/admin/quarantine', requireRole('admin'))
  router.get('/admin/quarantine', validate({ query: QuarantineQuery }), async (req, res) => {
    res.json(await quarantine.list(input(QuarantineQuery, req.query)))
  })
  router.post(
    '/admin/quarantine/:id/release',
    validate({ params: QuarantineParams }),
    async (req, res) => {
      await quarantine.release(currentUser(req), input(QuarantineParams, req.params).id)
      res.status(204).end()
    },
  )
  router.post(
    '/admin/quarantine/:id/discard',
    validate({ params: QuarantineParams }),
    async (req, res) => {
      await quarantine.discard(currentUser(req), input(QuarantineParams, req.params).id)
      res.status(204).end()
    },
  )
  return router
}
