import type { Server } from 'node:http'
import { fileURLToPath, pathToFileURL } from 'node:url'
import { createApp, type AppDeps } from './app'
import { watchChanges } from './db/changes'
import { createDb } from './db/index'
import { migrateDb } from './db/migrate'
import { jobSchedule, loadEnv, s3Settings, vapidFromEnv } from './env'
import { createAppServer } from './http/server'
import { createLogger } from './logger'
import { smtpMailer } from './features/mail/mailer'
import { photoStore } from './features/journal/photo-store'
import { webPushSender } from './features/watch/push'
import { startScheduler } from '../jobs/scheduler'

export const clientDir = fileURLToPath(new URL('../dist', import.meta.url))

export interface ServeOptions extends AppDeps {
  host: string
  port: number
  /**
   * Runs after the HTTP server has closed and before the pool ends: stop background work (the job
   * scheduler) that still uses the database. `afterDbClose` then stops what the pool ran on.
   */
  onClose?: () => Promise<void>
  afterDbClose?: () => Promise<void>
}

/** Listens, and on SIGINT/SIGTERM stops taking requests, lets open ones finish, then runs onClose. */
export function serve(opts: ServeOptions): Promise<Server> {
  const changes = opts.changes ?? watchChanges(opts.db.$client.options, opts.logger)
  const app = createApp({ ...opts, changes })
  return new Promise((resolve, reject) => {
    const server = createAppServer(app)
    server.once('error', reject)
    server.listen(opts.port, opts.host, () => {
      server.off('error', reject)
      resolve(server)
    })
    let closing = false
    const shutdown = (signal: string) => {
      if (closing) return
      closing = true
      opts.logger.info({ signal }, 'shutting down')
      server.close(async () => {
        await opts.onClose?.()
        await changes.close()
        await opts.db.$client.end()
        await opts.afterDbClose?.()
        process.exit(0)
      })
      server.closeIdleConnections()
      setTimeout(() => server.closeAllConnections(), 5_000).unref()
    }
    process.once('SIGINT', () => shutdown('SIGINT'))
    process.once('SIGTERM', () => shutdown('SIGTERM'))
  })
}

/** Production entry: an external PostgreSQL and a secret from the environment. */
async function main() {
  const env = loadEnv()
  const { DATABASE_URL, SESSION_SECRET, FEED_URL, SMTP_URL, APP_ORIGIN } = env
  if (!DATABASE_URL || !SESSION_SECRET || !FEED_URL || !SMTP_URL || !APP_ORIGIN) {
    throw new Error(
      'DATABASE_URL, SESSION_SECRET, FEED_URL, SMTP_URL and APP_ORIGIN must be set (npm start sets up local stand-ins).',
    )
  }
  const logger = createLogger(env.LOG_LEVEL)
  const db = createDb(DATABASE_URL, { log: logger })
  await migrateDb(db)
  const mail = { mailer: smtpMailer(SMTP_URL, env.MAIL_FROM), origin: APP_ORIGIN }
  const s3 = s3Settings(env)
  const photos = s3 && photoStore(s3)
  // Watch alerts go by push only where VAPID keys are set; by mail everywhere.
  const vapid = vapidFromEnv(env)
  // Jobs run in every instance; each run takes a PostgreSQL lock, so one instance does the work.
  const scheduler = startScheduler(
    {
      db,
      feedUrl: FEED_URL,
      log: logger,
      mail,
      sessionSecret: SESSION_SECRET,
      push: vapid ? webPushSender({ db, log: logger, vapid }) : undefined,
    },
    jobSchedule(env),
  )
  await serve({
    db,
    logger,
    host: env.HOST,
    port: env.PORT,
    sessionSecret: SESSION_SECRET,
    secureCookies: env.NODE_ENV === 'production',
    appOrigin: APP_ORIGIN,
    trustProxy: env.TRUST_PROXY,
    staticDir: clientDir,
    feedUrl: FEED_URL,
    mail,
    photos,
    push: { publicKey: vapid?.publicKey },
    onClose: async () => {
      await scheduler.stop()
      mail.mailer.close()
      photos?.close()
    },
  })
  logger.info(`Chopline listening on http://${env.HOST}:${env.PORT}`)
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  main().catch((err: unknown) => {
    console.error(err instanceof Error ? err.message : err)
    process.exit(1)
  })
}
