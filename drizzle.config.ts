import { defineConfig } from 'drizzle-kit'

// `npm run db:generate` writes SQL migrations into migrations/ from the schema.
// Generated files are committed and never edited by hand.
export default defineConfig({
  dialect: 'postgresql',
  schema: './server/db/schema/index.ts',
  out: './migrations',
  casing: 'snake_case',
  dbCredentials: { url: process.env.DATABASE_URL ?? 'postgres://pastload@127.0.0.1:54329/pastload' },
})
