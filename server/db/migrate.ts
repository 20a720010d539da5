import { fileURLToPath } from 'node:url'
import { sql } from 'drizzle-orm'
import { drizzle } from 'drizzle-orm/node-postgres'
import { migrate } from 'drizzle-orm/node-postgres/migrator'
import type { Db } from './index'

export const migrationsFolder = fileURLToPath(new URL('../../drizzle', import.meta.url))

/** The advisory lock key every instance migrates under. */
const MIGRATE_LOCK = 'chopline:migrate'

/**
 * Applies drizzle/ on one session holding an advisory lock, so instances that start together take
 * turns: the first applies what is new, the others then find nothing left to do. (Without it, each
 * found the migrations table missing and all but one failed to create it.)
 */
export async function migrateDb(db: Db): Promise<void> {
  const client = await db.$client.connect()
  const session = drizzle({ client, casing: 'snake_case' })
  let broken: Error | undefined
  try {
    await session.execute(sql`select pg_advisory_lock(hashtext(${MIGRATE_LOCK}))`)
    try {
      await migrate(session, { migrationsFolder })
    } finally {
      await session.execute(sql`select pg_advisory_unlock(hashtext(${MIGRATE_LOCK}))`)
    }
  } catch (err) {
    broken = err instanceof Error ? err : new Error(String(err))
    throw err
  } finally {
    client.release(broken)
  }
}
