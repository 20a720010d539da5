import { Router } from 'express'
import { LakeCreateInput, LakeEditInput } from '../../../shared/schemas/desk'
import { LakeSlugParams } from '../../../shared/schemas/lake-read'
import { currentUser, requireRole } from '../../http/access'
import { notFound } from '../../http/errors'
import { singleUpload } from '../../http/upload'
import { input, validate } from '../../http/validate'
import type { LakesDeskService } from './lakes-desk.service'

/** GeoJSON outlines: 2 MB holds a 50,000-vertex lake with room to spare. */
const geojson = singleUpload({ maxBytes: 2 * 1024 * 1024, extensions: ['.geojson', '.json'] })
const text = (req: { file?: Express.Multer.File }) => req.file!.buffer.toString('utf8')

/** The gauge desk's lakes (admins): create, edit, and replace the outline after a preview. */
export function lakesDeskRoutes(lakes: LakesDeskService): Router {
  const router = Router()
  router.use('/admin/lakes', requireRole('admin'))
  router.post('/admin/lakes/shoreline-preview', geojson, async (req, res) => {
    res.json(await lakes.preview(text(req)))
  })
  router.post('/admin/lakes', geojson, validate({ body: LakeCreateInput }), async (req, res) => {
    res
      .status(201)
      .json(await lakes.create(currentUser(req), input(LakeCreateInput, req.body), text(req)))
  })
  router.get('/admin/lakes/:slug', validate({ params: LakeSlugParams }), async (req, res) => {
    res.json(await lakes.lake(input(LakeSlugParams, req.params).slug))
  })
  router.put(
    '/admin/lakes/:slug',
    validate({ params: LakeSlugParams, body: LakeEditInput }),
    async (req, res) => {
      const { slug } = input(LakeSlugParams, req.params)
      res.json(await lakes.edit(currentUser(req), slug, input(LakeEditInput, req.body)))
    },
  )
  router.post(
    '/admin/lakes/:slug/shoreline',
    validate({ params: LakeSlugParams }),
    geojson,
    async (req, res) => {
      const { slug } = input(LakeSlugParams, req.params)
      res.status(202).json(await lakes.replaceShoreline(currentUser(req), slug, text(req)))
    },
  )
  router.get(
    '/admin/lakes/:slug/recompute',
    validate({ params: LakeSlugParams }),
    async (req, res) => {
      const status = await lakes.recomputeStatus(input(LakeSlugParams, req.params).slug)
      if (!status) throw notFound('recompute', 'This lake has had no new outline yet.')
      res.json(status)
    },
  )
  return router
}
