import { Router } from 'express'
import { Settings } from '../../../shared/schemas/settings'
import { currentUser, requireSignIn } from '../../http/access'
import { input, validate } from '../../http/validate'
import type { SettingsService } from './settings.service'

export function settingsRoutes(settings: SettingsService): Router {
  const router = Router()
  router.get('/me/settings', requireSignIn, async (req, res) => {
    res.json(await settings.get(currentUser(req).id))
  })
  router.put('/me/settings', requireSignIn, validate({ body: Settings }), async (req, res) => {
    res.json(await settings.save(currentUser(req).id, input(Settings, req.body)))
  })
  return router
}
