import pg from 'pg'
import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres'
import * as schema from './schema'

export type Db = NodePgDatabase<typeof schema>
export type Pool = pg.Pool

export interface PoolOptions {
  max?: number
  /** Name shown in pg_stat_activity, so a stuck connection can be traced to its process. */
  applicationName?: string
}

export function createPool(databaseUrl: string, opts: PoolOptions = {}): pg.Pool {
  const pool = new pg.Pool({
    connectionString: databaseUrl,
    max: opts.max ?? 10,
    connectionTimeoutMillis: 5_000,
    idleTimeoutMillis: 30_000,
    application_name: opts.applicationName ?? 'sonoweave',
  })
  // An idle client losing its connection (database restart) must not crash the process.
  pool.on('error', () => {})
  return pool
}

export function createDb(pool: pg.Pool): Db {
  return drizzle(pool, { schema })
}

export { schema }
