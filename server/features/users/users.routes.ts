import { Router } from 'express'
import { UserIdParams, UserListQuery, UserRoleInput } from '../../../shared/schemas/users'
import { currentUser, requireRole } from '../../http/access'
import { input, validate } from '../../http/validate'
import type { UsersService } from './users.service'

export function usersRoutes(users: UsersService): Router {
  const router = Router()
  router.use('/admin/users', requireRole('admin'))

  router.get('/admin/users', validate({ query: UserListQuery }), async (req, res) => {
    res.json(await users.list(input(UserListQuery, req.query)))
  })

  router.patch(
    '/admin/users/:id',
    validate({ params: UserIdParams, body: UserRoleInput }),
    async (req, res) => {
      const { id } = input(UserIdParams, req.params)
      res.json({ user: await users.setRole(currentUser(req), id, input(UserRoleInput, req.body)) })
    },
  )
  return router
}
