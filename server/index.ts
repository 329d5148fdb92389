// The HTTP process: configuration, database, app, listener and an orderly shutdown.
import type { Server } from 'node:http'
import { join } from 'node:path'
import { createApp } from './app'
import { createDb, createPool } from './db/client'
import { describeDbError } from './db/describe-error'
import { loadEnv, REPO_ROOT } from './env'
import { createLogger } from './logger'
import { configureMailer, stopMailer } from './modules/mail/mailer'
import { settleAfterResponse } from './modules/auth/after-response'
import type { QueueCheck } from './modules/health/health.service'
import type { Router } from 'express'
import { notifyOnFinish } from './jobs/handlers/run-finished'
import { startJobService } from './jobs/job-service'
import { queueRoutes } from './modules/queue/queue.routes'
import { RunEventRelay } from './modules/runs/run-event-relay'
import { runsRoutes } from './modules/runs/runs.routes'
import { tracesRoutes } from './modules/traces/traces.routes'
import { fitsRoutes } from './modules/fits/fits.routes'
import { startSweeps } from './modules/sweeps'
import { waveguidesRoutes } from './modules/waveguides/waveguides.routes'
import { startQueueSampler } from './modules/queue/queue-history'

const config = loadEnv()
const log = createLogger(config.logLevel)
const pool = createPool(config.databaseUrl)
const db = createDb(pool)

function fail(line: string): never {
  console.error(`sonoweave: ${line}`)
  process.exit(1)
}

try {
  await pool.query('select 1')
} catch (err) {
  fail(describeDbError(err, config.databaseUrl))
}

// ---- job service (pg-boss + embedded worker): built by the jobs issue --------------------------
// pg-boss and the watchdog always run here (the API enqueues, cancels and re-queues lost runs); the
// embedded worker runs config.workerCount solver threads when config.embeddedWorker is true. SIGTERM
// stops taking jobs (runs in hand go back to the queue) before the HTTP server and the pool close.
const jobs = await startJobService({
  databaseUrl: config.databaseUrl,
  pool,
  log,
  threads: config.embeddedWorker ? config.workerCount : 0,
  onFinished: notifyOnFinish({ db, log }),
}).catch((err) => fail(`could not start the job queue: ${(err as Error).message}`))
const relay = new RunEventRelay(pool, log)
const queueCheck: QueueCheck | undefined = jobs.queueCheck
const stoppers: Array<() => Promise<void>> = [jobs.stop, async () => relay.close()]
const jobRoutes: Array<[string, Router]> = [
  ['/runs', runsRoutes({ db, pool, log, boss: jobs.boss, relay, quotas: config.quotas })],
  ['/queue', queueRoutes({ pool })],
  ['/traces', tracesRoutes({ db })],
  ['/fits', fitsRoutes({ db, pool, boss: jobs.boss })],
]
// -------------------------------------------------------------------------------------------------

// Parameter sweeps: their routes and the feeder that hands sweep points to the queue (modules/sweeps).
const sweeps = await startSweeps({ db, pool, log, boss: jobs.boss, quotas: config.quotas })
jobRoutes.push(['/sweeps', sweeps.routes])
stoppers.unshift(sweeps.stop)

// The admin page's chart: queue depth and busy solver threads sampled every 30 s (modules/queue/queue-history.ts).
stoppers.push(startQueueSampler(pool, log))

// A group's own waveguides (the presets live in shared/ and need no route).
jobRoutes.push(['/waveguides', waveguidesRoutes({ db })])

// Mail: SMTP_URL, or the in-process catcher (listed at /api/admin/held-mail) when it is unset.
await configureMailer({ smtpUrl: config.smtpUrl, log })
// Mail that requests started after answering (modules/auth/after-response.ts) is sent before the mailer stops.
stoppers.push(settleAfterResponse, stopMailer)

const auth = { jwtSecret: config.jwtSecret, appUrl: config.publicUrl }
const app = createApp({ db, pool, log, queueCheck, routes: jobRoutes, auth, distDir: join(REPO_ROOT, 'dist') })

const server: Server = app.listen(config.port, config.host)
server.on('error', (err: NodeJS.ErrnoException) => {
  if (err.code === 'EADDRINUSE') fail(`port ${config.port} on ${config.host} is already in use; stop the other program or set PORT to a free port (e.g. PORT=${config.port + 1} npm start)`)
  if (err.code === 'EADDRNOTAVAIL') fail(`HOST=${config.host} is not an address of this machine; set HOST to 127.0.0.1 or 0.0.0.0`)
  if (err.code === 'EACCES') fail(`no permission to listen on port ${config.port}; set PORT to a number above 1023`)
  fail(`could not listen on ${config.host}:${config.port}: ${err.message}`)
})
server.on('listening', () => {
  log.info({ host: config.host, port: config.port }, 'listening')
  console.log(`Sonoweave is running at http://${config.host === '0.0.0.0' ? '127.0.0.1' : config.host}:${config.port}/`)
})

let shuttingDown = false
async function shutdown(signal: string): Promise<void> {
  if (shuttingDown) return
  shuttingDown = true
  log.info({ signal }, 'shutting down')
  // A stuck connection must not keep the process alive forever.
  const force = setTimeout(() => process.exit(1), 10_000)
  force.unref()
  for (const stop of stoppers) await stop().catch((err) => log.error({ err }, 'stopping a service failed'))
  const closed = new Promise<void>((resolve) => server.close(() => resolve()))
  // Open streams (server-sent events) would hold close() open; give them a moment, then cut them.
  setTimeout(() => server.closeAllConnections(), 2_000).unref()
  await closed
  await pool.end()
  process.exit(0)
}
process.on('SIGTERM', () => void shutdown('SIGTERM'))
process.on('SIGINT', () => void shutdown('SIGINT'))
