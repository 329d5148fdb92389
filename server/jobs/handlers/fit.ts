// The fit queue's worker: takes a fit, loads its trace and run, runs the whole fit in a worker thread
// (fit-thread.ts) and writes throttled progress and the result to the fit row. Bad input ends the fit
// as failed (it would fail again); a lost worker leaves the job to pg-boss's retry.
import { Worker } from 'node:worker_threads'
import type PgBoss from 'pg-boss'
import type { Pool } from 'pg'
import { FitJobPayload } from '@shared/fits'
import { createDb } from '../../db/client'
import type { Logger } from '../../logger'
import { fitInputs } from '../../modules/fits/fit-data'
import { declareFitQueue, FIT_QUEUE } from '../../modules/fits/fit-queue'
import type { FitThreadMessage } from '../../modules/fits/fit-thread'
import { failFit, findFit } from '../../modules/fits/fits.repo'
import { findRun } from '../../modules/runs/runs.repo'
import { findTraceMeta } from '../../modules/traces/traces.repo'
import { POLL_INTERVAL_S } from '../queues'

const THREAD_FILE = new URL('../../modules/fits/fit-thread.ts', import.meta.url)
// The thread registers tsx itself, so it loads the same way under `node --import tsx`, the worker
// process and vitest (whose workers do not pass --import on to new threads).
const BOOTSTRAP = `import(${JSON.stringify(import.meta.resolve('tsx/esm/api'))}).then((m) => { m.register(); return import(${JSON.stringify(THREAD_FILE.href)}) })`
/** At most one progress write per this period. */
const PROGRESS_INTERVAL_MS = 1_000

export interface FitWorker {
  stop: () => Promise<void>
}

export async function startFitWorker(o: { boss: PgBoss; pool: Pool; log: Logger }): Promise<FitWorker> {
  const db = createDb(o.pool)
  const log = o.log.child({ queue: FIT_QUEUE })
  const threads = new Set<Worker>()
  await declareFitQueue(o.boss)

  const handler = async ([job]: PgBoss.Job<unknown>[]) => {
    const payload = FitJobPayload.safeParse(job.data)
    if (!payload.success) return void log.error({ jobId: job.id }, 'unreadable fit job dropped')
    const { fitId } = payload.data
    const claimed = await o.pool.query(`update fits set status = 'running', started_at = now(), progress = 0, message = 'Starting' where id = $1 and status in ('queued', 'running') returning id`, [fitId])
    if (claimed.rowCount === 0) return // deleted, or already finished
    const fit = (await findFit(db, fitId))!
    const [trace, run] = await Promise.all([findTraceMeta(db, fit.traceId), findRun(db, fit.runId)])
    if (!trace || !run) return void (await failFit(db, fitId, 'The trace or the run was deleted'))
    let inputs
    try {
      inputs = await fitInputs(db, fit.inputs, trace, run)
    } catch (err) {
      return void (await failFit(db, fitId, (err as Error).message))
    }

    const abortFlag = new SharedArrayBuffer(4)
    const thread = new Worker(BOOTSTRAP, { eval: true, workerData: { inputs, abortFlag } })
    threads.add(thread)
    let last = 0
    let writing: Promise<unknown> = Promise.resolve()
    try {
      const outcome = await new Promise<FitThreadMessage | null>((resolve, reject) => {
        thread.on('message', (m: FitThreadMessage) => {
          if (m.type !== 'progress') return resolve(m)
          if (Date.now() - last < PROGRESS_INTERVAL_MS) return
          last = Date.now()
          writing = writing.then(() => o.pool.query(`update fits set progress = $2, message = $3 where id = $1 and status = 'running'`, [fitId, m.fraction, m.message])).catch(() => {})
        })
        thread.on('error', reject)
        thread.on('exit', () => resolve(null))
      })
      await writing
      if (!outcome) throw new Error('The fit thread stopped without an answer')
      if (outcome.type === 'error') return void (await failFit(db, fitId, outcome.message))
      if (outcome.type === 'result') {
        await o.pool.query(`update fits set status = 'succeeded', progress = 1, result = $2, message = $3, finished_at = now() where id = $1`, [
          fitId,
          JSON.stringify(outcome.result),
          `Done after ${outcome.result.models.reduce((s, m) => s + m.evaluations, 0)} model evaluations`,
        ])
      }
    } catch (err) {
      log.error({ err, fitId }, 'fit thread failed')
      await failFit(db, fitId, `The fit stopped unexpectedly: ${(err as Error).message}`)
    } finally {
      threads.delete(thread)
      void thread.terminate()
    }
  }
  await o.boss.work(FIT_QUEUE, { pollingIntervalSeconds: POLL_INTERVAL_S, batchSize: 1 }, handler)
  log.info('fit worker started')
  return {
    async stop() {
      await o.boss.offWork(FIT_QUEUE)
      for (const t of threads) await t.terminate()
    },
  }
}
