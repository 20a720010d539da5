import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { join } from 'node:path'
import { startCluster, type Cluster } from '../db/cluster'
import { createDb, type Db } from '../db/index'
import { migrateDb } from '../db/migrate'
import { DEMO_PASSWORD, DEMO_USERS, seedDemo } from '../db/seed/index'
import { loadEnv, type Env } from '../env'
import { serve, type ServeOptions } from '../index'
import { createLogger } from '../logger'

export const dataDir = fileURLToPath(new URL('../../.data', import.meta.url))

/** A secret made once and kept in .data/, so sessions survive restarts of the local app. */
function localSecret(name: string, bytes: number): string {
  mkdirSync(dataDir, { recursive: true, mode: 0o755 })
  const file = join(dataDir, name)
  if (!existsSync(file))
    writeFileSync(file, randomBytes(bytes).toString('base64url'), { mode: 0o600 })
  return readFileSync(file, 'utf8').trim()
}

interface LocalStack {
  db: Db
  cluster?: Cluster
  sessionSecret: string
}

/**
 * What `npm start` and `npm run dev` share: the private cluster under .data/ (unless DATABASE_URL
 * names another), migrations, demo data and the development session secret.
 */
async function prepareLocalStack(env: Env): Promise<LocalStack> {
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
      dataDir: join(dataDir, 'pg'),
      port: env.CHOPLINE_PG_PORT,
      user: 'chopline',
      password: localSecret('pg-password', 18),
      database: 'chopline',
      durable: true,
      log: (line) => console.log(line),
    })
    url = cluster.url()
  }
  const db = createDb(url)
  await migrateDb(db)
  await seedDemo(db)
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
    const stack = await prepareLocalStack(env)
    const { close, ...client } = await serving(env)
    await serve({
      ...client,
      db: stack.db,
      logger: createLogger(env.LOG_LEVEL),
      host: env.HOST,
      port: env.PORT,
      sessionSecret: stack.sessionSecret,
      secureCookies: false,
      appOrigin: env.APP_ORIGIN,
      onClose: async () => {
        await close?.()
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
  console.log('\nPress Ctrl-C to stop.')
}
