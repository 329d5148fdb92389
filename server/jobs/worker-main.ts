// `npm run worker [-- --threads N]`: a worker process that joins the queue on DATABASE_URL. Start as many
// as you like, on this or other machines; PostgreSQL and pg-boss share the work out.
//   --threads N            solver threads (default: WORKER_COUNT if set, else one per core)
//   --queue-schema NAME    pg-boss schema (default pgboss; tests use their own)
//   --stale-after-s S      watchdog: a run without a heartbeat for S seconds is handed back (default 30)
//   --watchdog-interval-s S  how often the watchdog looks (default 10)
import { availableParallelism } from 'node:os'
import { parseArgs } from 'node:util'
import { createDb, createPool } from '../db/client'
import { describeDbError } from '../db/describe-error'
import { loadEnv, workerCountGiven } from '../env'
import { createLogger } from '../logger'
import { startJobService } from './job-service'
import { notifyOnFinish } from './handlers/run-finished'
import { WATCHDOG_DEFAULTS } from './watchdog'

function fail(line: string): never {
  console.error(`worker: ${line}`)
  process.exit(1)
}

let args
try {
  args = parseArgs({
    options: {
      threads: { type: 'string' },
      'queue-schema': { type: 'string' },
      'stale-after-s': { type: 'string' },
      'watchdog-interval-s': { type: 'string' },
    },
  }).values
} catch (err) {
  fail((err as Error).message)
}
const positive = (name: string, v: string | undefined, dflt: number): number => {
  if (v === undefined) return dflt
  const n = Number(v)
  if (!Number.isFinite(n) || n <= 0) fail(`--${name} must be a positive number, got ${JSON.stringify(v)}`)
  return n
}
const config = loadEnv()
const threads = Math.floor(positive('threads', args.threads, workerCountGiven() ? config.workerCount : availableParallelism()))
if (threads < 1) fail('a worker needs at least one thread (--threads 1)')
const schema = args['queue-schema']
if (schema !== undefined && !/^[a-z_][a-z0-9_]{0,50}$/.test(schema)) fail('--queue-schema must be a lower-case SQL name')

const log = createLogger(config.logLevel, { role: 'worker' })
// Heartbeats, progress and block writes per thread, plus the cancel listener.
const pool = createPool(config.databaseUrl, { max: 2 + 2 * threads, applicationName: 'sonoweave-worker' })
try {
  await pool.query('select 1')
} catch (err) {
  fail(describeDbError(err, config.databaseUrl))
}

const service = await startJobService({
  databaseUrl: config.databaseUrl,
  pool,
  log,
  threads,
  bossSchema: schema,
  applicationName: 'sonoweave-worker-queue',
  watchdog: {
    staleAfterMs: 1000 * positive('stale-after-s', args['stale-after-s'], WATCHDOG_DEFAULTS.staleAfterMs / 1000),
    intervalMs: 1000 * positive('watchdog-interval-s', args['watchdog-interval-s'], WATCHDOG_DEFAULTS.intervalMs / 1000),
  },
  onFinished: notifyOnFinish({ db: createDb(pool), log }),
}).catch((err) => fail(`could not start the queue: ${(err as Error).message}`))
console.log(`worker: ${service.worker?.id} taking runs with ${threads} thread(s)`)

let shuttingDown = false
async function shutdown(signal: string): Promise<void> {
  if (shuttingDown) return
  shuttingDown = true
  log.info({ signal }, 'worker shutting down')
  setTimeout(() => process.exit(1), 10_000).unref()
  await service.stop().catch((err) => log.error({ err }, 'stopping the queue failed'))
  await pool.end()
  process.exit(0)
}
process.on('SIGTERM', () => void shutdown('SIGTERM'))
process.on('SIGINT', () => void shutdown('SIGINT'))
