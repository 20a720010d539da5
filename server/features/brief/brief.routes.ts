import { Router, type RequestHandler } from 'express'
import { z } from 'zod'
import {
  BriefDeliveryQuery,
  BriefSettings,
  CaughtMailList,
  LinkToken,
} from '../../../shared/schemas/brief'
import { currentUser, requireRole, requireSignIn } from '../../http/access'
import { HttpError, notFound } from '../../http/errors'
import { input, validate } from '../../http/validate'
import type { BriefService, Mailbox } from './brief.service'

const MailId = z.object({ id: z.coerce.number().int().min(1, 'Not a message.') })

export function briefRoutes(
  brief: BriefService,
  opts: { limiter: RequestHandler; mailbox?: Mailbox },
): Router {
  const router = Router()

  router.get('/me/brief', requireSignIn, async (req, res) => {
    res.json(await brief.view(currentUser(req).id))
  })
  router.put('/me/brief', requireSignIn, validate({ body: BriefSettings }), async (req, res) => {
    res.json(await brief.save(currentUser(req).id, input(BriefSettings, req.body)))
  })
  router.post('/me/brief/verification', requireSignIn, opts.limiter, async (req, res) => {
    res.status(202).json(await brief.sendVerification(currentUser(req).id))
  })

  // Links from e-mail: no sign-in; the signed token is the authority.
  router.post('/brief/verify', validate({ body: LinkToken }), async (req, res) => {
    res.json(await brief.verify(input(LinkToken, req.body).token))
  })
  // RFC 8058 one-click: the mail client POSTs "List-Unsubscribe=One-Click" to the header's URL.
  router.post('/brief/unsubscribe', validate({ query: LinkToken }), async (req, res) => {
    await brief.unsubscribe(input(LinkToken, req.query).token)
    res.json({ unsubscribed: true })
  })
  // Clients that open the header's URL instead land on the page, which unsubscribes and says so.
  router.get('/brief/unsubscribe', validate({ query: LinkToken }), (req, res) => {
    res.redirect(303, `/unsubscribe?token=${encodeURIComponent(input(LinkToken, req.query).token)}`)
  })

  router.use('/admin/brief-deliveries', requireRole('admin'))
  router.get(
    '/admin/brief-deliveries',
    validate({ query: BriefDeliveryQuery }),
    async (req, res) => {
      res.json({ items: await brief.undelivered(input(BriefDeliveryQuery, req.query).status) })
    },
  )

  // The development inbox: what the local SMTP stand-in caught. Absent where real mail is sent.
  router.use('/admin/mailbox', requireRole('admin'), (_req, _res, next) => {
    if (!opts.mailbox)
      throw new HttpError(
        404,
        'no_mailbox',
        'This server sends real mail; there is no local inbox.',
      )
    next()
  })
  router.get('/admin/mailbox', (_req, res) => {
    // The list schema keeps only the summary fields; bodies come one message at a time.
    res.json(CaughtMailList.parse({ items: opts.mailbox!.messages() }))
  })
  router.get('/admin/mailbox/:id', validate({ params: MailId }), (req, res) => {
    const found = opts.mailbox!.message(input(MailId, req.params).id)
    if (!found) throw notFound('message', 'No such message (the inbox keeps the latest 500).')
    res.json(found)
  })
  return router
}
