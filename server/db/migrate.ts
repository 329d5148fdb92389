import { fileURLToPath } from 'node:url'
import { migrate } from 'drizzle-orm/node-postgres/migrator'
import { createDb, createPool } from './client'
import { describeDbError } from './describe-error'

export const MIGRATIONS_DIR = fileURLToPath(new URL('../../drizzle', import.meta.url))

/** Applies every migration in drizzle/ that the database has not seen; a no-op when up to date. */
export async function migrateDatabase(databaseUrl: string): Promise<void> {
  const pool = createPool(databaseUrl, { max: 1, applicationName: 'sonoweave-migrate' })
  try {
    await migrate(createDb(pool), { migrationsFolder: MIGRATIONS_DIR })
  } finally {
    await pool.end()
  }
}

// `npm run db:migrate` (and scripts/start.mjs): one line on failure, no stack.
if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const { loadDatabaseUrl } = await import('../env')
  const url = loadDatabaseUrl()
  try {
    await migrateDatabase(url)
    console.log('db: migrations applied')
  } catch (err) {
    console.error(`db: migration failed: ${describeDbError(err, url)}`)
    process.exit(1)
  }
}
