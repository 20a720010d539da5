import { Router } from 'express'
import { StationHistoryQuery, StationInput, StationParams } from '../../../shared/schemas/stations'
import { ImportQuery } from '../../http/upload'
import { currentUser, requireRole } from '../../http/access'
import { singleUpload } from '../../http/upload'
import { input, validate } from '../../http/validate'
import type { StationsService } from './stations.service'

/** The gauge desk's stations (admins): health, create, edit or deactivate, run ingestion now. */
export function stationsRoutes(stations: StationsService): Router {
  const router = Router()
  router.use('/admin/stations', requireRole('admin'))
  router.get('/admin/stations', async (_req, res) => {
    res.json(await stations.list())
  })
  router.get(
    '/admin/stations/history',
    validate({ query: StationHistoryQuery }),
    async (req, res) => {
      res.json(await stations.histories(input(StationHistoryQuery, req.query).days))
    },
  )
  router.post('/admin/stations', validate({ body: StationInput }), async (req, res) => {
    res.status(201).json(await stations.create(currentUser(req), input(StationInput, req.body)))
  })
  router.put(
    '/admin/stations/:id',
    validate({ params: StationParams, body: StationInput }),
    async (req, res) => {
      const { id } = input(StationParams, req.params)
      res.json(await stations.edit(currentUser(req), id, input(StationInput, req.body)))
    },
  )
  router.post(
    '/admin/stations/:id/readings',
    validate({ params: StationParams }),
    singleUpload({ maxBytes: 5 * 1024 * 1024, extensions: ['.csv'] }),
    validate({ query: ImportQuery }),
    async (req, res) => {
      const { id } = input(StationParams, req.params)
      const commit = input(ImportQuery, req.query).commit === 'true'
      const csv = req.file!.buffer.toString('utf8')
      res.json(await stations.importReadings(currentUser(req), id, csv, commit))
    },
  )
  router.post('/admin/stations/:id/run', validate({ params: StationParams }), async (req, res) => {
    res.json(await stations.runNow(currentUser(req), input(StationParams, req.params).id))
  })
  return router
}
