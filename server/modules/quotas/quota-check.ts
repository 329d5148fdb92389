// The quota check a submission passes before its rows are stored: runs in flight (429) and cell-updates per
// rolling day (422), each for the author and for the group. Run it in the transaction that stores the run or
// sweep: the advisory locks below make two simultaneous submissions of one user or group take turns, so both
// cannot slip under the limit together.
//
// Who gets which quota: an account whose email is confirmed has the per-user quota, an unconfirmed one the
// small `unconfirmed` quota; the group quota applies to both. Site admins are exempt (they run the instance and
// set these limits; their runs still count toward their group's use). Resource limits per run and per sweep
// (shared/physics/resource-estimate.ts, shared/physics/sweep-points.ts) apply to everyone, admins included.
import type { PoolClient } from 'pg'
import { AppError } from '../../errors'
import type { QuotaConfig } from '../../env'
import { checkBudget, BUDGET_WINDOW_S } from './daily-budget'
import { budgetMessage, inFlightMessage } from './quota-messages'
import { chargesSince, itemsInFlight, type QuotaScope } from './quota-usage.repo'

export type { QuotaConfig }

/** pg_advisory_xact_lock(key, hashtext(id)) class key: "quot". */
const QUOTA_LOCK_KEY = 0x71756f74

export interface QuotaDemand {
  what: 'run' | 'sweep'
  /** Items it adds in flight: 1 for a run or a new sweep, 0 for points added to a sweep still running. */
  inFlight: number
  cellUpdates: number
}

export interface QuotaState {
  scope: QuotaScope
  limit: number
  used: number
  /** null when it frees up with the next finished or cancelled run, or never (the demand alone is too big). */
  freesAt: Date | null
}

export class QuotaExceeded extends AppError {
  constructor(status: 429 | 422, code: 'quota_runs_in_flight' | 'quota_cell_updates_per_day', message: string, readonly quota: QuotaState) {
    super(code, status, message, { quota })
    this.name = 'QuotaExceeded'
  }
}

interface ScopeLimits {
  scope: QuotaScope
  id: string
  limits: QuotaConfig['user']
  /** What a confirmed account would have, named to unconfirmed ones. */
  confirmed: QuotaConfig['user']
}

export async function enforceQuotas(c: PoolClient, quotas: QuotaConfig, userId: string, groupId: string, demand: QuotaDemand): Promise<void> {
  const { rows } = await c.query(`select email_confirmed_at is null as unconfirmed, is_admin from users where id = $1`, [userId])
  if (rows.length === 0 || rows[0].is_admin) return
  const unconfirmed: boolean = rows[0].unconfirmed
  const scopes: ScopeLimits[] = [
    { scope: 'user', id: userId, limits: unconfirmed ? quotas.unconfirmed : quotas.user, confirmed: quotas.user },
    { scope: 'group', id: groupId, limits: quotas.group, confirmed: quotas.group },
  ]
  const refuseBudget = (s: ScopeLimits, used: number, freesAt: Date | null, now: Date): never => {
    const limit = s.limits.cellUpdatesPerDay
    const message = budgetMessage({ scope: s.scope, unconfirmed, what: demand.what, limit, used, demand: demand.cellUpdates, freesAt, now, confirmedLimit: s.confirmed.cellUpdatesPerDay })
    throw new QuotaExceeded(422, 'quota_cell_updates_per_day', message, { scope: s.scope, limit, used, freesAt })
  }
  // Too big for the quota however long one waits: say so before anything that waiting would fix.
  for (const s of scopes) if (demand.cellUpdates > s.limits.cellUpdatesPerDay) refuseBudget(s, 0, null, new Date())

  // Group before user, always in this order, so two transactions never wait for each other's second lock.
  await c.query(`select pg_advisory_xact_lock($1, hashtext($2))`, [QUOTA_LOCK_KEY, `group:${groupId}`])
  await c.query(`select pg_advisory_xact_lock($1, hashtext($2))`, [QUOTA_LOCK_KEY, `user:${userId}`])
  if (demand.inFlight > 0) {
    for (const s of scopes) {
      const inFlight = await itemsInFlight(c, s.scope, s.id)
      if (inFlight + demand.inFlight > s.limits.runsInFlight) {
        const message = inFlightMessage({ scope: s.scope, unconfirmed, limit: s.limits.runsInFlight, inFlight, confirmedLimit: s.confirmed.runsInFlight })
        throw new QuotaExceeded(429, 'quota_runs_in_flight', message, { scope: s.scope, limit: s.limits.runsInFlight, used: inFlight, freesAt: null })
      }
    }
  }
  for (const s of scopes) {
    const { now, charges } = await chargesSince(c, s.scope, s.id, BUDGET_WINDOW_S)
    const budget = checkBudget(charges, s.limits.cellUpdatesPerDay, demand.cellUpdates)
    if (!budget.fits) refuseBudget(s, budget.usedCellUpdates, budget.freesAt, now)
  }
}
