import { Router } from 'express'
import { PushEndpoint, PushSubscriptionInput, type PushKey } from '../../../shared/schemas/push'
import { currentUser, requireRole, requireSignIn } from '../../http/access'
import { HttpError } from '../../http/errors'
import { input, validate } from '../../http/validate'
import type { PushServer } from '../../fakes/push/index'
import type { PushRepo } from './push.repo'

/** A browser's push subscription, the key to make one with, and the local push stand-in's catch. */
export function pushRoutes(repo: PushRepo, opts: { publicKey?: string; pushbox?: PushServer }) {
  const router = Router()
  router.get('/push/key', requireSignIn, (_req, res) => {
    res.json({ publicKey: opts.publicKey ?? null } satisfies PushKey)
  })
  router
    .route('/me/push')
    .put(requireSignIn, validate({ body: PushSubscriptionInput }), async (req, res) => {
      if (!opts.publicKey)
        throw new HttpError(404, 'no_push', 'This server does not send push alerts.')
      await repo.save(currentUser(req).id, input(PushSubscriptionInput, req.body))
      res.status(204).end()
    })
    .delete(requireSignIn, validate({ body: PushEndpoint }), async (req, res) => {
      await repo.remove(currentUser(req).id, input(PushEndpoint, req.body).endpoint)
      res.status(204).end()
    })
  // Development only: what the local push stand-in received, beside the caught mail.
  router.get('/admin/pushbox', requireRole('admin'), (_req, res) => {
    if (!opts.pushbox)
      throw new HttpError(
        404,
        'no_pushbox',
        'This server sends real pushes; there is no local catch.',
      )
    res.json({ items: opts.pushbox.messages() })
  })
  return router
}
