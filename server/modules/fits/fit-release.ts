// Fits whose worker stopped sending heartbeats (killed, frozen, cut off) go back to the fit queue, or end
// failed with the reason once the queue's retry limit is spent; the fit row and its pg-boss job change in
// one transaction (pg-boss 10 accepts our transaction's client). The watchdog (server/jobs/watchdog.ts)
// sweeps them; a worker shutting down hands its fits back at once.
import type PgBoss from 'pg-boss'
import type { Pool } from 'pg'
import type { FitJobPayload } from '@shared/api/fits'
import { FIT_QUEUE, FIT_QUEUE_OPTIONS } from '../../jobs/queues'
import { bossDb, type ReleaseResult } from '../../jobs/requeue'
import { inTransaction } from '../../jobs/run-store'

export async function releaseFit(pool: Pool, boss: PgBoss, fitId: string, attempt: number, jobId: string | null, reason: string): Promise<ReleaseResult> {
  return inTransaction(pool, async (c) => {
    const db = bossDb(c)
    const { rows } = await c.query(`select status, attempt from fits where id = $1 for update`, [fitId])
    if (rows.length === 0 || rows[0].status !== 'running' || rows[0].attempt !== attempt) return 'not-running'
    const job = jobId ? await boss.getJobById(FIT_QUEUE, jobId, { db, includeArchive: false }) : null
    // A job this pg-boss schema does not hold belongs to another deployment sharing the database.
    if (jobId && !job) return 'not-ours'
    let state = job?.state
    if (state === 'active') {
      await boss.fail(FIT_QUEUE, jobId!, { message: reason }, { db })
      state = (await boss.getJobById(FIT_QUEUE, jobId!, { db, includeArchive: false }))?.state
    }
    if (state === 'failed' || attempt > FIT_QUEUE_OPTIONS.retryLimit) {
      if (state === 'retry' || state === 'created') await boss.cancel(FIT_QUEUE, jobId!, { db })
      const error = `${reason}; the fit was tried ${attempt} times and is given up. Start it again, or free fewer parameters to make it lighter.`
      await c.query(`update fits set status = 'failed', error = $2, finished_at = now(), heartbeat_at = null where id = $1`, [fitId, error])
      return 'failed'
    }
    let nextJob = jobId
    if (state !== 'retry' && state !== 'created') {
      // The job already ended (its handler returned): carry the fit on a new one.
      nextJob = await boss.send(FIT_QUEUE, { schemaVersion: 1, fitId } satisfies FitJobPayload, { db })
      if (!nextJob) throw new Error(`queue ${FIT_QUEUE} does not exist`)
    }
    await c.query(`update fits set status = 'queued', heartbeat_at = null, progress = 0, job_id = $2, message = $3 where id = $1`, [fitId, nextJob, `${reason}; waiting for another worker`])
    return 'requeued'
  })
}

/** One sweep over fits whose heartbeat is older than staleAfterMs; returns the ids handed back or failed. */
export async function sweepStaleFits(o: { pool: Pool; boss: PgBoss; staleAfterMs: number }): Promise<Array<{ fitId: string; outcome: ReleaseResult }>> {
  const { rows } = await o.pool.query(
    `select id, attempt, job_id from fits where status = 'running' and coalesce(heartbeat_at, started_at) < now() - make_interval(secs => $1)
     order by heartbeat_at nulls first limit 50`,
    [o.staleAfterMs / 1000],
  )
  const done: Array<{ fitId: string; outcome: ReleaseResult }> = []
  for (const r of rows) {
    const outcome = await releaseFit(o.pool, o.boss, r.id, r.attempt, r.job_id, 'The worker running this fit stopped responding')
    if (outcome === 'requeued' || outcome === 'failed') done.push({ fitId: r.id, outcome })
  }
  return done
}
