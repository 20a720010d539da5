import { fileURLToPath } from 'node:url'
import { migrate } from 'drizzle-orm/node-postgres/migrator'
import type { Db } from './index'

export const migrationsFolder = fileURLToPath(new URL('../../drizzle', import.meta.url))

export async function migrateDb(db: Db): Promise<void> {
  await migrate(db, { migrationsFolder })
}
