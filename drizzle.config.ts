import { defineConfig } from 'drizzle-kit'

// `npx drizzle-kit generate` only diffs the schema against drizzle/meta and needs no database;
// the URL matters for drizzle-kit's own migrate/studio commands.
export default defineConfig({
  dialect: 'postgresql',
  schema: './server/db/schema/index.ts',
  out: './drizzle',
  dbCredentials: {
    url: process.env.DATABASE_URL ?? `postgres://postgres@127.0.0.1:${process.env.PGPORT ?? 55433}/sonoweave`,
  },
})
