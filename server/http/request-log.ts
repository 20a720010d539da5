import { randomUUID } from 'node:crypto'
import type { RequestHandler } from 'express'
import type { Logger } from '../logger'

/**
 * Gives each request an id (the x-request-id header, and `req.id` for the error handler) and logs
 * one line when it is done: method, path, status and time taken. The path leaves out the query
 * string, which may carry a token (mail links). This runs on every request, so nothing is built
 * for a level the logger drops: a child logger per request, as pino-http makes, cost about a tenth
 * of a signed-in read's time.
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
            req: { id, method: req.method, path: req.originalUrl.split('?')[0] },
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
