// The run event log (table run_events) and its NOTIFY: one insert + pg_notify per event, in the caller's
// transaction when there is one, so listeners hear of an event only once it is committed and readable.
import type { RunEventKind } from '@shared/api/runs'

/** A pg Pool or PoolClient (inside a transaction). */
export interface Queryable {
  query<R extends Record<string, any> = any>(text: string, values?: unknown[]): Promise<{ rows: R[]; rowCount: number | null }>
}

/** Every process relaying live events LISTENs here; the payload is {"runId","id"}. */
export const RUN_EVENTS_CHANNEL = 'sonoweave_run_events'
/** Workers LISTEN here for runs to stop; the payload is the run id. */
export const RUN_CANCEL_CHANNEL = 'sonoweave_run_cancel'

export interface StoredRunEvent {
  id: number
  runId: string
  attempt: number
  kind: RunEventKind
  payload: Record<string, unknown>
}

export async function appendRunEvent(q: Queryable, runId: string, attempt: number, kind: RunEventKind, payload: Record<string, unknown>): Promise<number> {
  const { rows } = await q.query<{ id: string }>(
    `with e as (insert into run_events (run_id, attempt, kind, payload) values ($1, $2, $3, $4) returning id)
     select e.id, pg_notify($5, json_build_object('runId', $1::text, 'id', e.id)::text) from e`,
    [runId, attempt, kind, JSON.stringify(payload), RUN_EVENTS_CHANNEL],
  )
  return Number(rows[0].id)
}

/**
 * Events after `afterId` in order. Without a position, a client connecting mid-run gets what exists now:
 * the log from the latest queued/running status event on, so blocks of a lost attempt are not replayed.
 */
export async function runEventsAfter(q: Queryable, runId: string, afterId: number | null, limit = 200): Promise<StoredRunEvent[]> {
  const { rows } = await q.query(
    afterId === null
      ? `select id, run_id, attempt, kind, payload from run_events
         where run_id = $1 and id >= coalesce((select max(id) from run_events
           where run_id = $1 and kind = 'status' and payload->>'status' in ('queued', 'running')), 0)
         order by id limit $2`
      : `select id, run_id, attempt, kind, payload from run_events where run_id = $1 and id > $3 order by id limit $2`,
    afterId === null ? [runId, limit] : [runId, limit, afterId],
  )
  return rows.map((r) => ({ id: Number(r.id), runId: r.run_id, attempt: r.attempt, kind: r.kind, payload: r.payload }))
}
