import { Router, type Response } from 'express'
import {
  CatchImportQuery,
  CatchInput,
  CatchListQuery,
  CatchParams,
  InsightsQuery,
  PhotoParams,
  PhotoUploadQuery,
  SharedPhotoParams,
} from '../../../shared/schemas/journal'
import { IdParams, ShareToken } from '../../../shared/schemas/guides'
import { currentUser, requireRole, requireSignIn } from '../../http/access'
import { singleUpload } from '../../http/upload'
import { input, validate } from '../../http/validate'
import type { JournalService } from './journal.service'

/** A phone's photo is 2-8 MB; past this it is not a photo of a fish. */
export const MAX_PHOTO_BYTES = 12 * 1024 * 1024
/** A season's journal is a few hundred rows; 2,000 rows with notes fit well inside this. */
export const MAX_IMPORT_BYTES = 1024 * 1024
const PHOTO_TYPES = ['.jpg', '.jpeg', '.png', '.webp']

function sendPhoto(res: Response, data: Buffer) {
  // A photo id's copies never change: the browser may keep them, but only for this user.
  res.setHeader('cache-control', 'private, max-age=604800, immutable')
  res.type('image/jpeg').send(data)
}

/** An angler's own catch journal; another angler's catch is a 404, admins' included. */
export function journalRoutes(journal: JournalService): Router {
  const router = Router()
  router
    .route('/journal/catches')
    .get(requireSignIn, validate({ query: CatchListQuery }), async (req, res) => {
      res.json(await journal.list(currentUser(req).id, input(CatchListQuery, req.query)))
    })
    .post(requireSignIn, validate({ body: CatchInput }), async (req, res) => {
      const { created, view } = await journal.create(currentUser(req), input(CatchInput, req.body))
      // A catch sent again by its phone (the same clientId) is answered as it is: 200, not 201.
      res.status(created ? 201 : 200).json(view)
    })
  router.get('/journal/export.csv', requireSignIn, async (req, res) => {
    const csv = await journal.exportCsv(currentUser(req).id)
    res.setHeader('cache-control', 'private, no-store')
    res.setHeader('content-disposition', 'attachment; filename="chopline-journal.csv"')
    // A byte-order mark, so a spreadsheet reads the file as UTF-8.
    res.type('text/csv; charset=utf-8').send(`\uFEFF${csv}\r\n`)
  })
  router.post(
    '/journal/import',
    requireSignIn,
    singleUpload({ maxBytes: MAX_IMPORT_BYTES, extensions: ['.csv'] }),
    validate({ query: CatchImportQuery }),
    async (req, res) => {
      const commit = input(CatchImportQuery, req.query).commit === 'true'
      const text = req.file!.buffer.toString('utf8')
      const report = await journal.importCsv(currentUser(req), text, commit)
      res.status(commit ? 201 : 200).json(report)
    },
  )
  router.get(
    '/journal/insights',
    requireSignIn,
    validate({ query: InsightsQuery }),
    async (req, res) => {
      res.json(await journal.insights(currentUser(req).id, input(InsightsQuery, req.query)))
    },
  )
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

  router.post(
    '/journal/photos',
    requireSignIn,
    singleUpload({ maxBytes: MAX_PHOTO_BYTES, extensions: PHOTO_TYPES }),
    validate({ query: PhotoUploadQuery }),
    async (req, res) => {
      const { lake } = input(PhotoUploadQuery, req.query)
      res.status(201).json(await journal.uploadPhoto(currentUser(req).id, req.file!.buffer, lake))
    },
  )
  router.get(
    '/journal/photos/:id/:size',
    requireSignIn,
    validate({ params: PhotoParams }),
    async (req, res) => {
      const { id, size } = input(PhotoParams, req.params)
      sendPhoto(res, await journal.photo(currentUser(req).id, id, size))
    },
  )

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
  router.get(
    '/shared/trips/:token/photos/:id/:size',
    validate({ params: SharedPhotoParams }),
    async (req, res) => {
      const { token, id, size } = input(SharedPhotoParams, req.params)
      sendPhoto(res, await journal.sharedPhoto(token, id, size))
    },
  )
  return router
}
