// Hands a running run back to the queue (its worker was lost or is shutting down), keeping the run row
// and its pg-boss job in step inside one transaction: pg-boss 10 accepts our transaction's client (db).
import type PgBoss from 'pg-boss'
import type { Pool, PoolClient } from 'pg'
import { RUN_JOB_SCHEMA_VERSION, type RunJobPayload } from '@shared/api/runs'
import { appendRunEvent } from '../modules/runs/run-events.repo'
import { singleRunPriority } from './fair-priority'
import { RUN_QUEUE, RUN_QUEUE_OPTIONS, SWEEP_POINT_PRIORITY } from './queues'
import { inTransaction } from './run-store'

export const bossDb = (c: PoolClient): PgBoss.Db => ({ executeSql: (text, values) => c.query(text, values) })

export type ReleaseResult = 'requeued' | 'failed' | 'not-ours' | 'not-running'

export async function releaseRun(pool: Pool, boss: PgBoss, runId: string, attempt: number, jobId: string | null, reason: string): Promise<ReleaseResult> {
  return inTransaction(pool, async (c) => {
    const db = bossDb(c)
    const { rows } = await c.query(`select status, attempt, sweep_id, queue_rank from runs where id = $1 for update`, [runId])
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
    // A single run keeps its place in the fair order (fair-priority.ts): it was at the front when it was taken,
    // so it goes back no later than the front of today's line (ranks start again from 0 when the line empties,
    // so its stored rank alone may be from an older line). The rank is stored again, since the queue position
    // users see is read from it. A retried job (state retry) carries the priority of the rank it was sent with.
    let rank: number | null = null
    if (!rows[0].sweep_id) {
      const front = await c.query(`select min(queue_rank) as front from runs where status = 'queued' and sweep_id is null`)
      rank = Math.min(rows[0].queue_rank, front.rows[0].front ?? rows[0].queue_rank)
    }
    if (state !== 'retry' && state !== 'created') {
      // The job already ended (its handler returned): carry the run on a new one.
      // A sweep point goes back behind single runs, where the feeder had put it.
      const priority = rank === null ? SWEEP_POINT_PRIORITY : singleRunPriority(rank)
      nextJob = await boss.send(RUN_QUEUE, { schemaVersion: RUN_JOB_SCHEMA_VERSION, runId } satisfies RunJobPayload, { db, priority })
      if (!nextJob) throw new Error(`queue ${RUN_QUEUE} does not exist`)
    }
    await c.query(
      `update runs set status = 'queued', worker_id = null, heartbeat_at = null, progress = 0, job_id = $2, error = null, queue_rank = coalesce($3, queue_rank), updated_at = now() where id = $1`,
      [runId, nextJob, rank],
    )
    await appendRunEvent(c, runId, attempt, 'status', { status: 'queued', attempt, error: null })
    return 'requeued'
  })
}
