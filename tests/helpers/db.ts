import { randomBytes } from 'node:crypto'
import pg from 'pg'
import { inject } from 'vitest'
import { createDb, type Db } from '../../server/db/index'

/** One statement (create or drop a database) on the test server's `postgres` database. */
async function onServer(statement: string) {
  const client = new pg.Client({
    connectionString: new URL('/postgres', inject('pgTemplateUrl')).href,
  })
  await client.connect()
  await client.query(statement)
  await client.end()
}

/** A fresh, migrated database copied from the run's template; dropped by `drop()`. */
export async function createTestDb(): Promise<{ db: Db; url: string; drop: () => Promise<void> }> {
  const templateUrl = new URL(inject('pgTemplateUrl'))
  const template = templateUrl.pathname.slice(1)
  const name = `t_${randomBytes(6).toString('hex')}`
  await onServer(`CREATE DATABASE "${name}" TEMPLATE "${template}"`)
  const url = new URL(`/${name}`, templateUrl).href
  const db = createDb(url, { max: 5 })
  return {
    db,
    url,
    drop: async () => {
      await db.$client.end()
      await onServer(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`)
    },
  }
}

/** The address of an empty database (no tables, no migrations) that a test creates and drops itself. */
export function emptyTestDb(prefix: string) {
  const name = `${prefix}_${process.pid}`
  return {
    url: new URL(`/${name}`, inject('pgTemplateUrl')).href,
    create: () => onServer(`CREATE DATABASE "${name}" TEMPLATE template0`),
    drop: () => onServer(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`),
  }
}
