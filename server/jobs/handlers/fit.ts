// The fit queue's worker: takes a fit, loads its trace and run, runs the whole fit in a worker thread
// (fit-thread.ts) and writes throttled progress and the result to the fit row. Bad input ends the fit
// as failed (it would fail again). While the thread runs, a heartbeat every HEARTBEAT_MS tells the
// watchdog the worker is alive; a heartbeat that finds the fit deleted or handed back stops the thread at
// once. A lost worker's fit is handed back by the watchdog (modules/fits/fit-release.ts).
import { Worker } from 'node:worker_threads'
import type PgBoss from 'pg-boss'
import type { Pool } from 'pg'
import { FitJobPayload } from '@shared/api/fits'
import { createDb } from '../../db/client'
import type { Logger } from '../../logger'
import { fitInputs } from '../../modules/fits/fit-data'
import { releaseFit } from '../../modules/fits/fit-release'
import { beatFit, claimFit, failFitAttempt, finishFit, writeFitProgress } from '../../modules/fits/fit-store'
import type { FitThreadMessage } from '../../modules/fits/fit-thread'
import { findFit } from '../../modules/fits/fits.repo'
import { findRun } from '../../modules/runs/runs.repo'
import { findTraceMeta } from '../../modules/traces/traces.repo'
import { FIT_QUEUE, POLL_INTERVAL_S } from '../queues'
import { HEARTBEAT_MS, PROGRESS_INTERVAL_MS } from '../run-executor'

const THREAD_FILE = new URL('../../modules/fits/fit-thread.ts', import.meta.url)
// The thread registers tsx itself, so it loads the same way under `node --import tsx`, the worker
// process and vitest (whose workers do not pass --import on to new threads).
const BOOTSTRAP = `import(${JSON.stringify(import.meta.resolve('tsx/esm/api'))}).then((m) => { m.register(); return import(${JSON.stringify(THREAD_FILE.href)}) })`

interface FitInHand {
  fitId: string
  attempt: number
  jobId: string
  thread: Worker
  /** Why the thread was stopped from outside, if it was. */
  stopped: 'gone' | 'shutdown' | null
}

export interface FitWorker {
  /** Ids of the fits whose thread is alive now. */
  running: () => string[]
  stop: () => Promise<void>
}

export async function startFitWorker(o: { boss: PgBoss; pool: Pool; log: Logger; heartbeatMs?: number }): Promise<FitWorker> {
  const db = createDb(o.pool)
  const log = o.log.child({ queue: FIT_QUEUE })
  const inHand = new Map<string, FitInHand>()

  async function runThread(fit: FitInHand): Promise<FitThreadMessage | null> {
    let last = 0
    let writing: Promise<unknown> = Promise.resolve()
    const outcome = await new Promise<FitThreadMessage | null>((resolve, reject) => {
      fit.thread.on('message', (m: FitThreadMessage) => {
        if (m.type !== 'progress') return resolve(m)
        if (Date.now() - last < PROGRESS_INTERVAL_MS) return
        last = Date.now()
        writing = writing.then(() => writeFitProgress(o.pool, fit.fitId, fit.attempt, m.fraction, m.message)).catch(() => {})
      })
      fit.thread.on('error', reject)
      fit.thread.on('exit', () => resolve(null))
    })
    await writing
    return outcome
  }

  const handler = async ([job]: PgBoss.Job<unknown>[]) => {
    const payload = FitJobPayload.safeParse(job.data)
    if (!payload.success) return void log.error({ jobId: job.id }, 'unreadable fit job dropped')
    const { fitId } = payload.data
    const attempt = await claimFit(o.pool, fitId, job.id)
    if (attempt === null) return // deleted, or already finished
    const row = await findFit(db, fitId)
    if (!row) return
    const [trace, run] = await Promise.all([findTraceMeta(db, row.traceId), findRun(db, row.runId)])
    if (!trace || !run) return void (await failFitAttempt(o.pool, fitId, attempt, 'The trace or the run was deleted'))
    let inputs
    try {
      inputs = await fitInputs(db, row.inputs, trace, run)
    } catch (err) {
      return void (await failFitAttempt(o.pool, fitId, attempt, (err as Error).message))
    }

    const fit: FitInHand = { fitId, attempt, jobId: job.id, thread: new Worker(BOOTSTRAP, { eval: true, workerData: { inputs, abortFlag: new SharedArrayBuffer(4) } }), stopped: null }
    inHand.set(fitId, fit)
    const beat = setInterval(() => {
      beatFit(o.pool, fitId, attempt)
        .then((ours) => {
          if (ours || fit.stopped) return
          fit.stopped = 'gone'
          void fit.thread.terminate()
        })
        // A database that does not answer is not a reason to stop: the watchdog judges by the heartbeats it sees.
        .catch(() => {})
    }, o.heartbeatMs ?? HEARTBEAT_MS)
    try {
      const outcome = await runThread(fit)
      if (fit.stopped) return void log.info({ fitId, attempt, why: fit.stopped }, 'fit thread stopped')
      if (!outcome) throw new Error('The fit thread stopped without an answer')
      if (outcome.type === 'error') return void (await failFitAttempt(o.pool, fitId, attempt, outcome.message))
      if (outcome.type === 'result') await finishFit(o.pool, fitId, attempt, outcome.result)
    } catch (err) {
      log.error({ err, fitId }, 'fit thread failed')
      await failFitAttempt(o.pool, fitId, attempt, `The fit stopped unexpectedly: ${(err as Error).message}`)
    } finally {
      clearInterval(beat)
      await fit.thread.terminate()
      inHand.delete(fitId)
    }
  }
  await o.boss.work(FIT_QUEUE, { pollingIntervalSeconds: POLL_INTERVAL_S, batchSize: 1 }, handler)
  log.info('fit worker started')
  return {
    running: () => [...inHand.keys()],
    async stop() {
      await o.boss.offWork(FIT_QUEUE)
      // Fits in hand go back to the queue at once rather than waiting for the watchdog.
      const fits = [...inHand.values()]
      for (const f of fits) {
        f.stopped = 'shutdown'
        await f.thread.terminate()
      }
      for (const f of fits) {
        await releaseFit(o.pool, o.boss, f.fitId, f.attempt, f.jobId, 'The worker was shut down').catch((err) => log.warn({ err, fitId: f.fitId }, 'could not hand a fit back'))
      }
    },
  }
}
