import { randomUUID } from 'node:crypto'
import type { RequestHandler } from 'express'
import type { Logger } from '../logger'

/** Paths whose next segment is a token (a trip's share link, in the API and as a page). */
const TOKEN_AFTER = /(\/(?:shared\/trips|trip)\/)[^/]+/g
/** Anything shaped like a signed token (three base64url parts), wherever it sits in a path. */
const SIGNED_TOKEN = /[\w-]{8,}\.[\w-]{8,}\.[\w-]{8,}/g

/**
 * The path a log line names: no query string (mail links carry their token there), and no token
 * in the path either, so whoever reads the log cannot open a guide's trip or a subscriber's links.
 */
export function loggedPath(url: string): string {
  return url.split('?')[0]!.replace(TOKEN_AFTER, '$1:token').replace(SIGNED_TOKEN, ':token')
}

/**
 * Gives each request an id (the x-request-id header, and `req.id` for the error handler) and logs
 * one line when it is done: method, path (`loggedPath`), status and time taken. This runs on every
 * request, so nothing is built for a level the logger drops: a child logger per request, as
 * pino-http makes, cost about a tenth of a signed-in read's time.
 */
export function requestLog(logger: Logger): RequestHandler {
  return (req, res, next) => {
    const id = randomUUID()
    req.id = id
    res.setHeader('x-request-id', id)
    if (logger.isLevelEnabled('info')) {
      const start = performance.now()
      // 'close' comes after 'finish', or alone when the client went away first.
      res.once('close', () =>
        logger.info(
          {
            req: { id, method: req.method, path: loggedPath(req.originalUrl) },
            res: { statusCode: res.statusCode },
            responseTime: Math.round(performance.now() - start),
          },
          res.writableFinished ? 'request completed' : 'request aborted',
        ),
      )
    }
    next()
  }
}
