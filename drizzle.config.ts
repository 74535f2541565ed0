import { defineConfig } from 'drizzle-kit'

// `npm run db:generate` writes SQL migrations from the schema; it needs no database.
export default defineConfig({
  dialect: 'mysql',
  schema: './server/db/schema.ts',
  out: './server/db/migrations',
})
