// Hands a running run back to the queue (its worker was lost or is shutting down), keeping the run row
// and its pg-boss job in step inside one transaction: pg-boss 10 accepts our transaction's client (db).
import type PgBoss from 'pg-boss'
import type { Pool, PoolClient } from 'pg'
import { RUN_JOB_SCHEMA_VERSION, type RunJobPayload } from '@shared/runs'
import { appendRunEvent } from '../modules/runs/run-events.repo'
import { RUN_QUEUE, RUN_QUEUE_OPTIONS, SINGLE_RUN_PRIORITY, SWEEP_POINT_PRIORITY } from './queues'
import { inTransaction } from './run-store'

export const bossDb = (c: PoolClient): PgBoss.Db => ({ executeSql: (text, values) => c.query(text, values) })

export type ReleaseResult = 'requeued' | 'failed' | 'not-ours' | 'not-running'

export async function releaseRun(pool: Pool, boss: PgBoss, runId: string, attempt: number, jobId: string | null, reason: string): Promise<ReleaseResult> {
  return inTransaction(pool, async (c) => {
    const db = bossDb(c)
    const { rows } = await c.query(`select status, attempt, sweep_id from runs where id = $1 for update`, [runId])
    if (rows.length === 0 || rows[0].status !== 'running' || rows[0].attempt !== attempt) return 'not-running'
    const job = jobId ? await boss.getJobById(RUN_QUEUE, jobId, { db, includeArchive: false }) : null
    // A job this pg-boss schema does not hold belongs to another deployment sharing the database.
    if (jobId && !job) return 'not-ours'
    let state = job?.state
    if (state === 'active') {
      await boss.fail(RUN_QUEUE, jobId!, { message: reason }, { db })
      state = (await boss.getJobById(RUN_QUEUE, jobId!, { db, includeArchive: false }))?.state
    }
    if (state === 'failed' || attempt > RUN_QUEUE_OPTIONS.retryLimit) {
      const message = `${reason}; the run was tried ${attempt} times and is given up`
      await c.query(`update runs set status = 'failed', error = $2, finished_at = now(), updated_at = now(), heartbeat_at = null where id = $1`, [runId, message])
      await appendRunEvent(c, runId, attempt, 'status', { status: 'failed', attempt, error: message })
      return 'failed'
    }
    let nextJob = jobId
    if (state !== 'retry' && state !== 'created') {
      // The job already ended (its handler returned): carry the run on a new one.
      // A sweep point goes back behind single runs, where the feeder had put it.
      const priority = rows[0].sweep_id ? SWEEP_POINT_PRIORITY : SINGLE_RUN_PRIORITY
      nextJob = await boss.send(RUN_QUEUE, { schemaVersion: RUN_JOB_SCHEMA_VERSION, runId } satisfies RunJobPayload, { db, priority })
      if (!nextJob) throw new Error(`queue ${RUN_QUEUE} does not exist`)
    }
    await c.query(
      `update runs set status = 'queued', worker_id = null, heartbeat_at = null, progress = 0, job_id = $2, error = null, updated_at = now() where id = $1`,
      [runId, nextJob],
    )
    await appendRunEvent(c, runId, attempt, 'status', { status: 'queued', attempt, error: null })
    return 'requeued'
  })
}
