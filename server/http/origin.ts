import type { RequestHandler } from 'express'
import { HttpError } from './errors'

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])

/**
 * CSRF defence for cookie sessions (OWASP's "verifying origin with standard headers"):
 * a state-changing request that names an Origin or Referer must name one of ours.
 * Browsers always send one of them on cross-site requests; clients without either are not browsers.
 * Without `appOrigins` (tests only: `npm start`, `npm run dev` and production always name them)
 * the request's own Host is taken as ours.
 */
export function sameOrigin(appOrigins: string | string[] | undefined): RequestHandler {
  const allowed = appOrigins === undefined ? undefined : new Set([appOrigins].flat())
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next()
    const claimed = req.get('origin') ?? refererOrigin(req.get('referer'))
    if (claimed === undefined) return next()
    const ours = allowed ?? new Set([`${req.protocol}://${req.get('host')}`])
    if (!ours.has(claimed)) {
      throw new HttpError(
        403,
        'cross_origin',
        'This request came from another site and was refused.',
      )
    }
    next()
  }
}

function refererOrigin(referer: string | undefined): string | undefined {
  if (!referer) return undefined
  try {
    return new URL(referer).origin
  } catch {
    return 'invalid'
  }
}
