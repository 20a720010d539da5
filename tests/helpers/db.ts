import { randomBytes } from 'node:crypto'
import pg from 'pg'
import { inject } from 'vitest'
import { createDb, type Db } from '../../server/db/index'

/** A fresh, migrated database copied from the run's template; dropped by `drop()`. */
export async function createTestDb(): Promise<{ db: Db; url: string; drop: () => Promise<void> }> {
  const templateUrl = new URL(inject('pgTemplateUrl'))
  const template = templateUrl.pathname.slice(1)
  const name = `t_${randomBytes(6).toString('hex')}`
  const admin = new pg.Client({ connectionString: new URL('/postgres', templateUrl).href })
  await admin.connect()
  await admin.query(`CREATE DATABASE "${name}" TEMPLATE "${template}"`)
  await admin.end()
  const url = new URL(`/${name}`, templateUrl).href
  const db = createDb(url, { max: 5 })
  return {
    db,
    url,
    drop: async () => {
      await db.$client.end()
      const c = new pg.Client({ connectionString: new URL('/postgres', templateUrl).href })
      await c.connect()
      await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`)
      await c.end()
    },
  }
}
