import { pathToFileURL } from 'node:url'
import { createDb, type Db } from '../server/db/index'
import { localConnection } from '../server/cli/local-config'
import { loadEnv, publicOrigin } from '../server/env'
import { smtpMailer, type MailContext } from '../server/features/mail/mailer'
import { createLogger, type Logger } from '../server/logger'
import type { ChannelSender } from '../server/features/watch/send-alerts'
import { webPushSender } from '../server/features/watch/push'
import { localVapid } from '../server/cli/local-config'

export interface JobContext {
  db: Db
  feedUrl: string
  log: Logger
  mail: MailContext
  /** Signs the links the jobs put in e-mail (unsubscribe). */
  sessionSecret: string
  /** Web Push for watch alerts; absent where no VAPID keys are set. */
  push?: ChannelSender
}

/**
 * Runs a job once when its file is executed directly (`tsx jobs/<name>.ts`): against DATABASE_URL,
 * FEED_URL and SMTP_URL, or the stack `npm start` runs where they are unset.
 */
export function runFromCli(moduleUrl: string, job: (ctx: JobContext) => Promise<unknown>): void {
  if (!process.argv[1] || pathToFileURL(process.argv[1]).href !== moduleUrl) return
  const env = loadEnv()
  const { databaseUrl, feedUrl, smtpUrl, sessionSecret } = localConnection(env)
  const log = createLogger(env.LOG_LEVEL)
  const db = createDb(databaseUrl, { max: 4, log })
  const mailer = smtpMailer(smtpUrl, env.MAIL_FROM)
  const push = webPushSender({ db, log, vapid: localVapid(env) })
  job({ db, feedUrl, log, sessionSecret, push, mail: { mailer, origin: publicOrigin(env) } })
    .then((result) => log.info({ result }, 'job finished'))
    .catch((err: unknown) => {
      log.error({ err }, 'job failed')
      process.exitCode = 1
    })
    .finally(() => {
      mailer.close()
      return db.$client.end()
    })
}
