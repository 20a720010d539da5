import { join } from 'node:path'
import { startCluster, type Cluster } from '../db/cluster'
import { dataDir, localDatabase, localSecret, localVapid } from './local-config'
import { createDb, type Db } from '../db/index'
import { migrateDb } from '../db/migrate'
import { count } from 'drizzle-orm'
import { startScheduler } from '../../jobs/scheduler'
import { runIngestReadings } from '../../jobs/ingest-readings'
import { runIngestWeather } from '../../jobs/ingest-weather'
import { readings } from '../db/schema/index'
import { DEMO_PASSWORD, DEMO_USERS, seedDemo, seedDemoLife } from '../db/seed/index'
import { DEMO_FEED_SEED, DEMO_STATIONS } from '../db/seed/demo-stations'
import { startFeed } from '../fakes/feed/index'
import { backfillReadings } from '../features/ingest/readings.ingest'
import { ingestRepo } from '../features/ingest/ingest.repo'
import type { Logger } from '../logger'
import { allowedOrigins, jobSchedule, loadEnv, publicOrigin, s3Settings, type Env } from '../env'
import { startMailServer } from '../fakes/mail/index'
import { startS3Server } from '../fakes/s3/index'
import { photoStore } from '../features/journal/photo-store'
import { startPushServer } from '../fakes/push/index'
import { webPushSender } from '../features/watch/push'
import { pushRepo } from '../features/watch/push.repo'
import { users } from '../db/schema/index'
import { eq } from 'drizzle-orm'
import { smtpMailer } from '../features/mail/mailer'
import { runSendBriefs } from '../../jobs/send-briefs'
import { runCheckWatches } from '../../jobs/check-watches'
import { serve, type ServeOptions } from '../index'
import { createLogger } from '../logger'

interface LocalStack {
  db: Db
  cluster?: Cluster
  sessionSecret: string
}

/** Days of history the demo loads on its first start, so charts and trends have something to show. */
const DEMO_HISTORY_DAYS = 30

/**
 * The feed and the SMTP server (the local stand-ins unless FEED_URL and SMTP_URL name real ones)
 * and the job schedule. On a first start the demo lakes get a month of history, then the regular
 * jobs take over.
 */
async function startServicesAndJobs(env: Env, db: Db, log: Logger, sessionSecret: string) {
  const fakeFeed = env.FEED_URL
    ? undefined
    : await startFeed({ seed: DEMO_FEED_SEED, stations: DEMO_STATIONS }, env.FEED_PORT)
  const fakeSmtp = env.SMTP_URL ? undefined : await startMailServer({ port: env.SMTP_PORT })
  // Catch photos: the local S3 stand-in keeps them under .data/s3 unless S3_URL names a provider.
  const fakeS3 = env.S3_URL
    ? undefined
    : await startS3Server({
        bucket: env.S3_BUCKET,
        port: env.S3_PORT,
        directory: join(dataDir, 's3'),
      })
  const photos = photoStore(s3Settings(env) ?? { ...fakeS3!, region: env.S3_REGION })
  const feedUrl = env.FEED_URL ?? fakeFeed!.url
  const mailer = smtpMailer(env.SMTP_URL ?? fakeSmtp!.url, env.MAIL_FROM)
  const mail = { mailer, origin: publicOrigin(env) }
  // Browsers subscribe through their own push service; the stand-in takes what goes to its
  // endpoints, such as the demo angler's device below, so admins see pushes beside the mail.
  const vapid = localVapid(env)
  const fakePush = await startPushServer({ port: env.PUSH_PORT })
  const push = webPushSender({ db, log, vapid })
  const ctx = { db, feedUrl, log, mail, sessionSecret, push }
  await demoDevice(db, fakePush)
  const scheduler = startScheduler(ctx, jobSchedule(env))
  void (async () => {
    const [row] = await db.select({ n: count() }).from(readings)
    if (!row?.n) {
      log.info(`loading ${DEMO_HISTORY_DAYS} days of demo history from the feed`)
      for (const lake of await ingestRepo(db).lakesWithSlugs())
        await backfillReadings(ctx, lake.id, DEMO_HISTORY_DAYS)
    }
    await runIngestReadings(ctx)
    await runIngestWeather(ctx)
    log.info('readings and weather are up to date')
    log.info({ result: await runCheckWatches(ctx) }, 'bank watches judged')
    log.info({ result: await runSendBriefs(ctx) }, 'morning briefs due now sent')
  })().catch((err: unknown) => log.error({ err }, 'first ingestion failed'))
  return {
    feedUrl,
    mail,
    mailbox: fakeSmtp,
    photos,
    push: { publicKey: vapid.publicKey, pushbox: fakePush },
    stop: async () => {
      await scheduler.stop()
      await fakePush.close()
      mailer.close()
      photos.close()
      await fakeS3?.close()
      await fakeSmtp?.close()
      await fakeFeed?.close()
    },
  }
}

/** The demo angler's stand-in device: a fresh subscription at the push stand-in on each start. */
async function demoDevice(db: Db, pushServer: Awaited<ReturnType<typeof startPushServer>>) {
  const [angler] = await db
    .select({ id: users.id })
    .from(users)
    .where(eq(users.email, DEMO_USERS.find((u) => u.role === 'angler')!.email))
  if (angler) await pushRepo(db).save(angler.id, pushServer.subscribe())
}

/**
 * What `npm start` and `npm run dev` share: the private cluster under .data/ (unless DATABASE_URL
 * names another), migrations, demo data and the development session secret.
 */
async function prepareLocalStack(env: Env, logger: Logger): Promise<LocalStack> {
  if (env.NODE_ENV === 'production') {
    throw new Error(
      'npm start seeds demo sign-ins with a published password and refuses to run with NODE_ENV=production. ' +
        'Deploy with `tsx server/index.ts` and your own DATABASE_URL and SESSION_SECRET.',
    )
  }
  let cluster: Cluster | undefined
  let url = env.DATABASE_URL
  if (!url) {
    cluster = await startCluster({
      ...localDatabase(env),
      dataDir: join(dataDir, 'pg'),
      durable: true,
      log: (line) => console.log(line),
    })
    url = cluster.url()
  }
  const db = createDb(url, { log: logger })
  await migrateDb(db)
  await seedDemo(db)
  // Banks, clients and trips, so each screen shows its main job on first open.
  await seedDemoLife(db)
  return { db, cluster, sessionSecret: env.SESSION_SECRET ?? localSecret('session-secret', 48) }
}

/**
 * Runs the app on the local stack for `npm start` (static client) and `npm run dev` (Vite
 * middleware); Ctrl-C closes the server, then `close` and the cluster if this process started it.
 */
export async function serveLocal(
  serving: (
    env: Env,
  ) => Promise<Pick<ServeOptions, 'staticDir' | 'devMiddleware'> & { close?: () => Promise<void> }>,
): Promise<void> {
  const env = loadEnv()
  try {
    const logger = createLogger(env.LOG_LEVEL)
    const stack = await prepareLocalStack(env, logger)
    const { close, ...client } = await serving(env)
    const services = await startServicesAndJobs(env, stack.db, logger, stack.sessionSecret)
    await serve({
      ...client,
      db: stack.db,
      logger,
      host: env.HOST,
      port: env.PORT,
      sessionSecret: stack.sessionSecret,
      secureCookies: false,
      appOrigin: allowedOrigins(env),
      trustProxy: env.TRUST_PROXY,
      feedUrl: services.feedUrl,
      mail: services.mail,
      mailbox: services.mailbox,
      photos: services.photos,
      push: services.push,
      onClose: async () => {
        await services.stop()
        await close?.()
      },
      afterDbClose: async () => {
        await stack.cluster?.stop()
      },
    })
  } catch (err) {
    console.error(err instanceof Error ? err.message : err)
    process.exit(1)
  }
  console.log(`\nChopline is running at http://${env.HOST}:${env.PORT}\n`)
  console.log(`Demo sign-ins (password "${DEMO_PASSWORD}"):`)
  for (const u of DEMO_USERS) console.log(`  ${u.role.padEnd(7)} ${u.email}`)
  if (!env.SMTP_URL)
    console.log('Mail is caught locally, not sent: admins read it under Admin → Mail.')
  console.log('\nPress Ctrl-C to stop.')
}
