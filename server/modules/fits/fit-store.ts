// The fit worker's writes to a fit row, each keyed by (id, attempt) and made only while the fit is running
// under that attempt: a fit that was deleted, or handed back to the queue while its old worker still ran,
// takes no write from that worker, so nothing is stored half-way.
import type { Pool } from 'pg'
import type { FitResult } from '@shared/api/fits'

/** Takes the fit for a new attempt (a retry may take a fit whose previous worker was lost); null when it is gone or finished. */
export async function claimFit(pool: Pool, fitId: string, jobId: string): Promise<number | null> {
  const { rows } = await pool.query(
    `update fits set status = 'running', attempt = attempt + 1, job_id = $2, started_at = now(), heartbeat_at = now(), progress = 0, message = 'Starting'
     where id = $1 and status in ('queued', 'running') returning attempt`,
    [fitId, jobId],
  )
  return rows.length ? (rows[0].attempt as number) : null
}

/** The heartbeat; false when the fit is no longer this attempt's to run (deleted or handed back). */
export async function beatFit(pool: Pool, fitId: string, attempt: number): Promise<boolean> {
  const { rowCount } = await pool.query(`update fits set heartbeat_at = now() where id = $1 and attempt = $2 and status = 'running'`, [fitId, attempt])
  return rowCount === 1
}

export async function writeFitProgress(pool: Pool, fitId: string, attempt: number, fraction: number, message: string): Promise<void> {
  await pool.query(`update fits set progress = $3, message = $4 where id = $1 and attempt = $2 and status = 'running'`, [fitId, attempt, fraction, message])
}

export async function finishFit(pool: Pool, fitId: string, attempt: number, result: FitResult): Promise<void> {
  const evaluations = result.models.reduce((s, m) => s + m.evaluations, 0)
  await pool.query(
    `update fits set status = 'succeeded', progress = 1, result = $3, message = $4, finished_at = now(), heartbeat_at = null
     where id = $1 and attempt = $2 and status = 'running'`,
    [fitId, attempt, JSON.stringify(result), `Done after ${evaluations} model evaluations`],
  )
}

export async function failFitAttempt(pool: Pool, fitId: string, attempt: number, error: string): Promise<void> {
  await pool.query(`update fits set status = 'failed', error = $3, finished_at = now(), heartbeat_at = null where id = $1 and attempt = $2 and status = 'running'`, [fitId, attempt, error])
}
