import { Router } from 'express'
import { LinkToken } from '../../../shared/schemas/brief'
import { WatchInput, WatchParams, WatchPatch } from '../../../shared/schemas/watch'
import { currentUser, requireRole, requireSignIn } from '../../http/access'
import { input, validate } from '../../http/validate'
import type { WatchRepo } from './watch.repo'
import type { WatchService } from './watch.service'

/** An angler's bank watches; links in alerts; the admins' list of alerts sent. */
export function watchRoutes(watches: WatchService, repo: WatchRepo): Router {
  const router = Router()
  router
    .route('/watches')
    .get(requireSignIn, async (req, res) => {
      res.json(await watches.list(currentUser(req).id))
    })
    .post(requireSignIn, validate({ body: WatchInput }), async (req, res) => {
      res.status(201).json(await watches.create(currentUser(req).id, input(WatchInput, req.body)))
    })
  router
    .route('/watches/:id')
    .put(requireSignIn, validate({ params: WatchParams, body: WatchInput }), async (req, res) => {
      const { id } = input(WatchParams, req.params)
      res.json(await watches.update(currentUser(req).id, id, input(WatchInput, req.body)))
    })
    .patch(requireSignIn, validate({ params: WatchParams, body: WatchPatch }), async (req, res) => {
      const { id } = input(WatchParams, req.params)
      res.json(await watches.patch(currentUser(req).id, id, input(WatchPatch, req.body)))
    })
    .delete(requireSignIn, validate({ params: WatchParams }), async (req, res) => {
      await watches.remove(currentUser(req).id, input(WatchParams, req.params).id)
      res.status(204).end()
    })

  // Links from alerts: no sign-in; the signed token names the watch. RFC 8058 one-click POSTs.
  router.post('/watch/unsubscribe', validate({ query: LinkToken }), async (req, res) => {
    await watches.unsubscribe(input(LinkToken, req.query).token)
    res.json({ unsubscribed: true })
  })
  router.get('/watch/unsubscribe', validate({ query: LinkToken }), (req, res) => {
    const { token } = input(LinkToken, req.query)
    res.redirect(303, `/watch/stop?token=${encodeURIComponent(token)}`)
  })

  router.get('/admin/alerts', requireRole('admin'), async (_req, res) => {
    res.json({ items: await repo.recent() })
  })
  return router
}
