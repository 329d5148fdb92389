import { afterAll } from 'vitest'
import { createApp, type AppDeps } from '../../server/app'
import { createDb, createPool, type Db, type Pool } from '../../server/db/client'
import { createLogger } from '../../server/logger'

/** The migrated throwaway database of this test run (see tests/setup/global-db.ts). */
export function testDatabaseUrl(): string {
  const url = process.env.TEST_DATABASE_URL
  if (!url) throw new Error('TEST_DATABASE_URL is not set: run through `npm test` or vitest with tests/setup/global-db.ts')
  return url
}

export const silentLog = createLogger('silent')

/** A pool on the test database, closed after the file's tests. */
export function useTestDb(): { pool: Pool; db: Db } {
  const pool = createPool(testDatabaseUrl(), { max: 4, applicationName: 'sonoweave-test' })
  afterAll(() => pool.end())
  return { pool, db: createDb(pool) }
}

/** createApp on the test database with a silent logger; override any dependency. */
export function testApp(overrides: Partial<AppDeps> = {}) {
  const { pool, db } = useTestDb()
  return createApp({ pool, db, log: silentLog, ...overrides })
}
