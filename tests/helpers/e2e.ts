import type { AddressInfo } from 'node:net'
import { clientDir } from '../../server/index'
import { createAppServer } from '../../server/http/server'
import { testApp } from './app'
import { launchBrowser } from './browser'
import { startTestMail } from './mail'
import { startWorld } from './world'

/**
 * The demo data with `days` of Quillmere readings and the weather from the fake feed, as npm start
 * loads them, with the conditions cache refreshed; the built client served as npm start serves it
 * (the same HTTP server), sending mail to the local SMTP stand-in; and Chromium.
 */
export async function startE2e(days: number) {
  const ctx = await startWorld(days)
  await ctx.feed.close()
  const mail = await startTestMail()
  // npm test runs vite build before the tests.
  const serve = (staticDir: string) =>
    createAppServer(testApp(ctx.db, { staticDir, mail: mail.mail, mailbox: mail.smtp }))
  let server = serve(clientDir).listen(0, '127.0.0.1')
  await new Promise((resolve) => server.once('listening', resolve))
  const browser = await launchBrowser()
  const port = (server.address() as AddressInfo).port
  return {
    db: ctx.db,
    base: `http://127.0.0.1:${port}`,
    browser,
    mail,
    /**
     * The server's side of going offline: Chromium's offline mode (`context.setOffline`) does not
     * reach a service worker's own requests, so the server stops listening, and starts again on
     * the same port, serving the client built in `staticDir` (another build: a new version).
     */
    network: {
      down: async () => {
        server.closeAllConnections()
        await new Promise((resolve) => server.close(resolve))
      },
      up: async (staticDir = clientDir) => {
        server = serve(staticDir).listen(port, '127.0.0.1')
        await new Promise((resolve) => server.once('listening', resolve))
      },
    },
    close: async () => {
      await browser.close()
      if (server.listening) server.close()
      await mail.close()
      await ctx.drop()
    },
  }
}
export type E2e = Awaited<ReturnType<typeof startE2e>>
