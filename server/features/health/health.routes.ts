import { Router } from 'express'
import type { Health } from '../../../shared/schemas/health'
import type { HealthRepo } from './health.repo'

export function healthRoutes(repo: HealthRepo): Router {
  const router = Router()
  router.get('/health', async (_req, res) => {
    const up = await repo.databaseUp()
    const health: Health = { status: up ? 'ok' : 'degraded', database: up ? 'up' : 'down' }
    res.status(up ? 200 : 503).json(health)
  })
  return router
}
