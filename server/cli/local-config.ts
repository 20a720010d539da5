import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { clusterUrl } from '../db/cluster'
import { vapidFromEnv, type Env } from '../env'
import { generateVapid, type Vapid } from '../features/watch/push'

export const dataDir = fileURLToPath(new URL('../../.data', import.meta.url))

/** A secret made once and kept in .data/, so sessions survive restarts of the local app. */
export function localSecret(name: string, bytes: number): string {
  mkdirSync(dataDir, { recursive: true, mode: 0o755 })
  const file = join(dataDir, name)
  if (!existsSync(file))
    writeFileSync(file, randomBytes(bytes).toString('base64url'), { mode: 0o600 })
  return readFileSync(file, 'utf8').trim()
}

export function localDatabase(env: Env) {
  return {
    port: env.CHOPLINE_PG_PORT,
    user: 'chopline',
    password: localSecret('pg-password', 18),
    database: 'chopline',
  }
}

/**
 * Where jobs run by hand find the stack `npm start` runs, for each of DATABASE_URL, FEED_URL,
 * SMTP_URL and SESSION_SECRET that is unset.
 */
export function localConnection(env: Env) {
  return {
    databaseUrl: env.DATABASE_URL ?? clusterUrl(localDatabase(env)),
    feedUrl: env.FEED_URL ?? `http://127.0.0.1:${env.FEED_PORT}`,
    smtpUrl: env.SMTP_URL ?? `smtp://127.0.0.1:${env.SMTP_PORT}`,
    sessionSecret: env.SESSION_SECRET ?? localSecret('session-secret', 48),
  }
}

/** The VAPID keys from the environment, or made once and kept in .data/vapid.json. */
export function localVapid(env: Env): Vapid {
  const fromEnv = vapidFromEnv(env)
  if (fromEnv) return fromEnv
  mkdirSync(dataDir, { recursive: true, mode: 0o755 })
  const file = join(dataDir, 'vapid.json')
  if (!existsSync(file))
    writeFileSync(file, JSON.stringify(generateVapid(env.VAPID_SUBJECT)), { mode: 0o600 })
  return { ...(JSON.parse(readFileSync(file, 'utf8')) as Vapid), subject: env.VAPID_SUBJECT }
}
