import type { Pool } from 'pg'
import type { WorkerActivity } from '@shared/api/queue'
import type { QueueStatus } from '@shared/api/runs'

/** Workers count as present when seen within this time (they report every 10 s). */
export const WORKER_SEEN_WITHIN_S = 60
/** Mean wait is taken over runs started within this time. */
export const MEAN_WAIT_OVER_S = 3600

export async function queueStatus(pool: Pool): Promise<QueueStatus> {
  const [counts, workers, wait] = await Promise.all([
    pool.query(`select count(*) filter (where status = 'queued') as queued, count(*) filter (where status = 'running') as running from runs where status in ('queued', 'running')`),
    pool.query(`select id, host, pid, threads, busy, started_at, last_seen_at from workers where last_seen_at > now() - make_interval(secs => $1) order by started_at`, [WORKER_SEEN_WITHIN_S]),
    pool.query(`select avg(extract(epoch from started_at - created_at)) as mean from runs where started_at > now() - make_interval(secs => $1)`, [MEAN_WAIT_OVER_S]),
  ])
  return {
    queued: Number(counts.rows[0].queued),
    running: Number(counts.rows[0].running),
    workers: workers.rows.map((w) => ({ id: w.id, host: w.host, pid: w.pid, threads: w.threads, busy: w.busy, startedAt: w.started_at.toISOString(), lastSeenAt: w.last_seen_at.toISOString() })),
    meanWaitS: wait.rows[0].mean === null ? null : Math.max(0, Number(wait.rows[0].mean)),
  }
}

/** Workers seen in the last minute, each with the runs it has finished (succeeded or failed). */
export async function workerActivity(pool: Pool): Promise<WorkerActivity[]> {
  const { rows } = await pool.query(
    `select w.id, w.host, w.pid, w.threads, w.busy, w.started_at, w.last_seen_at,
       (select count(*) from runs r where r.worker_id = w.id and r.status in ('succeeded', 'failed'))::int as runs_finished
     from workers w where w.last_seen_at > now() - make_interval(secs => $1) order by w.started_at`,
    [WORKER_SEEN_WITHIN_S],
  )
  return rows.map((w) => ({
    id: w.id,
    host: w.host,
    pid: w.pid,
    threads: w.threads,
    busy: w.busy,
    startedAt: w.started_at.toISOString(),
    lastSeenAt: w.last_seen_at.toISOString(),
    runsFinished: w.runs_finished,
  }))
}
