// Finds runs and fits whose worker stopped sending heartbeats (killed, frozen, cut off) and hands them back to
// their queue (fits: modules/fits/fit-release.ts), and removes the workers-table rows of workers that stopped refreshing them (a killed worker
// cannot delete its own row, which would otherwise stay, marked busy, for good). pg-boss 10 would only notice at expireIn (24 h here, so long runs are never cut off); this brings
// a SIGKILLed worker's run back within about STALE_AFTER_MS + INTERVAL_MS. Any process may run it: an
// advisory lock lets one sweep at a time.
import type PgBoss from 'pg-boss'
import type { Pool } from 'pg'
import type { Logger } from '../logger'
import { sweepStaleFits } from '../modules/fits/fit-release'
import { releaseRun } from './requeue'

export const WATCHDOG_DEFAULTS = {
  /** Ten missed heartbeats (HEARTBEAT_MS = 3 s for runs and fits): a busy database does not trigger it. */
  staleAfterMs: 30_000,
  intervalMs: 10_000,
  /** Twelve missed presence updates (worker.ts refreshes its row every 10 s); past the queue view's minute. */
  workerExpireAfterMs: 120_000,
}

/** pg_try_advisory_xact_lock key: "sonoweave watchdog". */
const LOCK_KEY = 0x536f6e6f

export interface WatchdogOptions {
  pool: Pool
  boss: PgBoss
  log: Logger
  staleAfterMs?: number
  intervalMs?: number
  workerExpireAfterMs?: number
}

/** Deletes the rows of workers not seen for workerExpireAfterMs; returns their ids. A live worker that was
 * only cut off from the database puts its row back with its next presence update. */
export async function expireStaleWorkers(pool: Pool, workerExpireAfterMs = WATCHDOG_DEFAULTS.workerExpireAfterMs): Promise<string[]> {
  const { rows } = await pool.query(`delete from workers where last_seen_at < now() - make_interval(secs => $1) returning id`, [workerExpireAfterMs / 1000])
  return rows.map((r) => r.id)
}

/** One sweep; returns the run ids handed back. */
export async function sweepStaleRuns(o: WatchdogOptions): Promise<string[]> {
  const staleAfterMs = o.staleAfterMs ?? WATCHDOG_DEFAULTS.staleAfterMs
  const client = await o.pool.connect()
  let stale: { id: string; attempt: number; job_id: string | null }[]
  try {
    await client.query('begin')
    const { rows: lock } = await client.query(`select pg_try_advisory_xact_lock($1) as got`, [LOCK_KEY])
    if (!lock[0].got) {
      await client.query('rollback')
      return []
    }
    const found = await client.query(
      `select id, attempt, job_id from runs where status = 'running' and heartbeat_at < now() - make_interval(secs => $1) order by heartbeat_at limit 50`,
      [staleAfterMs / 1000],
    )
    stale = found.rows
    await client.query('commit')
  } catch (err) {
    await client.query('rollback').catch(() => {})
    throw err
  } finally {
    client.release()
  }
  const released: string[] = []
  for (const r of stale) {
    const outcome = await releaseRun(o.pool, o.boss, r.id, r.attempt, r.job_id, 'The worker running this run stopped responding')
    if (outcome === 'requeued' || outcome === 'failed') {
      o.log.warn({ runId: r.id, attempt: r.attempt, outcome }, 'stale run handed back')
      released.push(r.id)
    }
  }
  return released
}

export function startWatchdog(o: WatchdogOptions): { stop: () => void } {
  let running = false
  const timer = setInterval(() => {
    if (running) return
    running = true
    sweepStaleRuns(o)
      .then(() => sweepStaleFits({ pool: o.pool, boss: o.boss, staleAfterMs: o.staleAfterMs ?? WATCHDOG_DEFAULTS.staleAfterMs }))
      .then((fits) => fits.forEach((f) => o.log.warn(f, 'stale fit handed back')))
      .then(() => expireStaleWorkers(o.pool, o.workerExpireAfterMs))
      .then((gone) => gone.length > 0 && o.log.warn({ workers: gone }, 'workers that stopped reporting removed'))
      .catch((err) => o.log.warn({ err }, 'watchdog sweep failed'))
      .finally(() => (running = false))
  }, o.intervalMs ?? WATCHDOG_DEFAULTS.intervalMs)
  timer.unref()
  return { stop: () => clearInterval(timer) }
}
