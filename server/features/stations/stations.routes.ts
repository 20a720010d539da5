import { Router } from 'express'
import { requireRole } from '../../http/access'
import type { StationsService } from './stations.service'

export function stationsRoutes(stations: StationsService): Router {
  const router = Router()
  router.get('/admin/stations', requireRole('admin'), async (_req, res) => {
    res.json(await stations.list())
  })
  return router
}
