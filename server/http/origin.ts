import type { RequestHandler } from 'express'
import { HttpError } from './errors'

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])

/**
 * CSRF defence for cookie sessions (OWASP's "verifying origin with standard headers"):
 * a state-changing request that names an Origin or Referer must name ours.
 * Browsers always send one of them on cross-site requests; clients without either are not browsers.
 */
export function sameOrigin(appOrigin: string | undefined): RequestHandler {
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next()
    const claimed = req.get('origin') ?? refererOrigin(req.get('referer'))
    if (claimed === undefined) return next()
    const expected = appOrigin ?? `${req.protocol}://${req.get('host')}`
    if (claimed !== expected) {
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
