import http from 'node:http'
import type { Express } from 'express'

/**
 * The HTTP server for an express app, creating each request and response as the app's own.
 *
 * Express otherwise gives every request and response the app's prototype with
 * Object.setPrototypeOf, which V8 cannot optimise: each one's objects then outlive young-generation
 * collections and reach the old generation (expressjs/express#5998). Under load here that meant a
 * 10–15 ms collection pause every tenth of a second and a third of the throughput. Node builds the
 * objects from the classes below, whose prototypes already are `app.request` and `app.response`,
 * so express's re-parenting finds nothing to change.
 */
export function createAppServer(app: Express): http.Server {
  class AppRequest extends http.IncomingMessage {}
  Object.setPrototypeOf(AppRequest.prototype, app.request)
  app.request = AppRequest.prototype as unknown as Express['request']

  class AppResponse extends http.ServerResponse<AppRequest> {}
  Object.setPrototypeOf(AppResponse.prototype, app.response)
  app.response = AppResponse.prototype as unknown as Express['response']

  return http.createServer({ IncomingMessage: AppRequest, ServerResponse: AppResponse }, app)
}
