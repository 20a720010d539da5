import { sql } from 'drizzle-orm'
import { Router } from 'express'
import type { Health } from '../../../shared/schemas/health'
import type { Db } from '../../db/index'

export function healthRoutes(db: Db): Router {
  const router = Router()
  router.get('/health', async (_req, res) => {
    const up = await db.execute(sql`select 1`).then(
      () => true,
      () => false,
    )
    const health: Health = { status: up ? 'ok' : 'degraded', database: up ? 'up' : 'down' }
    res.status(up ? 200 : 503).json(health)
  })
  return router
}
