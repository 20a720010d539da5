import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { join } from 'node:path'
import { startCluster, type Cluster } from '../db/cluster'
import { createDb, type Db } from '../db/index'
import { migrateDb } from '../db/migrate'
import { seedDemo } from '../db/seed/index'
import type { Env } from '../env'

export const dataDir = fileURLToPath(new URL('../../.data', import.meta.url))

/** A secret made once and kept in .data/, so sessions survive restarts of the local app. */
function localSecret(name: string, bytes: number): string {
  mkdirSync(dataDir, { recursive: true, mode: 0o755 })
  const file = join(dataDir, name)
  if (!existsSync(file))
    writeFileSync(file, randomBytes(bytes).toString('base64url'), { mode: 0o600 })
  return readFileSync(file, 'utf8').trim()
}

export interface LocalStack {
  db: Db
  cluster?: Cluster
  sessionSecret: string
}

/**
 * What `npm start` and `npm run dev` share: the private cluster under .data/ (unless DATABASE_URL
 * names another), migrations, demo data and the development session secret.
 */
export async function prepareLocalStack(env: Env): Promise<LocalStack> {
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
