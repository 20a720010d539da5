import { defineConfig } from 'drizzle-kit'

// Only `drizzle-kit generate` reads this file; it diffs the schema against drizzle/ and needs no database.
export default defineConfig({
  dialect: 'postgresql',
  schema: './server/db/schema/index.ts',
  out: './drizzle',
  casing: 'snake_case',
  strict: true,
  dbCredentials: { url: process.env.DATABASE_URL ?? 'postgres://localhost/chopline' },
})
