// Sweeps and their point runs in PostgreSQL; plain objects out. Point runs are ordinary rows of `runs`
// (sweep_id, sweep_point) stored `queued` with no job: the feeder (sweep-feeder.ts) sends their jobs.
import type { Pool, PoolClient } from 'pg'
import type { FiguresOfMerit } from '@shared/physics/simulation-result'
import type { RunState } from '@shared/api/runs'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import type { PointCounts, SweepAxis, SweepEstimate, SweepListQuery, SweepState } from '@shared/api/sweeps'
import type { ResourceEstimate } from '@shared/physics/resource-estimate'
import { SOLVER_VERSION } from '../../../solver/index'
import { inTransaction } from '../../jobs/run-store'
import { configHash } from '../runs/config-hash'
import { appendRunEvent, RUN_CANCEL_CHANNEL, type Queryable } from '../runs/run-events.repo'

export interface SweepRow {
  id: string
  groupId: string
  authorId: string | null
  authorName: string | null
  title: string
  notes: string
  baseConfig: SimulationConfig
  axes: SweepAxis[]
  extendWindow: boolean
  pointCount: number
  estimate: SweepEstimate
  status: SweepState
  createdAt: Date
  finishedAt: Date | null
  counts: PointCounts
}

/** The newest run of one point. */
export interface PointRunRow {
  point: number
  runId: string
  status: RunState
  progress: number
  attempt: number
  error: string | null
  startedAt: Date | null
  finishedAt: Date | null
  figures: FiguresOfMerit | null
  hasManifest: boolean
}

export interface NewPointRun {
  point: number
  title: string
  config: SimulationConfig
  estimate: ResourceEstimate
}

// Counts over the newest run of each point (a re-run supersedes the failed run of its point).
const COUNTS = `(select json_build_object(
    'queued', count(*) filter (where c.status = 'queued'), 'running', count(*) filter (where c.status = 'running'),
    'succeeded', count(*) filter (where c.status = 'succeeded'), 'failed', count(*) filter (where c.status = 'failed'),
    'cancelled', count(*) filter (where c.status = 'cancelled'))
  from (select distinct on (r.sweep_point) r.status from runs r where r.sweep_id = s.id order by r.sweep_point, r.created_at desc, r.id desc) c) as counts`

const SELECT = `select s.id, s.group_id, s.author_id, u.name as author_name, s.title, s.notes, s.base_config, s.axes, s.extend_window, s.point_count,
    s.estimate, s.status, s.created_at, s.finished_at, ${COUNTS}
  from sweeps s left join users u on u.id = s.author_id`

function toRow(r: any): SweepRow {
  return {
    id: r.id,
    groupId: r.group_id,
    authorId: r.author_id,
    authorName: r.author_name,
    title: r.title,
    notes: r.notes,
    baseConfig: r.base_config,
    axes: r.axes,
    extendWindow: r.extend_window,
    pointCount: r.point_count,
    estimate: r.estimate,
    status: r.status,
    createdAt: r.created_at,
    finishedAt: r.finished_at,
    counts: Object.fromEntries(Object.entries(r.counts).map(([k, v]) => [k, Number(v)])) as PointCounts,
  }
}

export async function findSweep(q: Queryable, id: string): Promise<SweepRow | null> {
  const { rows } = await q.query(`${SELECT} where s.id = $1`, [id])
  return rows[0] ? toRow(rows[0]) : null
}

export async function listSweeps(q: Queryable, userId: string, query: SweepListQuery): Promise<{ rows: SweepRow[]; total: number }> {
  const where = query.groupId ? `s.group_id = $1` : `s.group_id in (select group_id from memberships where user_id = $1)`
  const arg = query.groupId ?? userId
  const [list, total] = await Promise.all([
    q.query(`${SELECT} where ${where} order by s.created_at desc, s.id desc limit $2 offset $3`, [arg, query.pageSize, (query.page - 1) * query.pageSize]),
    q.query(`select count(*)::int as n from sweeps s where ${where}`, [arg]),
  ])
  return { rows: list.rows.map(toRow), total: total.rows[0].n }
}

export async function pointRuns(q: Queryable, sweepId: string): Promise<PointRunRow[]> {
  const { rows } = await q.query(
    `select distinct on (sweep_point) sweep_point, id, status, progress, attempt, error, started_at, finished_at, figures, manifest is not null as has_manifest
       from runs where sweep_id = $1 order by sweep_point, created_at desc, id desc`,
    [sweepId],
  )
  return rows.map((r) => ({
    point: r.sweep_point,
    runId: r.id,
    status: r.status,
    progress: r.progress,
    attempt: r.attempt,
    error: r.error,
    startedAt: r.started_at,
    finishedAt: r.finished_at,
    figures: r.figures,
    hasManifest: r.has_manifest,
  }))
}

/** Inserts point runs (queued, no job yet) with their first status event, inside the caller's transaction. */
async function insertPointRuns(c: PoolClient, s: { sweepId: string; groupId: string; authorId: string }, points: NewPointRun[]): Promise<void> {
  for (const p of points) {
    const { rows } = await c.query(
      `insert into runs (group_id, author_id, title, notes, config, config_hash, solver_version, estimate, sweep_id, sweep_point)
       values ($1, $2, $3, '', $4, $5, $6, $7, $8, $9) returning id`,
      [s.groupId, s.authorId, p.title, JSON.stringify(p.config), configHash(p.config), SOLVER_VERSION, JSON.stringify(p.estimate), s.sweepId, p.point],
    )
    await appendRunEvent(c, rows[0].id, 0, 'status', { status: 'queued', attempt: 0, error: null })
  }
}

export interface NewSweep {
  groupId: string
  authorId: string
  title: string
  notes: string
  baseConfig: SimulationConfig
  axes: SweepAxis[]
  extendWindow: boolean
  estimate: SweepEstimate
}

/** The sweep and one run per point, all or nothing. */
export async function insertSweep(pool: Pool, s: NewSweep, points: NewPointRun[]): Promise<string> {
  return inTransaction(pool, async (c) => {
    const { rows } = await c.query(
      `insert into sweeps (group_id, author_id, title, notes, base_config, axes, extend_window, point_count, estimate) values ($1, $2, $3, $4, $5, $6, $7, $8, $9) returning id`,
      [s.groupId, s.authorId, s.title, s.notes, JSON.stringify(s.baseConfig), JSON.stringify(s.axes), s.extendWindow, points.length, JSON.stringify(s.estimate)],
    )
    const sweepId: string = rows[0].id
    await insertPointRuns(c, { sweepId, groupId: s.groupId, authorId: s.authorId }, points)
    return sweepId
  })
}

/**
 * Stops the sweep: it is marked cancelled and every point still queued or running is cancelled the way the
 * runs API cancels one run (status, event, NOTIFY to its worker). Returns the pg-boss jobs to cancel.
 */
export async function cancelSweepRuns(pool: Pool, sweepId: string): Promise<{ cancelled: number; jobIds: string[] } | null> {
  return inTransaction(pool, async (c) => {
    const { rowCount } = await c.query(`update sweeps set status = 'cancelled', finished_at = now() where id = $1 and status = 'running'`, [sweepId])
    if (!rowCount) return null
    const { rows } = await c.query(
      `update runs set status = 'cancelled', finished_at = now(), updated_at = now(), heartbeat_at = null
        where sweep_id = $1 and status in ('queued', 'running') returning id, attempt, job_id`,
      [sweepId],
    )
    for (const r of rows) {
      await appendRunEvent(c, r.id, r.attempt, 'status', { status: 'cancelled', attempt: r.attempt, error: null })
      await c.query(`select pg_notify($1, $2)`, [RUN_CANCEL_CHANNEL, r.id])
    }
    return { cancelled: rows.length, jobIds: rows.map((r) => r.job_id).filter((j): j is string => !!j) }
  })
}

/** New runs for the points whose newest run failed; the sweep is running again. Returns how many. */
export async function rerunFailedPoints(pool: Pool, sweep: SweepRow, authorId: string, make: (point: number) => NewPointRun): Promise<number> {
  return inTransaction(pool, async (c) => {
    // Locking the sweep row serialises re-runs of one sweep (FOR UPDATE does not combine with DISTINCT ON).
    await c.query(`select 1 from sweeps where id = $1 for update`, [sweep.id])
    const { rows } = await c.query(
      `select sweep_point from (select distinct on (sweep_point) sweep_point, status from runs where sweep_id = $1
         order by sweep_point, created_at desc, id desc) p where status = 'failed' order by sweep_point`,
      [sweep.id],
    )
    if (rows.length === 0) return 0
    await insertPointRuns(c, { sweepId: sweep.id, groupId: sweep.groupId, authorId }, rows.map((r) => make(r.sweep_point)))
    await c.query(`update sweeps set status = 'running', finished_at = null, notified_at = null where id = $1`, [sweep.id])
    return rows.length
  })
}
