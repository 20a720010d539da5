import { pathToFileURL } from 'node:url'
import { createDb, type Db } from '../server/db/index'
import { localConnection } from '../server/cli/local-config'
import { loadEnv } from '../server/env'
import { createLogger, type Logger } from '../server/logger'

export interface JobContext {
  db: Db
  feedUrl: string
  log: Logger
}

/**
 * Runs a job once when its file is executed directly (`tsx jobs/<name>.ts`): against DATABASE_URL
 * and FEED_URL, or the stack `npm start` runs when they are unset.
 */
export function runFromCli(moduleUrl: string, job: (ctx: JobContext) => Promise<unknown>): void {
  if (!process.argv[1] || pathToFileURL(process.argv[1]).href !== moduleUrl) return
  const env = loadEnv()
  const { databaseUrl, feedUrl } = localConnection(env)
  const db = createDb(databaseUrl, 4)
  const log = createLogger(env.LOG_LEVEL)
  job({ db, feedUrl, log })
    .then((result) => {
      log.info({ result }, 'job finished')
      return db.$client.end()
    })
    .catch((err: unknown) => {
      log.error({ err }, 'job failed')
      process.exitCode = 1
      return db.$client.end()
    })
}
