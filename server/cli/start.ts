import { DEMO_PASSWORD, DEMO_USERS } from '../db/seed/index'
import { loadEnv } from '../env'
import { clientDir, serve } from '../index'
import { createLogger } from '../logger'
import { prepareLocalStack } from './local'

/** `npm start`: the whole app with demo data on a private PostgreSQL. */
const env = loadEnv()
const logger = createLogger(env.LOG_LEVEL)
try {
  const stack = await prepareLocalStack(env)
  await serve({
    db: stack.db,
    logger,
    host: env.HOST,
    port: env.PORT,
    sessionSecret: stack.sessionSecret,
    secureCookies: false,
    appOrigin: env.APP_ORIGIN,
    staticDir: clientDir,
    onClose: async () => stack.cluster?.stop(),
  })
  console.log(`\nChopline is running at http://${env.HOST}:${env.PORT}\n`)
  console.log(`Demo sign-ins (password "${DEMO_PASSWORD}"):`)
  for (const u of DEMO_USERS) console.log(`  ${u.role.padEnd(7)} ${u.email}`)
  console.log('\nPress Ctrl-C to stop.')
} catch (err) {
  console.error(err instanceof Error ? err.message : err)
  process.exit(1)
}
