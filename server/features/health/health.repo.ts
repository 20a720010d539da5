import { sql } from 'drizzle-orm'
import type { Db } from '../../db/index'

export function healthRepo(db: Db) {
  return {
    /** Whether the database answers a query now. */
    databaseUp: () =>
      db.execute(sql`select 1`).then(
        () => true,
        () => false,
      ),
  }
}
export type HealthRepo = ReturnType<typeof healthRepo>
