import { Router } from 'express'
import {
  ClientInput,
  GuideProfile,
  IdParams,
  ShareInput,
  ShareParams,
  ShareSendInput,
  ShareToken,
  TripInput,
} from '../../../shared/schemas/guides'
import { currentUser, requireRole } from '../../http/access'
import { input, validate } from '../../http/validate'
import { ImportQuery, singleUpload } from '../../http/upload'
import type { ClientsService } from './clients.service'
import type { ProfileService } from './profile.service'
import type { TripsService } from './trips.service'

/**
 * A guide's clients and trips under /guide (a trip, a client or a link of another guide is a 404),
 * and the read-only page a share link opens, for anyone holding it.
 */
export function guidesRoutes(
  clients: ClientsService,
  trips: TripsService,
  profile: ProfileService,
): Router {
  const router = Router()
  const guide = (req: Parameters<typeof currentUser>[0]) => currentUser(req).id
  router.use('/guide', requireRole('guide'))

  router
    .route('/guide/profile')
    .get(async (req, res) => {
      res.json(await profile.view(guide(req)))
    })
    .put(validate({ body: GuideProfile }), async (req, res) => {
      res.json(await profile.save(guide(req), input(GuideProfile, req.body)))
    })

  router.get('/guide/clients', async (req, res) => {
    res.json(await clients.list(guide(req)))
  })
  router.post('/guide/clients', validate({ body: ClientInput }), async (req, res) => {
    res.status(201).json(await clients.create(guide(req), input(ClientInput, req.body)))
  })
  router.post(
    '/guide/clients/import',
    singleUpload({ maxBytes: 256 * 1024, extensions: ['.csv'] }),
    validate({ query: ImportQuery }),
    async (req, res) => {
      const commit = input(ImportQuery, req.query).commit === 'true'
      const report = await clients.importCsv(guide(req), req.file!.buffer.toString('utf8'), commit)
      res.status(commit ? 201 : 200).json(report)
    },
  )
  router
    .route('/guide/clients/:id')
    .put(validate({ params: IdParams, body: ClientInput }), async (req, res) => {
      const { id } = input(IdParams, req.params)
      res.json(await clients.update(guide(req), id, input(ClientInput, req.body)))
    })
    .delete(validate({ params: IdParams }), async (req, res) => {
      await clients.remove(guide(req), input(IdParams, req.params).id)
      res.status(204).end()
    })

  router.get('/guide/trips', async (req, res) => {
    res.json(await trips.list(guide(req)))
  })
  router.post('/guide/trips', validate({ body: TripInput }), async (req, res) => {
    res.status(201).json(await trips.create(guide(req), input(TripInput, req.body)))
  })
  router
    .route('/guide/trips/:id')
    .get(validate({ params: IdParams }), async (req, res) => {
      res.json(await trips.view(guide(req), input(IdParams, req.params).id))
    })
    .put(validate({ params: IdParams, body: TripInput }), async (req, res) => {
      const { id } = input(IdParams, req.params)
      res.json(await trips.update(guide(req), id, input(TripInput, req.body)))
    })
    .delete(validate({ params: IdParams }), async (req, res) => {
      await trips.remove(guide(req), input(IdParams, req.params).id)
      res.status(204).end()
    })
  router.post(
    '/guide/trips/:id/shares',
    validate({ params: IdParams, body: ShareInput }),
    async (req, res) => {
      const { id } = input(IdParams, req.params)
      const { expiresOn } = input(ShareInput, req.body)
      res.status(201).json({ items: await trips.share(guide(req), id, expiresOn) })
    },
  )
  router.delete(
    '/guide/trips/:id/shares/:shareId',
    validate({ params: ShareParams }),
    async (req, res) => {
      const { id, shareId } = input(ShareParams, req.params)
      res.json({ items: await trips.revoke(guide(req), id, shareId) })
    },
  )
  router.post(
    '/guide/trips/:id/shares/:shareId/send',
    validate({ params: ShareParams, body: ShareSendInput }),
    async (req, res) => {
      const { id, shareId } = input(ShareParams, req.params)
      const { clientIds } = input(ShareSendInput, req.body)
      res.json({ items: await trips.send(guide(req), id, shareId, clientIds) })
    },
  )

  // The client's page: no account; the signed link is the authority.
  router.get('/shared/trips/:token', validate({ params: ShareToken }), async (req, res) => {
    res.setHeader('cache-control', 'no-store')
    res.json(await trips.openShared(input(ShareToken, req.params).token))
  })
  return router
}
