import type { Request, RequestHandler } from 'express'
import { ipKeyGenerator, rateLimit } from 'express-rate-limit'
import { HttpError } from './errors'

export interface RateLimit {
  windowMs: number
  limit: number
}

const tooMany = () => {
  throw new HttpError(429, 'rate_limited', 'Too many attempts. Wait a few minutes and try again.')
}

/** The client's address, IPv6 by its /56 as express-rate-limit advises (behind `trust proxy`). */
const byAddress = (req: Request) => `ip:${ipKeyGenerator(req.ip ?? '')}`
/** The account a request names: the e-mail in its body, or the signed-in user. */
const byEmail = (req: Request) => {
  const email: unknown = (req.body as { email?: unknown } | undefined)?.email
  return typeof email === 'string' ? `email:${email.trim().toLowerCase()}` : byAddress(req)
}
const byUser = (req: Request) => (req.auth ? `user:${req.auth.user.id}` : byAddress(req))

function limiter(
  limit: RateLimit,
  key: (req: Request) => string,
  countSuccesses: boolean,
): RequestHandler {
  return rateLimit({
    ...limit,
    keyGenerator: key,
    // A sign-in that worked is no attack: only failures count (mail sent counts every time).
    skipSuccessfulRequests: !countSuccesses,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: tooMany,
  })
}

/** Both limits in turn, as one middleware: the account's own, then its address's. */
function both(first: RequestHandler, second: RequestHandler): RequestHandler {
  return (req, res, next) =>
    Promise.resolve(
      first(req, res, (err?: unknown) =>
        err ? next(err) : Promise.resolve(second(req, res, next)).catch(next),
      ),
    ).catch(next)
}

/**
 * Limits on the routes an attacker would hammer, each route its own counters, each keyed by the
 * account it names and by the address it comes from. An address's limit is wider, for an office
 * or a campus behind one address. Password guesses (sign-in, a change of password) count only
 * when wrong; anything that sends mail (sign-up, confirmation links) counts every time.
 */
export function authRateLimits(perAccount: RateLimit, perAddress?: RateLimit) {
  const wide = perAddress ?? { ...perAccount, limit: perAccount.limit * 5 }
  return {
    signIn: both(limiter(perAccount, byEmail, false), limiter(wide, byAddress, false)),
    signUp: both(limiter(perAccount, byEmail, true), limiter(wide, byAddress, true)),
    signUpConfirm: limiter(wide, byAddress, false),
    verification: both(limiter(perAccount, byUser, true), limiter(wide, byAddress, true)),
    passwordChange: limiter(perAccount, byUser, false),
  }
}
export type AuthRateLimits = ReturnType<typeof authRateLimits>
