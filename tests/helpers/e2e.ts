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
  const server = createAppServer(
    testApp(ctx.db, { staticDir: clientDir, mail: mail.mail, mailbox: mail.smtp }),
  ).listen(0, '127.0.0.1')
  await new Promise((resolve) => server.once('listening', resolve))
  const browser = await launchBrowser()
  return {
    db: ctx.db,
    base: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
    browser,
    mail,
    close: async () => {
      await browser.close()
      server.close()
      await mail.close()
      await ctx.drop()
    },
  }
}
export type E2e = Awaited<ReturnType<typeof startE2e>>
