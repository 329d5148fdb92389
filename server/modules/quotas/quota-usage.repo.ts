// What a user or a group has in flight and has spent in the last day, for the quota checks (quota-check.ts).
//
// In flight: single runs queued or running, plus sweeps still running. A sweep counts once: the sweep feeder
// hands its points to the queue a few at a time, so a sweep occupies the queue like one run, however many
// points it has; its size is charged to the daily budget instead.
// Spent: the resource estimate (cell-updates) of every run created in the window, single runs and sweep points
// alike, so a sweep is charged its whole estimate when it is made. A run cancelled before it started costs
// nothing and is not charged.
import type { Queryable } from '../runs/run-events.repo'

export type QuotaScope = 'user' | 'group'

const COLUMN: Record<QuotaScope, string> = { user: 'author_id', group: 'group_id' }

export async function itemsInFlight(c: Queryable, scope: QuotaScope, id: string): Promise<number> {
  const col = COLUMN[scope]
  const { rows } = await c.query(
    `select (select count(*) from runs where ${col} = $1 and sweep_id is null and status in ('queued', 'running'))
          + (select count(*) from sweeps where ${col} = $1 and status = 'running') as n`,
    [id],
  )
  return Number(rows[0].n)
}

export interface Charge {
  at: Date
  cellUpdates: number
}

/** Charges inside the window, oldest first, and the database's clock (the window is measured on it). */
export async function chargesSince(c: Queryable, scope: QuotaScope, id: string, windowS: number): Promise<{ now: Date; charges: Charge[] }> {
  const col = COLUMN[scope]
  const { rows } = await c.query(
    `select now() as now, created_at, coalesce((estimate->>'cellUpdates')::float8, 0) as cell_updates
       from runs
      where ${col} = $1 and created_at > now() - make_interval(secs => $2) and not (status = 'cancelled' and started_at is null)
      order by created_at`,
    [id, windowS],
  )
  if (rows.length === 0) {
    const { rows: clock } = await c.query(`select now() as now`)
    return { now: clock[0].now, charges: [] }
  }
  return { now: rows[0].now, charges: rows.map((r) => ({ at: r.created_at, cellUpdates: Number(r.cell_updates) })) }
}
