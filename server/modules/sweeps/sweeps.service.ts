// Sweep use cases: estimate, create (validate every point, check the whole sweep against the limits, store the
// sweep and its point runs), read, cancel the remaining points, re-run failed points. Authorisation follows
// the sweep's group, as for runs.
import type PgBoss from 'pg-boss'
import type { Pool } from 'pg'
import { estimateResources } from '@shared/physics/resource-estimate'
import { chooseGrid } from '@shared/physics/grid-step'
import { axisLabel, axisValues, type SweepCreate, type SweepDefinition, type SweepDetail, type SweepEstimateResponse, type SweepList, type SweepListQuery } from '@shared/api/sweeps'
import { buildSweepPoints, checkSweepLimits, DEFAULT_SWEEP_LIMITS, estimateSweep, type BuiltPoint, type SweepLimits } from '@shared/physics/sweep-points'
import type { Db } from '../../db/client'
import { AppError, conflict, notFound } from '../../errors'
import type { Logger } from '../../logger'
import { RUN_QUEUE } from '../../jobs/queues'
import { requireGroupRole, type Role } from '../../policy/access'
import { isUuid } from '../../policy/ids'
import type { AuthContext } from '../auth/auth-context'
import { inTransaction } from '../../jobs/run-store'
import { enforceQuotas, type QuotaConfig } from '../quotas'
import { requireResourceAccess } from '../shares'
import type { SweepFeeder } from './sweep-feeder'
import type { SpeedCalibration } from '@shared/physics/speed-calibration'
import { loadSpeedCalibration } from '../estimates/speed-calibration.service'
import { pointValues, toSweepDetail, toSweepSummary } from './sweeps.mapper'
import { cancelSweepRuns, findSweep, insertSweep, listSweeps, pointRuns, rerunFailedPoints, type NewPointRun, type SweepRow } from './sweeps.repo'

export interface SweepsDeps {
  db: Db
  pool: Pool
  boss: PgBoss
  log: Logger
  feeder: Pick<SweepFeeder, 'poke'>
  limits?: SweepLimits
  /** Per-user and per-group quotas (server/env.ts); a sweep counts as one item in flight and its whole estimate is charged at once. */
  quotas?: QuotaConfig
}

/** The sweep if the caller may act on it with `minRole`; a share token stands in for the viewer role (modules/shares). */
export async function sweepFor(deps: SweepsDeps, auth: AuthContext | undefined, id: string, minRole: Role, shareToken?: string): Promise<SweepRow> {
  const sweep = isUuid(id) ? await findSweep(deps.pool, id) : null
  if (!sweep) throw notFound('Sweep')
  await requireResourceAccess(deps.db, auth, { type: 'sweep', id: sweep.id, groupId: sweep.groupId, label: 'Sweep' }, minRole, shareToken)
  return sweep
}

/** Points of a definition, or a 400 with the field paths of what is wrong (a missing label, an invalid point). */
function pointsOf(def: SweepDefinition): { points: BuiltPoint[] } {
  const built = buildSweepPoints(def)
  if (!built.ok) throw new AppError('invalid_input', 400, 'Some sweep points are not valid runs', { fields: built.issues })
  return { points: built.points }
}

export async function estimateSweepFor(deps: Pick<SweepsDeps, 'limits' | 'pool'>, def: SweepDefinition): Promise<SweepEstimateResponse> {
  const limits = deps.limits ?? DEFAULT_SWEEP_LIMITS
  const { points } = pointsOf(def)
  const check = checkSweepLimits(points, limits)
  return {
    estimate: estimateSweep(points, await loadSpeedCalibration(deps.pool)).total,
    ok: check.ok,
    message: check.ok ? null : check.message,
    limits: { maxTotalCellUpdates: limits.maxTotalCellUpdates, maxCellUpdatesPerPoint: limits.run.maxCellUpdates, maxPoints: limits.maxPoints },
  }
}

/** Six significant digits: what a user types, without the float noise of a range (0.15000000000000002). */
const shown = (v: number) => String(Number(v.toPrecision(6)))

// Points are numbered from 1 wherever people see them (titles, table, mail, CSV); the stored index is 0-based.
const pointTitle = (title: string, def: SweepDefinition, p: { index: number; values: number[] }) =>
  `${title} · point ${p.index + 1} (${def.axes.map((a, i) => `${axisLabel(a).replace(/ \([^()]*\)$/, '')} = ${shown(p.values[i])}`).join(', ')})`.slice(0, 200)

const newPointRun = (title: string, def: SweepDefinition, p: BuiltPoint, calibration: SpeedCalibration | null): NewPointRun => ({
  point: p.index,
  title: pointTitle(title, def, p),
  config: p.config,
  estimate: estimateResources(p.config, chooseGrid(p.config), 1, calibration),
})

export async function createSweep(deps: SweepsDeps, auth: AuthContext | undefined, input: SweepCreate): Promise<SweepDetail> {
  await requireGroupRole(deps.db, auth, input.groupId, 'editor', 'Group')
  const limits = deps.limits ?? DEFAULT_SWEEP_LIMITS
  const { points } = pointsOf(input)
  const check = checkSweepLimits(points, limits)
  const calibration = await loadSpeedCalibration(deps.pool, deps.log)
  const total = estimateSweep(points, calibration).total
  if (!check.ok) {
    throw new AppError('over_limit', 422, check.message, { reasons: check.reasons, totalCellUpdates: total.cellUpdates, limitCellUpdates: limits.maxTotalCellUpdates, points: total.points })
  }
  const quotas = deps.quotas
  if (quotas) await inTransaction(deps.pool, (c) => enforceQuotas(c, quotas, auth!.userId, input.groupId, { what: 'sweep', inFlight: 1, cellUpdates: total.cellUpdates }))
  const id = await insertSweep(
    deps.pool,
    { groupId: input.groupId, authorId: auth!.userId, title: input.title, notes: input.notes, baseConfig: input.baseConfig, axes: input.axes, extendWindow: input.extendWindow ?? true, estimate: total },
    points.map((p) => newPointRun(input.title, input, p, calibration)),
  )
  deps.feeder.poke()
  return getSweep(deps, auth, id)
}

export async function getSweep(deps: SweepsDeps, auth: AuthContext | undefined, id: string, shareToken?: string): Promise<SweepDetail> {
  const sweep = await sweepFor(deps, auth, id, 'viewer', shareToken)
  return toSweepDetail(sweep, await pointRuns(deps.pool, sweep.id))
}

export async function listSweepsFor(deps: SweepsDeps, auth: AuthContext | undefined, q: SweepListQuery): Promise<SweepList> {
  if (q.groupId) await requireGroupRole(deps.db, auth, q.groupId, 'viewer', 'Group')
  const { rows, total } = await listSweeps(deps.pool, auth!.userId, q)
  return { items: rows.map(toSweepSummary), total, page: q.page, pageSize: q.pageSize }
}

/** No further point starts; running points stop within a second (their workers hear the cancel); finished ones stay. */
export async function cancelSweep(deps: SweepsDeps, auth: AuthContext | undefined, id: string): Promise<SweepDetail> {
  const sweep = await sweepFor(deps, auth, id, 'editor')
  const done = await cancelSweepRuns(deps.pool, sweep.id)
  if (!done) throw conflict(`The sweep has already ${sweep.status === 'cancelled' ? 'been cancelled' : 'finished'}`)
  if (done.jobIds.length) await deps.boss.cancel(RUN_QUEUE, done.jobIds).catch((err) => deps.log.warn({ err, sweepId: sweep.id }, 'pg-boss cancel failed'))
  return getSweep(deps, auth, sweep.id)
}

/** A new run for each point whose newest run failed; 409 when none failed. */
export async function rerunFailed(deps: SweepsDeps, auth: AuthContext | undefined, id: string): Promise<SweepDetail> {
  const sweep = await sweepFor(deps, auth, id, 'editor')
  // A finished sweep starts again and takes a place in flight; its re-run points are charged as they are stored.
  const quotas = deps.quotas
  if (quotas) await inTransaction(deps.pool, (c) => enforceQuotas(c, quotas, auth!.userId, sweep.groupId, { what: 'sweep', inFlight: sweep.status === 'running' ? 0 : 1, cellUpdates: 0 }))
  const def = { baseConfig: sweep.baseConfig, axes: sweep.axes, extendWindow: sweep.extendWindow }
  const values = def.axes.map((a) => axisValues(a.values))
  const calibration = await loadSpeedCalibration(deps.pool, deps.log)
  const n = await rerunFailedPoints(deps.pool, sweep, auth!.userId, (index) => {
    const at = pointValues(values, index)
    const built = buildSweepPoints({ ...def, axes: def.axes.map((a, i) => ({ ...a, values: { kind: 'list' as const, values: [at[i]] } })) })
    if (!built.ok) throw new AppError('invalid_input', 400, `Point ${index + 1} is no longer a valid run: ${built.issues[0].message}`)
    return newPointRun(sweep.title, def, { ...built.points[0], index }, calibration)
  })
  if (n === 0) throw conflict('No point of this sweep has failed')
  deps.feeder.poke()
  return getSweep(deps, auth, sweep.id)
}
