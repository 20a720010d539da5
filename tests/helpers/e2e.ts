import type { AddressInfo } from 'node:net'
import type { BrowserContext } from 'playwright-core'
import { eq, sql } from 'drizzle-orm'
import { vi } from 'vitest'
import { users } from '../../server/db/schema/index'
import { DEMO_PASSWORD } from '../../server/db/seed/index'
import { SCENARIOS, scenarioClock, type ScenarioName } from '../../server/fakes/feed/scenarios'
import { banksRepo } from '../../server/features/banks/banks.repo'
import { banksService } from '../../server/features/banks/banks.service'
import type { Cover } from '../../shared/conditions/tackle-rules'
import { fetchLength } from '../../shared/geo/fetch'
import { lakeCenter } from '../../shared/geo/polygon'
import { destination } from '../shared/geo/fixtures'
import { clientDir } from '../../server/index'
import { createAppServer } from '../../server/http/server'
import type { AppDeps } from '../../server/app'
import { liveChanges, testApp } from './app'
import { launchBrowser } from './browser'
import { startTestMail } from './mail'
import { startScenario } from './scenario'
import { startWorld } from './world'

/**
 * The demo data with `days` of Quillmere readings and the weather from the fake feed, as npm start
 * loads them, with the conditions cache refreshed; the built client served as npm start serves it
 * (the same HTTP server), sending mail to the local SMTP stand-in; and Chromium. `deps` adds to
 * the app's (a photo store, for one).
 */
export async function startE2e(days: number, deps: Partial<AppDeps> = {}) {
  const ctx = await startWorld(days)
  await ctx.feed.close()
  const mail = await startTestMail()
  // Answers kept in memory and dropped by change notices, as `serve()` runs the app.
  const changes = await liveChanges(ctx.db)
  // npm test runs vite build before the tests.
  const serve = (staticDir: string) =>
    createAppServer(
      testApp(ctx.db, { staticDir, mail: mail.mail, mailbox: mail.smtp, changes, ...deps }),
    )
  let server = serve(clientDir).listen(0, '127.0.0.1')
  await new Promise((resolve) => server.once('listening', resolve))
  const browser = await launchBrowser()
  const port = (server.address() as AddressInfo).port
  /**
   * The server's side of going offline: Chromium's offline mode (`context.setOffline`) does not
   * reach a service worker's own requests, so the server stops listening, and starts again on
   * the same port, serving the client built in `staticDir` (another build: a new version).
   */
  const network = {
    down: async () => {
      server.closeAllConnections()
      await new Promise((resolve) => server.close(resolve))
    },
    up: async (staticDir = clientDir) => {
      server = serve(staticDir).listen(port, '127.0.0.1')
      await new Promise((resolve) => server.once('listening', resolve))
    },
  }
  return {
    db: ctx.db,
    base: `http://127.0.0.1:${port}`,
    browser,
    mail,
    network,
    /** The browser's offline mode for the page and the server gone for the worker's own requests. */
    offline: async (context: BrowserContext) => {
      await context.setOffline(true)
      await network.down()
    },
    online: async (context: BrowserContext) => {
      await network.up()
      await context.setOffline(false)
    },
    close: async () => {
      await browser.close()
      if (server.listening) server.close()
      await changes.close()
      await mail.close()
      await ctx.drop()
    },
  }
}
export type E2e = Awaited<ReturnType<typeof startE2e>>

/** Every URL the service worker's caches hold, for `page.evaluate` (a string: no DOM library here). */
export const KEPT_URLS = `(async () => {
  const urls = []
  for (const name of await caches.keys())
    for (const req of await (await caches.open(name)).keys()) urls.push(req.url)
  return urls
})()`

/** A bank of the scenario's lake for a demo user: where the shore lies `bearingDeg` from the centre. */
export interface E2eBank {
  name: string
  bearingDeg: number
  cover: Cover[]
}

/**
 * `startE2e` on a named scenario day: the demo data, the scenario's lake backfilled and the
 * weather ingested through the real jobs with the feed's clock at the scenario's morning, the
 * cache refreshed, `banks` saved for the demo angler and for the demo guide, the built client
 * served with mail to the stand-in, and Chromium.
 *
 * The process's `Date` (the server, the jobs) and the browser's clock start at the scenario's
 * morning and run on from there, so "today" is the scenario's day everywhere. PostgreSQL keeps
 * the real clock, and a session made on the scenario's morning would look expired to it: a
 * trigger in this throwaway database moves each new session's end past the real now.
 */
export async function startE2eScenario(name: ScenarioName, banks: E2eBank[]) {
  const clock = scenarioClock(SCENARIOS[name])
  vi.useFakeTimers({ now: clock, toFake: ['Date'], shouldAdvanceTime: true })
  const world = await startScenario(name)
  await world.db.execute(sql`
    create function e2e_session_on_real_clock() returns trigger language plpgsql as $$
    begin
      new.expires_at := greatest(new.expires_at, now() + interval '1 day');
      return new;
    end $$`)
  await world.db.execute(sql`
    create trigger e2e_session_on_real_clock before insert on sessions
    for each row execute function e2e_session_on_real_clock()`)

  const idOf = async (email: string) =>
    (await world.db.select().from(users).where(eq(users.email, email)))[0]!.id
  const center = lakeCenter(world.lake.shoreline)
  const onShore = (deg: number) =>
    destination(center, deg, fetchLength(world.lake.shoreline, center, deg) - 1)
  const saved: Record<string, string[]> = {}
  for (const email of ['angler@chopline.test', 'guide@chopline.test']) {
    const owner = await idOf(email)
    saved[email] = []
    for (const b of banks) {
      // Two points on the shore 4° apart as seen from the centre: the bank faces the open water.
      const bank = await banksService(banksRepo(world.db)).create(owner, world.lake.slug, {
        name: b.name,
        points: [onShore(b.bearingDeg - 2), onShore(b.bearingDeg + 2)],
        cover: b.cover,
        depthM: 3,
        slope: null,
        notes: '',
      })
      saved[email].push(bank.id)
    }
  }
  await world.conditions.refreshAll(world.feed.now())

  const mail = await startTestMail()
  const changes = await liveChanges(world.db)
  const server = createAppServer(
    testApp(world.db, { staticDir: clientDir, mail: mail.mail, mailbox: mail.smtp, changes }),
  ).listen(0, '127.0.0.1')
  await new Promise((resolve) => server.once('listening', resolve))
  const browser = await launchBrowser()
  // Playwright's own clock also fakes timers and animation frames, which stalls screenshots: the
  // pages get a Date that runs at the process's offset from the real clock, and nothing else.
  const offset = Date.now() - (performance.timeOrigin + performance.now())
  await browser.context.addInitScript(`(() => {
    const RealDate = Date
    const offset = ${offset}
    class ScenarioDate extends RealDate {
      constructor(...args) {
        if (args.length === 0) super(RealDate.now() + offset)
        else super(...args)
      }
      static now() {
        return RealDate.now() + offset
      }
    }
    globalThis.Date = ScenarioDate
  })()`)
  return {
    world,
    db: world.db,
    base: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
    browser,
    mail,
    /** The ids of the banks saved for each demo user, in the order given. */
    bankIds: saved,
    close: async () => {
      await browser.close()
      server.close()
      await changes.close()
      await mail.close()
      await world.close()
      vi.useRealTimers()
    },
  }
}
export type E2eScenario = Awaited<ReturnType<typeof startE2eScenario>>

/** Signs a demo user in through the API: a cookie for `fetch` calls against the running app. */
export async function apiSession(base: string, email: string) {
  const res = await fetch(`${base}/api/auth/signin`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  })
  if (!res.ok) throw new Error(`sign-in as ${email}: ${res.status}`)
  const pairs = res.headers.getSetCookie().map((c) => c.split(';')[0]!)
  const cookie = pairs.join('; ')
  const call = async <T>(method: string, path: string, body?: unknown): Promise<T> => {
    const answer = await fetch(`${base}${path}`, {
      method,
      headers: { cookie, ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    })
    if (!answer.ok) throw new Error(`${method} ${path}: ${answer.status} ${await answer.text()}`)
    return (answer.status === 204 ? undefined : await answer.json()) as T
  }
  return Object.assign(call, {
    /**
     * The session in a browser context. Chromium judges a cookie's expiry by the real clock, so
     * one set on a scenario's morning through the sign-in page would be gone at once; this one
     * lasts as long as the context.
     */
    async into(context: BrowserContext) {
      await context.addCookies(
        pairs.map((p) => {
          const at = p.indexOf('=')
          return { name: p.slice(0, at), value: p.slice(at + 1), url: base }
        }),
      )
    },
  })
}
