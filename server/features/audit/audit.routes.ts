import { Router } from 'express'
import { AuditQuery } from '../../../shared/schemas/audit'
import { requireRole } from '../../http/access'
import { input, validate } from '../../http/validate'
import type { AuditRepo } from './audit.repo'

/** The audit log, read-only for admins; there is no route that changes it. */
export function auditRoutes(repo: AuditRepo): Router {
  const router = Router()
  router.get(
    '/admin/audit',
    requireRole('admin'),
    validate({ query: AuditQuery }),
    async (req, res) => {
      res.json(await repo.list(input(AuditQuery, req.query)))
    },
  )
  return router
}
