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
  // A database restart ends every connection. node-postgres then emits 'error' on each client, and an
  // 'error' event nobody listens to ends the process. The pool listens to its idle clients (and re-emits
  // here); a checked-out client (a transaction, a LISTEN) has no listener unless we give it one. The
  // client's own query promises still reject, so the code using it learns of the loss; the pool drops the
  // broken client when it is released.
  pool.on('error', () => {})
  pool.on('connect', (client) => client.on('error', () => {}))
  return pool
}

export function createDb(pool: pg.Pool): Db {
  return drizzle(pool, { schema })
}

export { schema }
