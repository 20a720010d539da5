import { Router } from 'express'
import { BankInput, BankParams } from '../../../shared/schemas/banks'
import { LakeSlugParams } from '../../../shared/schemas/lake-read'
import { currentUser, requireSignIn } from '../../http/access'
import { input, validate } from '../../http/validate'
import type { BanksService } from './banks.service'

/** An angler's own banks on a lake; another angler's bank is a 404, never a 403. */
export function banksRoutes(banks: BanksService): Router {
  const router = Router()
  router
    .route('/lakes/:slug/banks')
    .get(requireSignIn, validate({ params: LakeSlugParams }), async (req, res) => {
      const { slug } = input(LakeSlugParams, req.params)
      res.json(await banks.list(currentUser(req).id, slug))
    })
    .post(
      requireSignIn,
      validate({ params: LakeSlugParams, body: BankInput }),
      async (req, res) => {
        const { slug } = input(LakeSlugParams, req.params)
        res
          .status(201)
          .json(await banks.create(currentUser(req).id, slug, input(BankInput, req.body)))
      },
    )
  router
    .route('/lakes/:slug/banks/:id')
    .put(requireSignIn, validate({ params: BankParams, body: BankInput }), async (req, res) => {
      const { slug, id } = input(BankParams, req.params)
      res.json(await banks.update(currentUser(req).id, slug, id, input(BankInput, req.body)))
    })
    .delete(requireSignIn, validate({ params: BankParams }), async (req, res) => {
      const { slug, id } = input(BankParams, req.params)
      await banks.remove(currentUser(req).id, slug, id)
      res.status(204).end()
    })
  return router
}
