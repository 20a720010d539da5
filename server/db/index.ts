import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres'
import pg from 'pg'
import * as schema from './schema/index'

export type Db = NodePgDatabase<typeof schema> & { $client: pg.Pool }

export function createDb(url: string, max = 10): Db {
  const pool = new pg.Pool({ connectionString: url, max })
  return drizzle({ client: pool, schema, casing: 'snake_case' })
}
