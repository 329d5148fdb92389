// Run use cases: submit (validate, estimate, check quotas, store + enqueue in one transaction with a fair
// priority: server/jobs/fair-priority.ts), idempotent resubmission, cancel, clone, read. Authorisation follows the run's group (server/policy/access.ts).
import type PgBoss from 'pg-boss'
import type { Pool } from 'pg'
import { chooseGrid } from '@shared/physics/grid-step'
import { checkLimits, DEFAULT_RESOURCE_LIMITS, estimateResources, type ResourceLimits } from '@shared/physics/resource-estimate'
import { RUN_JOB_SCHEMA_VERSION, type RunClone, type RunCreate, type RunDetail, type RunJobPayload, type RunList, type RunListQuery } from '@shared/api/runs'
import type { RunEstimateRequest, RunEstimateResponse } from '@shared/api/estimates'
import { SOLVER_VERSION } from '../../../solver/index'
import type { Db } from '../../db/client'
import { AppError, conflict, notFound } from '../../errors'
import type { Logger } from '../../logger'
import { bossDb } from '../../jobs/requeue'
import { RUN_QUEUE } from '../../jobs/queues'
import { nextSingleRunRank, singleRunPriority } from '../../jobs/fair-priority'
import { inTransaction } from '../../jobs/run-store'
import { requireGroupRole, type Role } from '../../policy/access'
import { requireResourceAccess } from '../shares'
import { isUuid } from '../../policy/ids'
import type { AuthContext } from '../auth/auth-context'
import { enforceQuotas, type QuotaConfig } from '../quotas'
import { configHash } from './config-hash'
import { loadSpeedCalibration } from '../estimates/speed-calibration.service'
import { appendRunEvent, RUN_CANCEL_CHANNEL } from './run-events.repo'
import { toDetail, toSummary } from './runs.mapper'
import { findByIdempotencyKey, findRun, listRuns, queuePositionOf, type RunRow } from './runs.repo'

export interface RunsDeps {
  db: Db
  pool: Pool
  boss: PgBoss
  log: Logger
  limits?: ResourceLimits
  /** Per-user and per-group quotas (server/env.ts); the server always passes them, tests that leave them out run without. */
  quotas?: QuotaConfig
}

/** A repeated POST with the same Idempotency-Key inside this window returns the first run. */
export const IDEMPOTENCY_WINDOW_MS = 60 * 60 * 1000

/**
 * The run, if the caller may act on it with at least `minRole`; 404 otherwise (ids of other groups' runs
 * do not leak). For reads, a valid share token (?share=) stands in for the viewer role (modules/shares).
 */
export async function runFor(deps: RunsDeps, auth: AuthContext | undefined, id: string, minRole: Role, shareToken?: string): Promise<RunRow> {
  const run = isUuid(id) ? await findRun(deps.db, id) : null
  if (!run) throw notFound('Run')
  await requireResourceAccess(deps.db, auth, { type: 'run', id: run.id, groupId: run.groupId, label: 'Run' }, minRole, shareToken)
  return run
}

export async function createRun(deps: RunsDeps, auth: AuthContext | undefined, input: RunCreate, idempotencyKey?: string): Promise<{ run: RunDetail; replayed: boolean }> {
  await requireGroupRole(deps.db, auth, input.groupId, 'editor', 'Group')
  const userId = auth!.userId
  const estimate = estimateResources(input.config, chooseGrid(input.config), 1, await loadSpeedCalibration(deps.pool, deps.log))
  const limits = checkLimits(estimate, deps.limits ?? DEFAULT_RESOURCE_LIMITS)
  // Field paths as in the request body, like the 400s of the same form.
  const fields = limits.ok ? undefined : limits.fields?.map((f) => ({ ...f, path: `config.${f.path}` }))
  if (!limits.ok) throw new AppError('over_limit', 422, limits.message, { reasons: limits.reasons, ...(fields ? { fields } : {}) })
  const hash = configHash(input.config)

  if (idempotencyKey) {
    const prior = await findByIdempotencyKey(deps.db, userId, idempotencyKey)
    if (prior && Date.now() - prior.createdAt.getTime() < IDEMPOTENCY_WINDOW_MS) {
      if (prior.configHash !== hash || prior.groupId !== input.groupId || prior.title !== input.title) {
        throw new AppError('idempotency_key_reused', 422, 'This Idempotency-Key was already used for a different run; use a new key for a new run')
      }
      return { run: toDetail(prior), replayed: true }
    }
  }

  try {
    const id = await inTransaction(deps.pool, async (c) => {
      if (deps.quotas) await enforceQuotas(c, deps.quotas, userId, input.groupId, { what: 'run', inFlight: 1, cellUpdates: estimate.cellUpdates })
      // A key older than the window may be used again.
      if (idempotencyKey) await c.query(`update runs set idempotency_key = null where author_id = $1 and idempotency_key = $2`, [userId, idempotencyKey])
      const rank = await nextSingleRunRank(c, userId)
      const { rows } = await c.query(
        `insert into runs (group_id, author_id, title, notes, config, config_hash, solver_version, estimate, idempotency_key, queue_rank)
         values ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10) returning id`,
        [input.groupId, userId, input.title, input.notes, JSON.stringify(input.config), hash, SOLVER_VERSION, JSON.stringify(estimate), idempotencyKey ?? null, rank],
      )
      const runId: string = rows[0].id
      await appendRunEvent(c, runId, 0, 'status', { status: 'queued', attempt: 0, error: null })
      // The job is inserted by our transaction's client: it exists exactly when the run row does.
      const jobId = await deps.boss.send(RUN_QUEUE, { schemaVersion: RUN_JOB_SCHEMA_VERSION, runId } satisfies RunJobPayload, { db: bossDb(c), priority: singleRunPriority(rank) })
      if (!jobId) throw new Error(`queue ${RUN_QUEUE} does not exist`)
      await c.query(`update runs set job_id = $2 where id = $1`, [runId, jobId])
      return runId
    })
    return { run: toDetail((await findRun(deps.db, id))!), replayed: false }
  } catch (err) {
    // Two identical requests raced: the other one inserted first.
    if ((err as { code?: string }).code === '23505' && idempotencyKey) {
      const prior = await findByIdempotencyKey(deps.db, userId, idempotencyKey)
      if (prior && prior.configHash === hash) return { run: toDetail(prior), replayed: true }
    }
    throw err
  }
}

export async function cloneRun(deps: RunsDeps, auth: AuthContext | undefined, id: string, input: RunClone): Promise<RunDetail> {
  const source = await runFor(deps, auth, id, 'viewer')
  const { run } = await createRun(deps, auth, {
    groupId: source.groupId,
    title: input.title ?? `${source.title} (copy)`.slice(0, 200),
    notes: input.notes ?? source.notes,
    config: source.config,
  })
  return run
}

/** Stops a queued or running run. The worker hears it by NOTIFY and frees its thread within a second. */
export async function cancelRun(deps: RunsDeps, auth: AuthContext | undefined, id: string): Promise<RunDetail> {
  const run = await runFor(deps, auth, id, 'editor')
  const cancelled = await inTransaction(deps.pool, async (c) => {
    const { rows } = await c.query(
      `update runs set status = 'cancelled', finished_at = now(), updated_at = now(), heartbeat_at = null
       where id = $1 and status in ('queued', 'running') returning attempt, job_id`,
      [run.id],
    )
    if (rows.length === 0) return null
    await appendRunEvent(c, run.id, rows[0].attempt, 'status', { status: 'cancelled', attempt: rows[0].attempt, error: null })
    await c.query(`select pg_notify($1, $2)`, [RUN_CANCEL_CHANNEL, run.id])
    return { jobId: rows[0].job_id as string | null }
  })
  if (!cancelled) throw conflict(`The run has already ${run.status === 'cancelled' ? 'been cancelled' : run.status}`)
  // A queued job is not fetched any more; a running one ends when its handler sees the cancel.
  if (cancelled.jobId) await deps.boss.cancel(RUN_QUEUE, cancelled.jobId).catch((err) => deps.log.warn({ err, runId: run.id }, 'pg-boss cancel failed'))
  return toDetail((await findRun(deps.db, run.id))!)
}

export async function getRun(deps: RunsDeps, auth: AuthContext | undefined, id: string, shareToken?: string): Promise<RunDetail> {
  const run = await runFor(deps, auth, id, 'viewer', shareToken)
  return toDetail(run, await queuePositionOf(deps.db, run))
}

export async function listRunsFor(deps: RunsDeps, auth: AuthContext | undefined, q: RunListQuery): Promise<RunList> {
  if (q.groupId) await requireGroupRole(deps.db, auth, q.groupId, 'viewer', 'Group')
  const { rows, total } = await listRuns(deps.db, auth!.userId, q)
  return { items: rows.map(toSummary), total, page: q.page, pageSize: q.pageSize }
}

/** The estimate of a run before it is submitted, with this server's measured speed where it has one. */
export async function estimateRun(deps: Pick<RunsDeps, 'pool' | 'log' | 'limits'>, input: RunEstimateRequest): Promise<RunEstimateResponse> {
  const estimate = estimateResources(input.config, chooseGrid(input.config), 1, await loadSpeedCalibration(deps.pool, deps.log))
  const check = checkLimits(estimate, deps.limits ?? DEFAULT_RESOURCE_LIMITS)
  // The interface has no index signature; the response schema keeps every field.
  return { estimate: { ...estimate }, ok: check.ok, message: check.ok ? null : check.message }
}
