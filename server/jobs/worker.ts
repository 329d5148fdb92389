// A worker process's job side: takes runs from pg-boss (one work() loop per kept solver thread), listens
// for cancels, reports itself in the workers table, and on stop hands its runs back to the queue.
import { randomUUID } from 'node:crypto'
import { hostname } from 'node:os'
import type PgBoss from 'pg-boss'
import type { Pool } from 'pg'
import type { Logger } from '../logger'
import { RUN_CANCEL_CHANNEL } from '../modules/runs/run-events.repo'
import { POLL_INTERVAL_S, RUN_QUEUE } from './queues'
import { ABORT_GRACE_MS, registerSolverPool, type RunHandle, type RunOutcome } from './run-executor'
import { SolverPool } from './solver-pool'
import { runSimulationHandler } from './handlers/run-simulation'
import { releaseRun } from './requeue'
import { holdListen } from '../db/held-listen'

/** How often the workers row is refreshed (the queue view counts workers seen in the last minute). */
const PRESENCE_MS = 10_000

export interface WorkerOptions {
  boss: PgBoss
  pool: Pool
  log: Logger
  threads: number
  onFinished?: (outcome: RunOutcome) => void
}

export interface RunWorker {
  id: string
  /** Runs being computed now. */
  busy: () => number
  stop: () => Promise<void>
}

export async function startWorker(o: WorkerOptions): Promise<RunWorker> {
  const id = `${hostname()}:${process.pid}:${randomUUID().slice(0, 8)}`
  const log = o.log.child({ workerId: id })
  const active = new Map<string, RunHandle>()
  const jobs = new Map<string, string>()

  const presence = async () =>
    o.pool.query(
      `insert into workers (id, host, pid, threads, busy) values ($1, $2, $3, $4, $5)
       on conflict (id) do update set busy = excluded.busy, last_seen_at = now()`,
      [id, hostname(), process.pid, o.threads, active.size],
    )
  await presence()
  const presenceTimer = setInterval(() => presence().catch((err) => log.warn({ err }, 'presence update failed')), PRESENCE_MS)

  // Cancels reach us by NOTIFY so the solver stops within a second, not at the next heartbeat.
  const cancels = await holdListen({
    pool: o.pool,
    channel: RUN_CANCEL_CHANNEL,
    name: 'listen for cancels',
    log,
    onNotification: (runId) => {
      if (runId) active.get(runId)?.abort('cancelled')
    },
  })

  // Solver threads are started now and kept: each takes one run at a time (the work() loops below never
  // hold more runs than there are threads). Runs are taken only once the threads are loaded, so a
  // starting worker does not hold a run that an already warm one could compute at once.
  const solvers = new SolverPool({ size: o.threads, abortGraceMs: ABORT_GRACE_MS })
  registerSolverPool(id, solvers)
  // A thread that cannot load fails its first run with the reason (and is retried on demand).
  await solvers.warm().catch((err) => log.error({ err }, 'a solver thread did not start'))

  const handler = runSimulationHandler({
    pool: o.pool,
    log,
    workerId: id,
    track: (runId, handle, jobId) => {
      if (handle) {
        active.set(runId, handle)
        jobs.set(runId, jobId)
      } else {
        active.delete(runId)
        jobs.delete(runId)
        presence().catch(() => {})
      }
    },
    onFinished: o.onFinished,
  })
  for (let i = 0; i < o.threads; i++) {
    await o.boss.work(RUN_QUEUE, { pollingIntervalSeconds: POLL_INTERVAL_S, batchSize: 1 }, handler)
  }
  log.info({ threads: o.threads }, 'worker started')

  return {
    id,
    busy: () => active.size,
    async stop() {
      await o.boss.offWork(RUN_QUEUE)
      // Runs in hand go back to the queue at once rather than waiting for the watchdog.
      const inHand = [...active.values()]
      for (const h of inHand) h.abort('shutdown')
      for (const h of inHand) {
        await releaseRun(o.pool, o.boss, h.runId, h.attempt, jobs.get(h.runId) ?? null, 'The worker was shut down').catch((err) =>
          log.warn({ err, runId: h.runId }, 'could not hand a run back'),
        )
      }
      clearInterval(presenceTimer)
      registerSolverPool(id, null)
      await solvers.close()
      await o.pool.query(`delete from workers where id = $1`, [id]).catch(() => {})
      await cancels.stop()
    },
  }
}
