import { afterAll } from 'vitest'
import { createApp, type AppDeps } from '../../server/app'
import { createDb, createPool, type Db, type Pool } from '../../server/db/client'
import { createLogger } from '../../server/logger'
import { createFileDatabase, dropDatabaseAt } from '../setup/file-database'

// Module state is per test file (vitest isolates files), so this is the file's own database once made.
let fileDatabaseUrl: string | null = null

/** This file's database when useTestDb made one, else the run's shared throwaway one (tests/setup/global-db.ts). */
export function testDatabaseUrl(): string {
  if (fileDatabaseUrl) return fileDatabaseUrl
  const url = process.env.TEST_DATABASE_URL
  if (!url) throw new Error('TEST_DATABASE_URL is not set: run through `npm test` or vitest with tests/setup/global-db.ts')
  return url
}

export const silentLog = createLogger('silent')

/**
 * A pool on a database of this file's own (cloned from the migrated template), dropped after the file's tests.
 * Call it first in a file: its after-hook then runs last, once queues and workers have stopped.
 */
export function useTestDb(): { pool: Pool; db: Db } {
  if (!fileDatabaseUrl) {
    const url = createFileDatabase()
    fileDatabaseUrl = url
    afterAll(() => dropDatabaseAt(url))
  }
  const pool = createPool(fileDatabaseUrl, { max: 4, applicationName: 'sonoweave-test' })
  afterAll(() => pool.end())
  return { pool, db: createDb(pool) }
}

/** createApp on the test database with a silent logger; override any dependency. */
export function testApp(overrides: Partial<AppDeps> = {}) {
  const { pool, db } = useTestDb()
  return createApp({ pool, db, log: silentLog, ...overrides })
}
