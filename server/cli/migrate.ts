import { createDb } from '../db/index'
import { migrateDb } from '../db/migrate'
import { loadEnv } from '../env'

/** `npm run db:migrate`: apply drizzle/ to DATABASE_URL (npm start does this itself). */
const env = loadEnv()
if (!env.DATABASE_URL) throw new Error('Set DATABASE_URL to the database to migrate.')
const db = createDb(env.DATABASE_URL)
await migrateDb(db)
await db.$client.end()
console.log('Migrations applied.')
