import { existsSync } from 'node:fs'
import compression from 'compression'
import cookieParser from 'cookie-parser'
import express, { type RequestHandler } from 'express'
import helmet from 'helmet'
import type { Changes } from './db/changes'
import type { PushServer } from './fakes/push/index'
import type { Db } from './db/index'
import { auditRepo } from './features/audit/audit.repo'
import { auditRoutes } from './features/audit/audit.routes'
import { authRepo } from './features/auth/auth.repo'
import { authRoutes, sessionMiddleware } from './features/auth/auth.routes'
import { authService } from './features/auth/auth.service'
import { tokenKey } from './features/auth/auth.tokens'
import { banksRepo } from './features/banks/banks.repo'
import { banksRoutes } from './features/banks/banks.routes'
import { banksService } from './features/banks/banks.service'
import { briefSendsRepo } from './features/brief/brief-sends.repo'
import { briefRepo } from './features/brief/brief.repo'
import { briefRoutes } from './features/brief/brief.routes'
import { briefService, type Mailbox } from './features/brief/brief.service'
import { conditionsRoutes } from './features/conditions/conditions.routes'
import { conditionsAnswers } from './features/conditions/conditions.cache'
import { conditionsFor } from './features/conditions/conditions.service'
import { healthRepo } from './features/health/health.repo'
import { healthRoutes } from './features/health/health.routes'
import { clientsRepo } from './features/guides/clients.repo'
import { clientsService } from './features/guides/clients.service'
import { guidesRoutes } from './features/guides/guides.routes'
import { profileRepo } from './features/guides/profile.repo'
import { profileService } from './features/guides/profile.service'
import { tripsRepo } from './features/guides/trips.repo'
import { tripsService } from './features/guides/trips.service'
import { catchConditionsFor } from './features/journal/catch-conditions'
import { journalRepo } from './features/journal/journal.repo'
import { journalRoutes } from './features/journal/journal.routes'
import type { PhotoStore } from './features/journal/photo-store'
import { journalService } from './features/journal/journal.service'
import { lakesDeskRepo } from './features/desk/lakes-desk.repo'
import { lakesDeskRoutes } from './features/desk/lakes-desk.routes'
import { lakesDeskService } from './features/desk/lakes-desk.service'
import { outlineChecker } from './features/desk/outline-check'
import type { MailContext } from './features/mail/mailer'
import { quarantineRepo } from './features/quarantine/quarantine.repo'
import { quarantineRoutes } from './features/quarantine/quarantine.routes'
import { quarantineService } from './features/quarantine/quarantine.service'
import { lakeReadRepo } from './features/lakes/lake-read.repo'
import { lakeReadService } from './features/lakes/lake-read.service'
import { lakesRepo } from './features/lakes/lakes.repo'
import { lakesRoutes } from './features/lakes/lakes.routes'
import { lakesService } from './features/lakes/lakes.service'
import { settingsRepo } from './features/settings/settings.repo'
import { settingsRoutes } from './features/settings/settings.routes'
import { settingsService } from './features/settings/settings.service'
import { stationsRepo } from './features/stations/stations.repo'
import { stationsRoutes } from './features/stations/stations.routes'
import { stationsService } from './features/stations/stations.service'
import { usersRepo } from './features/users/users.repo'
import { usersRoutes } from './features/users/users.routes'
import { usersService } from './features/users/users.service'
import { pushRepo } from './features/watch/push.repo'
import { pushRoutes } from './features/watch/push.routes'
import { watchRepo } from './features/watch/watch.repo'
import { watchRoutes } from './features/watch/watch.routes'
import { watchService } from './features/watch/watch.service'
import { errorHandler, noRoute } from './http/errors'
import { sameOrigin } from './http/origin'
import { pageRoutes } from './http/pages'
import { authRateLimits, type RateLimit } from './http/rate-limits'
import { requestLog } from './http/request-log'
import type { Logger } from './logger'

export interface AppDeps {
  db: Db
  logger: Logger
  sessionSecret: string
  /** Secure cookies everywhere but local development and tests over plain HTTP. */
  secureCookies: boolean
  /** Where state-changing requests may come from (see `sameOrigin`). */
  appOrigin?: string | string[]
  /** The built client (vite build output); served with an SPA fallback when present. */
  staticDir?: string
  /** Vite's dev middleware, for `npm run dev`. */
  devMiddleware?: RequestHandler
  /** The gauge-and-weather feed, for an admin's "run now" on one station. */
  feedUrl?: string
  /** Outgoing mail (verification links); the morning brief job has its own. */
  mail: MailContext
  /** The local SMTP stand-in's catch, listed for admins in development; absent in production. */
  mailbox?: Mailbox
  /**
   * The database's change notices: with them, sessions, Lake reads and Day plans are answered from
   * memory until something they were made from changes. Without them, from the database each time.
   */
  changes?: Changes
  /** How long an uploaded outline may take to check, in its worker thread; 20 s unless set. */
  outlineCheckMs?: number
  /**
   * Attempts per window on each of sign-in, sign-up, confirmation mail and password change, per
   * account; per address, `authRateLimitPerAddress` (five times as many unless set).
   */
  authRateLimit?: RateLimit
  authRateLimitPerAddress?: RateLimit
  /** Express's `trust proxy`: which proxies in front may name the client's address (TRUST_PROXY). */
  trustProxy?: boolean | number | string
  /** Object storage for catch photos; without it, photo uploads answer 503. */
  photos?: PhotoStore
  /** Web Push: the VAPID public key browsers subscribe with; the local stand-in's catch in development. */
  push?: { publicKey?: string; pushbox?: PushServer }
}

export function createApp(deps: AppDeps): express.Express {
  const app = express()
  app.disable('x-powered-by')
  if (deps.trustProxy !== undefined) app.set('trust proxy', deps.trustProxy)

  const linkKey = tokenKey(deps.sessionSecret)
  const auth = authService(authRepo(deps.db), linkKey, {
    mail: deps.mail,
    log: deps.logger,
    changes: deps.changes,
  })
  const limits = authRateLimits(
    deps.authRateLimit ?? { windowMs: 15 * 60_000, limit: 10 },
    deps.authRateLimitPerAddress,
  )

  const conditions = conditionsAnswers(conditionsFor(deps.db), deps.changes)
  const settings = settingsService(settingsRepo(deps.db))

  app.use(requestLog(deps.logger))
  // Anglers read this on a phone at the ramp: gzip the bundle and the JSON (clients that ask for it).
  app.use(compression())

  const api = express.Router()
  // An API answer is data, never a page: the headers that guard data (no sniffing, no framing,
  // no cross-origin reads), not the dozen a page needs, on every one of thousands of answers.
  api.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: { defaultSrc: ["'none'"], frameAncestors: ["'none'"] },
      },
      crossOriginOpenerPolicy: false,
      originAgentCluster: false,
      xDnsPrefetchControl: false,
      xDownloadOptions: false,
      xFrameOptions: { action: 'deny' },
      xPermittedCrossDomainPolicies: false,
      xXssProtection: false,
      strictTransportSecurity: deps.secureCookies,
    }),
  )
  api.use(express.json({ limit: '100kb' }))
  api.use(cookieParser())
  api.use(sameOrigin(deps.appOrigin))
  api.use(sessionMiddleware(auth))
  api.use(healthRoutes(healthRepo(deps.db)))
  api.use(authRoutes(auth, { secureCookies: deps.secureCookies, limits }))
  api.use(usersRoutes(usersService(usersRepo(deps.db), authRepo(deps.db))))
  api.use(lakesRoutes(lakesService(lakesRepo(deps.db)), lakeReadService(lakeReadRepo(deps.db))))
  api.use(conditionsRoutes(conditions))
  api.use(banksRoutes(banksService(banksRepo(deps.db))))
  api.use(
    stationsRoutes(
      stationsService(stationsRepo(deps.db), {
        db: deps.db,
        log: deps.logger,
        feedUrl: deps.feedUrl,
      }),
    ),
  )
  api.use(settingsRoutes(settings))
  api.use(
    briefRoutes(
      briefService({
        repo: briefRepo(deps.db),
        sends: briefSendsRepo(deps.db),
        mail: deps.mail,
        linkKey,
      }),
      { limiter: limits.verification, mailbox: deps.mailbox },
    ),
  )
  const trips = tripsService({
    repo: tripsRepo(deps.db),
    clients: clientsRepo(deps.db),
    mail: deps.mail,
    linkKey,
    profiles: profileRepo(deps.db),
  })
  api.use(
    guidesRoutes(clientsService(clientsRepo(deps.db)), trips, profileService(profileRepo(deps.db))),
  )
  api.use(quarantineRoutes(quarantineService(quarantineRepo(deps.db))))
  api.use(
    lakesDeskRoutes(
      lakesDeskService({
        db: deps.db,
        repo: lakesDeskRepo(deps.db),
        log: deps.logger,
        checkOutline: outlineChecker({ timeLimitMs: deps.outlineCheckMs ?? 20_000 }),
      }),
    ),
  )
  api.use(auditRoutes(auditRepo(deps.db)))
  api.use(
    journalRoutes(
      journalService({
        repo: journalRepo(deps.db),
        conditionsAt: catchConditionsFor(deps.db),
        sharedTrip: trips.sharedTrip,
        photos: deps.photos,
      }),
    ),
  )
  api.use(watchRoutes(watchService({ repo: watchRepo(deps.db), linkKey }), watchRepo(deps.db)))
  api.use(pushRoutes(pushRepo(deps.db), deps.push ?? {}))
  api.use(noRoute)
  app.use('/api', api)

  app.use(
    helmet({
      // Vite's dev client injects inline scripts; the built app does not need them.
      contentSecurityPolicy: deps.devMiddleware
        ? false
        : { directives: { upgradeInsecureRequests: deps.secureCookies ? [] : null } },
      // HSTS only where the app is served over HTTPS.
      strictTransportSecurity: deps.secureCookies,
    }),
  )

  if (deps.devMiddleware) {
    app.use(deps.devMiddleware)
  } else if (deps.staticDir && existsSync(deps.staticDir)) {
    app.use(
      pageRoutes({
        staticDir: deps.staticDir,
        auth,
        settings,
        conditions,
        log: deps.logger,
      }),
    )
  }

  app.use(noRoute)
  app.use(errorHandler(deps.logger))
  return app
}
