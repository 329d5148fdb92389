// The worker's writes to a run. Every write names the attempt it belongs to and only lands while the run
// row is still `running` with that attempt, so a cancelled run, or a run the watchdog handed to another
// worker, can no longer be changed by the worker that lost it.
import type { Pool, PoolClient } from 'pg'
import type { FiguresOfMerit } from '@shared/physics/simulation-result'
import type { RunManifest } from '../../solver/index'
import { appendRunEvent, type Queryable } from '../modules/runs/run-events.repo'

export async function inTransaction<T>(pool: Pool, work: (c: PoolClient) => Promise<T>): Promise<T> {
  const client = await pool.connect()
  try {
    await client.query('begin')
    const out = await work(client)
    await client.query('commit')
    return out
  } catch (err) {
    await client.query('rollback').catch(() => {})
    throw err
  } finally {
    client.release()
  }
}

export type Claim =
  | { ok: true; attempt: number; config: unknown; groupId: string; authorId: string | null; title: string }
  | { ok: false; reason: 'missing' | 'not-queued'; status?: string }

/** Takes a queued run for this worker: running, attempt + 1, fresh heartbeat. */
export async function claimRun(pool: Pool, runId: string, workerId: string, jobId: string): Promise<Claim> {
  return inTransaction(pool, async (c) => {
    const { rows } = await c.query(
      `update runs set status = 'running', attempt = attempt + 1, worker_id = $2, job_id = $3, heartbeat_at = now(),
         started_at = coalesce(started_at, now()), progress = 0, error = null, updated_at = now()
       where id = $1 and status = 'queued'
       returning attempt, config, group_id, author_id, title`,
      [runId, workerId, jobId],
    )
    if (rows.length === 0) {
      const { rows: found } = await c.query(`select status from runs where id = $1`, [runId])
      return found.length === 0 ? { ok: false, reason: 'missing' } : { ok: false, reason: 'not-queued', status: found[0].status }
    }
    const r = rows[0]
    await appendRunEvent(c, runId, r.attempt, 'status', { status: 'running', attempt: r.attempt, error: null })
    return { ok: true, attempt: r.attempt, config: r.config, groupId: r.group_id, authorId: r.author_id, title: r.title }
  })
}

/** Locks the run row if it is still ours; false when it was cancelled or taken over. */
async function lockIfOurs(c: Queryable, runId: string, attempt: number): Promise<boolean> {
  const { rows } = await c.query(`select 1 from runs where id = $1 and attempt = $2 and status = 'running' for update`, [runId, attempt])
  return rows.length > 0
}

/** Refreshes the heartbeat; false tells the worker to stop (cancelled or taken over). */
export async function heartbeat(pool: Pool, runId: string, attempt: number): Promise<boolean> {
  const { rowCount } = await pool.query(`update runs set heartbeat_at = now() where id = $1 and attempt = $2 and status = 'running'`, [runId, attempt])
  return (rowCount ?? 0) > 0
}

export async function writeProgress(pool: Pool, runId: string, attempt: number, fraction: number): Promise<boolean> {
  return inTransaction(pool, async (c) => {
    const { rowCount } = await c.query(
      `update runs set progress = $3, heartbeat_at = now(), updated_at = now() where id = $1 and attempt = $2 and status = 'running'`,
      [runId, attempt, fraction],
    )
    if (!rowCount) return false
    await appendRunEvent(c, runId, attempt, 'progress', { attempt, fraction })
    return true
  })
}

export interface MapBlock {
  blockIndex: number
  rowStart: number
  rowCount: number
  cols: number
  pumpPowerW: Float32Array
  stokesPowerW: Float32Array
  acousticPhononsPerM: Float32Array
}

export const bytesOf = (a: Float32Array | Float64Array): Buffer => Buffer.from(a.buffer, a.byteOffset, a.byteLength)

export async function writeMapBlock(pool: Pool, runId: string, attempt: number, b: MapBlock): Promise<boolean> {
  return inTransaction(pool, async (c) => {
    if (!(await lockIfOurs(c, runId, attempt))) return false
    await c.query(
      `insert into run_map_blocks (run_id, attempt, block_index, row_start, row_count, cols, pump_power_w, stokes_power_w, acoustic_phonons_per_m)
       values ($1, $2, $3, $4, $5, $6, $7, $8, $9) on conflict do nothing`,
      [runId, attempt, b.blockIndex, b.rowStart, b.rowCount, b.cols, bytesOf(b.pumpPowerW), bytesOf(b.stokesPowerW), bytesOf(b.acousticPhononsPerM)],
    )
    await appendRunEvent(c, runId, attempt, 'block', { attempt, blockIndex: b.blockIndex, rowStart: b.rowStart, rowCount: b.rowCount, cols: b.cols })
    return true
  })
}

export interface FinalResult {
  manifest: RunManifest
  figures: FiguresOfMerit | null
  arrays: Record<string, Float64Array | Float32Array>
}

/**
 * Stores every array and marks the run succeeded in one transaction: readers see all arrays or none.
 * Rows are keyed by (run, attempt, name), so a repeated write of the same attempt changes nothing.
 */
export async function finishSucceeded(pool: Pool, runId: string, attempt: number, r: FinalResult): Promise<boolean> {
  return inTransaction(pool, async (c) => {
    if (!(await lockIfOurs(c, runId, attempt))) return false
    for (const a of r.manifest.arrays) {
      const data = r.arrays[a.name]
      if (!data) throw new Error(`The result has no data for array ${a.name}`)
      await c.query(
        `insert into run_arrays (run_id, attempt, name, dtype, shape, units, description, data) values ($1, $2, $3, $4, $5, $6, $7, $8)
         on conflict do nothing`,
        [runId, attempt, a.name, a.dtype, JSON.stringify(a.shape), a.units, a.description, bytesOf(data)],
      )
    }
    await c.query(
      `update runs set status = 'succeeded', progress = 1, manifest = $3, figures = $4, finished_at = now(), updated_at = now()
       where id = $1 and attempt = $2`,
      [runId, attempt, JSON.stringify(r.manifest), r.figures ? JSON.stringify(r.figures) : null],
    )
    // Blocks of lost attempts are no longer reachable; the finished maps are in run_arrays.
    await c.query(`delete from run_map_blocks where run_id = $1 and attempt <> $2`, [runId, attempt])
    await appendRunEvent(c, runId, attempt, 'status', { status: 'succeeded', attempt, error: null })
    return true
  })
}

/** A run that cannot succeed: bad stored config, solver failure. Not retried. */
export async function finishFailed(pool: Pool, runId: string, attempt: number, message: string): Promise<boolean> {
  return inTransaction(pool, async (c) => {
    if (!(await lockIfOurs(c, runId, attempt))) return false
    await c.query(`update runs set status = 'failed', error = $3, finished_at = now(), updated_at = now() where id = $1 and attempt = $2`, [runId, attempt, message])
    await appendRunEvent(c, runId, attempt, 'status', { status: 'failed', attempt, error: message })
    return true
  })
}

