// The sweep feeder: how sweep points reach the run queue without starving interactive runs or other users.
//
// Why: pg-boss 10 only orders by priority, then age. Sending all N points of a sweep at once would put a
// 256-point sweep ahead of every later sweep (first come, first served for hours), and a single run would
// only get ahead of it by priority. So points are not sent when the sweep is made. Each point's run row is
// stored `queued` with no job (job_id null) and the feeder hands points to pg-boss a few at a time:
//
// 1. Priority. Single runs are sent by the runs API at once with pg-boss's default priority 0; fed sweep
//    points carry SWEEP_POINT_PRIORITY (< 0), and pg-boss fetches `priority desc, created_on`. A single run
//    submitted while a sweep is queued is therefore the next job any free thread takes, ahead even of the
//    sweep points already fed; the sweep waits at most for the runs in progress.
// 2. Bounded depth. At most `depth` sweep points wait in pg-boss at any time (depth = solver threads of the
//    workers seen in the last minute, at least 1): enough that a thread finishing a run finds the next point
//    waiting, few enough that a sweep submitted later gets its turn within one round rather than after
//    every point fed before it.
// 3. Fairness. Each time a slot is free the feeder picks the author with the fewest points in flight
//    (running + waiting in the queue), ties going to whoever was fed longest ago, then that author's sweep
//    with the fewest points in flight (ties: fed longest ago, then oldest), and sends that sweep's lowest
//    pending point. Two users' sweeps therefore alternate point by point, and one user's two sweeps share
//    that user's turn instead of doubling it.
//
// When: on every run event (LISTEN on the run-events channel: a run was claimed, finished, cancelled...),
// coalesced, plus a slow timer as a safety net, and directly after a sweep is created or re-run. Any number
// of API processes may run a feeder: a transaction-level advisory lock lets one pass at a time act, and the
// pass sends jobs with the transaction's own client (pg-boss's `db` option), so a point is marked fed
// exactly when its job exists. A sweep whose points are all final is closed here too (sweep-finish.ts).
import type PgBoss from 'pg-boss'
import type { Pool, PoolClient } from 'pg'
import { RUN_JOB_SCHEMA_VERSION, type RunJobPayload } from '@shared/api/runs'
import type { Db } from '../../db/client'
import type { Logger } from '../../logger'
import { RUN_QUEUE, SWEEP_POINT_PRIORITY } from '../../jobs/queues'
import { bossDb } from '../../jobs/requeue'
import { inTransaction } from '../../jobs/run-store'
import { RUN_EVENTS_CHANNEL } from '../runs/run-events.repo'
import { closeFinishedSweeps } from './sweep-finish'
import { holdListen } from '../../db/held-listen'

export { SWEEP_POINT_PRIORITY }
/** pg_try_advisory_xact_lock key: "swep". */
const FEED_LOCK_KEY = 0x73776570
/** Workers count when seen within this time (they report every 10 s; same window as the queue view). */
const WORKER_SEEN_WITHIN_S = 60
/** Run events arriving within this time cause one pass. */
const COALESCE_MS = 100
/** Safety net for missed notifications (a dropped LISTEN connection, a worker's write without an event). */
export const FEED_INTERVAL_MS = 2_000

/** Points handed to the queue in one pass, per sweep id. */
export type FeedResult = Map<string, number>

interface Candidate {
  sweepId: string
  authorKey: string
  inFlight: number
  lastFedAt: number
  createdAt: number
}

async function targetDepth(c: PoolClient): Promise<number> {
  const { rows } = await c.query(`select coalesce(sum(threads), 0)::int as threads from workers where last_seen_at > now() - make_interval(secs => $1)`, [WORKER_SEEN_WITHIN_S])
  return Math.max(1, rows[0].threads as number)
}

/** The fairness rule (point 3 above), pure so it can be read and tested on its own. */
export function pickNext(cands: Candidate[]): Candidate | null {
  if (cands.length === 0) return null
  const byAuthor = new Map<string, Candidate[]>()
  for (const c of cands) byAuthor.set(c.authorKey, [...(byAuthor.get(c.authorKey) ?? []), c])
  const authors = [...byAuthor.values()].map((list) => ({
    list,
    inFlight: list.reduce((s, c) => s + c.inFlight, 0),
    lastFedAt: Math.max(...list.map((c) => c.lastFedAt)),
  }))
  authors.sort((a, b) => a.inFlight - b.inFlight || a.lastFedAt - b.lastFedAt)
  const mine = [...authors[0].list].sort((a, b) => a.inFlight - b.inFlight || a.lastFedAt - b.lastFedAt || a.createdAt - b.createdAt)
  return mine[0]
}

/** One feeding pass; returns what it sent. Safe to call from any process at any time. */
export async function feedSweeps(pool: Pool, boss: PgBoss): Promise<FeedResult> {
  const sent: FeedResult = new Map()
  await inTransaction(pool, async (c) => {
    const { rows: lock } = await c.query(`select pg_try_advisory_xact_lock($1) as got`, [FEED_LOCK_KEY])
    if (!lock[0].got) return
    const depth = await targetDepth(c)
    // Per running sweep with points still to feed: its author and points in flight.
    const { rows } = await c.query(
      `select s.id, coalesce(s.author_id::text, s.id::text) as author_key, s.created_at, s.last_fed_at,
              count(*) filter (where r.status = 'running' or (r.status = 'queued' and r.job_id is not null))::int as in_flight,
              count(*) filter (where r.status = 'queued' and r.job_id is null)::int as pending,
              count(*) filter (where r.status = 'queued' and r.job_id is not null)::int as waiting
         from sweeps s join runs r on r.sweep_id = s.id
        where s.status = 'running' and r.status in ('queued', 'running')
        group by s.id`,
    )
    let waiting = rows.reduce((n, r) => n + r.waiting, 0)
    const cands: (Candidate & { pending: number })[] = rows
      .filter((r) => r.pending > 0)
      .map((r) => ({ sweepId: r.id, authorKey: r.author_key, inFlight: r.in_flight, pending: r.pending, lastFedAt: r.last_fed_at?.getTime() ?? 0, createdAt: r.created_at.getTime() }))
    while (waiting < depth) {
      const next = pickNext(cands) as (Candidate & { pending: number }) | null
      if (!next) break
      // Sweep row before run row, the order a cancel takes them in: the opposite order deadlocks with it.
      const { rows: still } = await c.query(`select 1 from sweeps where id = $1 and status = 'running' for update`, [next.sweepId])
      const { rows: point } = still.length === 0 ? { rows: [] } : await c.query(
        `select id from runs where sweep_id = $1 and status = 'queued' and job_id is null order by sweep_point, created_at limit 1 for update skip locked`,
        [next.sweepId],
      )
      if (point.length === 0) {
        cands.splice(cands.indexOf(next), 1)
        continue
      }
      const runId: string = point[0].id
      const jobId = await boss.send(RUN_QUEUE, { schemaVersion: RUN_JOB_SCHEMA_VERSION, runId } satisfies RunJobPayload, { db: bossDb(c), priority: SWEEP_POINT_PRIORITY })
      if (!jobId) throw new Error(`queue ${RUN_QUEUE} does not exist`)
      await c.query(`update runs set job_id = $2 where id = $1`, [runId, jobId])
      const now = Date.now()
      await c.query(`update sweeps set last_fed_at = to_timestamp($2 / 1000.0) where id = $1`, [next.sweepId, now])
      sent.set(next.sweepId, (sent.get(next.sweepId) ?? 0) + 1)
      waiting++
      next.inFlight++
      next.lastFedAt = now
      if (--next.pending === 0) cands.splice(cands.indexOf(next), 1)
    }
  })
  return sent
}

export interface SweepFeeder {
  /** Ask for a pass soon (coalesced). */
  poke: () => void
  /** One pass now, waiting for it (tests, and right after a sweep is created). */
  feedNow: () => Promise<void>
  stop: () => Promise<void>
}

export interface FeederOptions {
  pool: Pool
  db: Db
  boss: PgBoss
  log: Logger
  intervalMs?: number
  /** Send the "sweep finished" mail (default true). */
  mail?: boolean
}

export async function startSweepFeeder(o: FeederOptions): Promise<SweepFeeder> {
  let stopped = false
  let running: Promise<void> | null = null
  let again = false
  let timer: NodeJS.Timeout | undefined

  const pass = async () => {
    await feedSweeps(o.pool, o.boss)
    await closeFinishedSweeps(o.pool, o.db, o.log, { mail: o.mail ?? true })
  }
  const feedNow = async (): Promise<void> => {
    if (stopped) return
    if (running) {
      again = true
      return running
    }
    running = pass()
      .catch((err) => o.log.warn({ err }, 'sweep feeder pass failed'))
      .finally(() => {
        running = null
        if (again && !stopped) {
          again = false
          void feedNow()
        }
      })
    return running
  }
  const poke = () => {
    if (stopped || timer) return
    timer = setTimeout(() => {
      timer = undefined
      void feedNow()
    }, COALESCE_MS)
  }

  // Missed events while the connection was away are made up for by the next interval's feed, and at once
  // after a reconnect.
  const listener = await holdListen({ pool: o.pool, channel: RUN_EVENTS_CHANNEL, name: 'sweep feeder', log: o.log, onNotification: poke, onReconnect: poke })
  const interval = setInterval(poke, o.intervalMs ?? FEED_INTERVAL_MS)
  interval.unref()
  void feedNow()

  return {
    poke,
    feedNow,
    async stop() {
      stopped = true
      clearInterval(interval)
      clearTimeout(timer)
      await running
      await listener.stop()
    },
  }
}
