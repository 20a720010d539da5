import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres'
import pg from 'pg'
import type { Logger } from '../logger'
import * as schema from './schema/index'

export type Db = NodePgDatabase<typeof schema> & { $client: pg.Pool }

export interface DbOptions {
  /** Connections in the pool. */
  max?: number
  /** Told when PostgreSQL ends an idle connection. */
  log?: Pick<Logger, 'warn'>
}

/**
 * Drizzle over a pool. When PostgreSQL ends an idle connection (a restart, an administrator, a
 * timeout) the pool drops it and opens another on the next query; without the listener below,
 * that connection's error would end the process.
 */
export function createDb(url: string, { max = 10, log }: DbOptions = {}): Db {
  // A connection attempt that hangs (a server going down or coming up) fails after 10 s instead of
  // holding a request and a pool slot for good; keepalive finds a connection a restart cut.
  const pool = new pg.Pool({
    connectionString: url,
    max,
    connectionTimeoutMillis: 10_000,
    keepAlive: true,
  })
  pool.on('error', (err) =>
    log?.warn({ err }, 'an idle database connection was closed; the pool will open another'),
  )
  return drizzle({ client: pool, schema, casing: 'snake_case' })
}
