// Use cases of fits. Reading follows the trace's group (viewer); creating needs the editor role there, and
// the run must belong to the same group. Offset + scale alone are solved at once; anything that needs new
// solver runs goes to the fit queue.
import type PgBoss from 'pg-boss'
import { isClosedFormFit, type FitDetail, type FitList, type FitRequest } from '@shared/fits'
import type { Db } from '../../db/client'
import { AppError, conflict, notFound } from '../../errors'
import { isUuid } from '../../policy/ids'
import { requireGroupRole, type Role } from '../../policy/access'
import type { AuthContext } from '../auth/auth-context'
import { findRun } from '../runs/runs.repo'
import { traceFor } from '../traces/traces.service'
import { runFit } from './fit-engine'
import { fitInputs } from './fit-data'
import { declareFitQueue, FIT_QUEUE } from './fit-queue'
import { deleteFit, findFit, insertFit, listFits, setFitJob, type FitRecord } from './fits.repo'

export interface FitsDeps {
  db: Db
  boss: PgBoss
}

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
  await declareFitQueue(deps.boss)
  const id = await insertFit(deps.db, { ...base, message: 'Waiting for a worker' })
  const jobId = await deps.boss.send(FIT_QUEUE, { schemaVersion: 1, fitId: id })
  if (!jobId) {
    await deleteFit(deps.db, id)
    throw new AppError('queue_unavailable', 503, 'The fit could not be queued; try again in a moment')
  }
  await setFitJob(deps.db, id, jobId)
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

export async function removeFit(deps: FitsDeps, auth: AuthContext | undefined, id: string): Promise<void> {
  const fit = await fitFor(deps, auth, id, 'editor')
  if (fit.jobId && (fit.status === 'queued' || fit.status === 'running')) await deps.boss.cancel(FIT_QUEUE, fit.jobId).catch(() => {})
  await deleteFit(deps.db, id)
}
