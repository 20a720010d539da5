import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import cookieParser from 'cookie-parser'
import express, { Router, type Request } from 'express'
import { LakeSlugParams } from '../../shared/schemas/lake-read'
import { PAGE_BOOT_ID, type PageBoot } from '../../shared/schemas/page-boot'
import { sessionOf } from '../features/auth/auth.routes'
import type { AuthService } from '../features/auth/auth.service'
import type { ConditionsAnswers } from '../features/conditions/conditions.cache'
import type { SettingsService } from '../features/settings/settings.service'
import type { Logger } from '../logger'
import { HttpError } from './errors'

const LAKE_READ_PATH = /^\/lakes\/([^/]+)\/?$/
const NO_CACHE_FILES = /(?:^|[/\\])(?:sw\.js|manifest\.webmanifest|index\.html)$/

interface PageDeps {
  staticDir: string
  auth: AuthService
  settings: SettingsService
  conditions: ConditionsAnswers
  log: Logger
}

/**
 * The built client: its assets, and index.html for every other path (the client routes) with the
 * page's boot data written in (see PageBoot). The data is the signed-in user's own, so the page is
 * never stored by a cache.
 */
export function pageRoutes(deps: PageDeps): Router {
  const shell = readFileSync(join(deps.staticDir, 'index.html'), 'utf8')
  const router = Router()
  // Built assets carry a hash of their content in their names: a browser may keep them for good.
  // One that is not there (a page from an older build) is a 404, not index.html.
  router.use(
    '/assets',
    express.static(join(deps.staticDir, 'assets'), {
      immutable: true,
      maxAge: '1y',
      fallthrough: false,
    }),
  )
  // The service worker, the app's manifest and the bare shell name the current build: a browser
  // asks again each time (it then sees a new version at once), the rest may be kept an hour.
  router.use(
    express.static(deps.staticDir, {
      index: false,
      maxAge: '1h',
      setHeaders: (res, path) => {
        if (NO_CACHE_FILES.test(path)) res.setHeader('cache-control', 'no-cache')
      },
    }),
  )
  router.get('/{*splat}', cookieParser(), async (req, res) => {
    const boot = await bootFor(req, deps).catch((err: unknown) => {
      // The page still loads without it, asking the API for what it needs, as under `npm run dev`.
      deps.log.warn({ err, reqId: req.id }, 'page served without its boot data')
      return null
    })
    // Escaping '<' keeps any text in the data (a lake's name) from closing the element.
    const element = boot
      ? `<script type="application/json" id="${PAGE_BOOT_ID}">${JSON.stringify(boot).replaceAll('<', '\\u003c')}</script>`
      : ''
    res
      .type('html')
      .set({ 'cache-control': 'private, no-store', vary: 'cookie' })
      // A function, not a string: '$&' or "$'" in the data must not be read as patterns.
      .send(shell.replace('</body>', () => `${element}</body>`))
  })
  return router
}

async function bootFor(req: Request, deps: PageDeps): Promise<PageBoot> {
  const user = (await sessionOf(deps.auth, req))?.user ?? null
  if (!user) return { user }
  return {
    user,
    settings: await deps.settings.get(user.id),
    lakeRead: await lakeReadFor(req.path, deps.conditions),
  }
}

/** The Lake read a /lakes/:slug page opens on; none for other pages or a lake that is not there. */
async function lakeReadFor(path: string, conditions: ConditionsAnswers) {
  const params = LakeSlugParams.safeParse({ slug: LAKE_READ_PATH.exec(path)?.[1] })
  if (!params.success) return undefined
  try {
    // The kept read's data as it is: no round trip through its bytes.
    return (await conditions.read(params.data.slug)).data
  } catch (err) {
    // The page then asks itself, and shows the API's answer for a lake that is not there.
    if (err instanceof HttpError && err.status === 404) return undefined
    throw err
  }
}
