import type { Request, RequestHandler } from 'express'
import { roleAllows } from '../../shared/roles'
import type { Role, User } from '../../shared/schemas/auth'
import { forbidden, unauthenticated } from './errors'

/** 401 without a session, 403 when the role is not enough. */
export function requireRole(needed: Role): RequestHandler {
  return (req, _res, next) => {
    if (!req.auth) throw unauthenticated()
    if (!roleAllows(req.auth.user.role, needed)) {
      throw forbidden()
    }
    next()
  }
}

export const requireSignIn = requireRole('angler')

/** The signed-in user of a request that passed requireRole. */
export function currentUser(req: Request): User {
  if (!req.auth) throw unauthenticated()
  return req.auth.user
}
