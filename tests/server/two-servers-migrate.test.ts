import { sql } from 'drizzle-orm'
import { afterAll, describe, expect, it } from 'vitest'
import { createDb } from '../../server/db/index'
import { migrateDb } from '../../server/db/migrate'
import { emptyTestDb } from '../helpers/db'

const empty = emptyTestDb('together')
const url = empty.url

afterAll(async () => {
  await empty.drop()
})

describe('instances starting together', () => {
  it('migrate an empty database at the same moment: one applies the migrations, the others wait', async () => {
    await empty.create()
    // Each instance has its own pool, as separate processes do.
    const instances = [
      createDb(url, { max: 2 }),
      createDb(url, { max: 2 }),
      createDb(url, { max: 2 }),
    ]
    try {
      const outcomes = await Promise.allSettled(instances.map((db) => migrateDb(db)))
      expect(outcomes.map((o) => (o.status === 'rejected' ? String(o.reason) : 'ok'))).toEqual([
        'ok',
        'ok',
        'ok',
      ])
      const applied = await instances[0]!.execute<{ n: number }>(
        sql`select count(*)::int as n from drizzle.__drizzle_migrations`,
      )
      const files = await instances[0]!.execute<{ n: number }>(
        sql`select count(distinct hash)::int as n from drizzle.__drizzle_migrations`,
      )
      expect(applied.rows[0]!.n).toBe(files.rows[0]!.n)
    } finally {
      await Promise.all(instances.map((db) => db.$client.end()))
    }
  })
})
