// The job service as one unit for a process: pg-boss, the queues' declaration (queues.ts), an optional worker
// (runs and fits) and the watchdog. server/index.ts embeds it (one worker thread by default), worker-main.ts runs it alone.
import type PgBoss from 'pg-boss'
import type { Pool } from 'pg'
import type { Logger } from '../logger'
import { createBoss, declareQueues, RUN_QUEUE } from './queues'
import type { RunOutcome } from './run-executor'
import { startWatchdog, type WatchdogOptions } from './watchdog'
import { startWorker, type RunWorker } from './worker'
import { startFitWorker, type FitWorker } from './handlers/fit'

export interface JobServiceOptions {
  databaseUrl: string
  pool: Pool
  log: Logger
  /** Solver threads of this process's worker; 0 runs no worker (the API still enqueues and cancels). */
  threads: number
  bossSchema?: string
  watchdog?: Pick<WatchdogOptions, 'staleAfterMs' | 'intervalMs' | 'workerExpireAfterMs'> | false
  onFinished?: (outcome: RunOutcome) => void
  applicationName?: string
}

export interface JobService {
  boss: PgBoss
  worker: RunWorker | null
  fitWorker: FitWorker | null
  /** For /api/health: pg-boss answers and the run queue exists. */
  queueCheck: () => Promise<boolean>
  stop: () => Promise<void>
}

export async function startJobService(o: JobServiceOptions): Promise<JobService> {
  const boss = createBoss({ databaseUrl: o.databaseUrl, schema: o.bossSchema, applicationName: o.applicationName })
  // pg-boss reports database trouble as events; without a listener they would crash the process.
  // Logged without the error's attached connection object, which would fill the log on a database restart.
  boss.on('error', (err: Error & { code?: string }) => o.log.error({ err: { message: err.message, code: err.code } }, 'queue error'))
  await boss.start()
  await declareQueues(boss)
  const worker = o.threads > 0 ? await startWorker({ boss, pool: o.pool, log: o.log, threads: o.threads, onFinished: o.onFinished }) : null
  // Fits of measured traces share the process's worker (their own queue, one fit at a time).
  const fitWorker = o.threads > 0 ? await startFitWorker({ boss, pool: o.pool, log: o.log }) : null
  const watchdog = o.watchdog === false ? null : startWatchdog({ pool: o.pool, boss, log: o.log, ...o.watchdog })
  let stopped = false
  return {
    boss,
    worker,
    fitWorker,
    queueCheck: async () => (await boss.getQueue(RUN_QUEUE)) !== null,
    async stop() {
      if (stopped) return
      stopped = true
      watchdog?.stop()
      await worker?.stop()
      await fitWorker?.stop()
      await boss.stop({ graceful: true, timeout: 5_000, wait: true })
    },
  }
}
