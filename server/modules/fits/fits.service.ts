// Use cases of fits. Reading follows the trace's group (viewer); creating needs the editor role there, and
// the run must belong to the same group. Offset + scale alone are solved at once; anything that needs new
// solver runs goes to the fit queue: the fit row and its job are written in one transaction (pg-boss 10
// accepts our transaction's client), so a fit exists exactly when its job does.
import type PgBoss from 'pg-boss'
import type { Pool } from 'pg'
import { isClosedFormFit, type FitDetail, type FitJobPayload, type FitList, type FitRequest } from '@shared/api/fits'
import type { Db } from '../../db/client'
import { AppError, conflict, notFound } from '../../errors'
import { FIT_QUEUE } from '../../jobs/queues'
import { bossDb } from '../../jobs/requeue'
import { inTransaction } from '../../jobs/run-store'
import { isUuid } from '../../policy/ids'
import { requireGroupRole, type Role } from '../../policy/access'
import type { AuthContext } from '../auth/auth-context'
import { findRun } from '../runs/runs.repo'
import { traceFor } from '../traces/traces.service'
import { runFit } from './fit-engine'
import { fitInputs } from './fit-data'
import { findFit, insertFit, listFits, type FitRecord } from './fits.repo'

export interface FitsDeps {
  db: Db
  /** The pool behind `db`; when left out, the one drizzle(pool) keeps as $client. */
  pool?: Pool
  boss: PgBoss
}

/** Transactions that pg-boss joins need a pg client, so they start from the pool. */
const poolOf = (deps: FitsDeps): Pool => deps.pool ?? (deps.db as Db & { $client: Pool }).$client

export function toFitDetail(r: FitRecord): FitDetail {
  return {
    id: r.id,
    groupId: r.groupId,
    traceId: r.traceId,
    runId: r.runId,
    authorName: r.authorName,
    status: r.status,
    progress: r.progress,
    message: r.message,
    inputs: r.inputs,
    result: r.result ?? null,
    error: r.error,
    createdAt: r.createdAt.toISOString(),
    finishedAt: r.finishedAt?.toISOString() ?? null,
  }
}

export async function createFit(deps: FitsDeps, auth: AuthContext | undefined, req: FitRequest): Promise<FitDetail> {
  const trace = await traceFor(deps, auth, req.traceId, 'viewer')
  await requireGroupRole(deps.db, auth, trace.groupId, 'editor', 'Trace')
  const run = await findRun(deps.db, req.runId)
  // A run of another group is "not found", exactly as if it did not exist.
  if (!run || run.groupId !== trace.groupId) throw notFound('Run')
  if (run.status !== 'succeeded') throw conflict(`The run has no results to fit (it is ${run.status})`)
  if (req.channel >= run.config.channels.length) {
    throw new AppError('invalid_input', 400, `The run has ${run.config.channels.length} channel(s)`, { fields: [{ path: 'channel', message: 'out of range' }] })
  }
  const inputs = await fitInputs(deps.db, req, trace, run)
  const base = { groupId: trace.groupId, authorId: auth!.userId, traceId: trace.id, runId: run.id, inputs: req }

  if (isClosedFormFit(req)) {
    let result
    try {
      result = runFit(inputs)
    } catch (err) {
      throw new AppError('unfittable', 422, (err as Error).message)
    }
    const now = new Date()
    const id = await insertFit(deps.db, { ...base, status: 'succeeded', result, progress: 1, message: 'Solved in closed form', startedAt: now, finishedAt: now })
    return toFitDetail((await findFit(deps.db, id))!)
  }
  const id = await inTransaction(poolOf(deps), async (c) => {
    const { rows } = await c.query(`insert into fits (group_id, author_id, trace_id, run_id, inputs, message) values ($1, $2, $3, $4, $5, 'Waiting for a worker') returning id`, [
      base.groupId,
      base.authorId,
      base.traceId,
      base.runId,
      JSON.stringify(base.inputs),
    ])
    const fitId: string = rows[0].id
    const jobId = await deps.boss.send(FIT_QUEUE, { schemaVersion: 1, fitId } satisfies FitJobPayload, { db: bossDb(c) })
    if (!jobId) throw new AppError('queue_unavailable', 503, 'The fit could not be queued; try again in a moment')
    await c.query(`update fits set job_id = $2 where id = $1`, [fitId, jobId])
    return fitId
  })
  return toFitDetail((await findFit(deps.db, id))!)
}

async function fitFor(deps: FitsDeps, auth: AuthContext | undefined, id: string, minRole: Role): Promise<FitRecord> {
  const row = isUuid(id) ? await findFit(deps.db, id) : null
  if (!row) {
    if (!auth) throw new AppError('unauthorized', 401, 'Sign in first')
    throw notFound('Fit')
  }
  await requireGroupRole(deps.db, auth, row.groupId, minRole, 'Fit')
  return row
}

export async function getFit(deps: FitsDeps, auth: AuthContext | undefined, id: string): Promise<FitDetail> {
  return toFitDetail(await fitFor(deps, auth, id, 'viewer'))
}

export async function listFitsFor(deps: FitsDeps, auth: AuthContext | undefined, by: { traceId?: string; runId?: string }): Promise<FitList> {
  if (by.traceId) await traceFor(deps, auth, by.traceId, 'viewer')
  if (by.runId) {
    const run = await findRun(deps.db, by.runId)
    if (!run) throw notFound('Run')
    await requireGroupRole(deps.db, auth, run.groupId, 'viewer', 'Run')
  }
  return { items: (await listFits(deps.db, by)).map(toFitDetail) }
}

/**
 * Deletes the fit and cancels its job in one transaction. A running fit's worker finds the row gone at its
 * next heartbeat and stops the thread; every write it could still make is keyed to the row (fit-store.ts).
 */
export async function removeFit(deps: FitsDeps, auth: AuthContext | undefined, id: string): Promise<void> {
  const fit = await fitFor(deps, auth, id, 'editor')
  await inTransaction(poolOf(deps), async (c) => {
    const { rows } = await c.query(`delete from fits where id = $1 returning status, job_id`, [fit.id])
    const row = rows[0]
    if (row?.job_id && (row.status === 'queued' || row.status === 'running')) await deps.boss.cancel(FIT_QUEUE, row.job_id, { db: bossDb(c) })
  })
}
