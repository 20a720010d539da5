import {
  Router,
  type CookieOptions,
  type Request,
  type RequestHandler,
  type Response,
} from 'express'
import {
  PasswordChangeInput,
  SignInInput,
  SignUpConfirmInput,
  SignUpInput,
} from '../../../shared/schemas/auth'
import { currentUser, requireSignIn } from '../../http/access'
import { input, validate } from '../../http/validate'
import type { AuthRateLimits } from '../../http/rate-limits'
import type { AuthService, IssuedSession } from './auth.service'
import { SESSION_COOKIE } from './auth.tokens'

export interface AuthRouteOptions {
  secureCookies: boolean
  /** express-rate-limit middleware, per route (`authRateLimits`). */
  limits: Pick<AuthRateLimits, 'signIn' | 'signUp' | 'signUpConfirm' | 'passwordChange'>
}

export function authRoutes(auth: AuthService, opts: AuthRouteOptions): Router {
  const cookie: CookieOptions = {
    httpOnly: true,
    sameSite: 'lax',
    secure: opts.secureCookies,
    path: '/',
  }
  const respondWithSession = (res: Response, status: number, session: IssuedSession) => {
    res.cookie(SESSION_COOKIE, session.token, { ...cookie, expires: session.expiresAt })
    res.status(status).json({ user: session.user })
  }

  const router = Router()

  router.post(
    '/auth/signup',
    opts.limits.signUp,
    validate({ body: SignUpInput }),
    async (req, res) => {
      res.status(202).json(await auth.signUp(input(SignUpInput, req.body)))
    },
  )

  router.post(
    '/auth/signup/confirm',
    opts.limits.signUpConfirm,
    validate({ body: SignUpConfirmInput }),
    async (req, res) => {
      const { token } = input(SignUpConfirmInput, req.body)
      respondWithSession(res, 201, await auth.confirmSignUp(token))
    },
  )

  router.post(
    '/auth/signin',
    opts.limits.signIn,
    validate({ body: SignInInput }),
    async (req, res) => {
      respondWithSession(res, 200, await auth.signIn(input(SignInInput, req.body)))
    },
  )

  router.post('/auth/signout', async (req, res) => {
    if (req.auth) await auth.signOut(req.auth.sessionId)
    res.clearCookie(SESSION_COOKIE, cookie)
    res.status(204).end()
  })

  router.get('/me', requireSignIn, (req, res) => {
    res.json({ user: currentUser(req) })
  })

  router.post(
    '/me/password',
    requireSignIn,
    opts.limits.passwordChange,
    validate({ body: PasswordChangeInput }),
    async (req, res) => {
      const body = input(PasswordChangeInput, req.body)
      respondWithSession(res, 200, await auth.changePassword(currentUser(req), body))
    },
  )

  return router
}

/** The live session a request's cookie names, if it names one. */
export async function sessionOf(auth: AuthService, req: Request) {
  const token: unknown = req.cookies?.[SESSION_COOKIE]
  return typeof token === 'string' && token ? auth.authenticate(token) : null
}

/** Reads the session cookie and, when it names a live session, sets req.auth. */
export function sessionMiddleware(auth: AuthService): RequestHandler {
  return async (req, _res, next) => {
    const found = await sessionOf(auth, req)
    if (found) req.auth = found
    next()
  }
}
