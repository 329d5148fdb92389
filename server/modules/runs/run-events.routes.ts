// GET /api/runs/:id/events: server-sent events of one run. Each event carries its log id, so a client
// reconnecting with Last-Event-ID gets exactly the events after it; a client without one gets what exists
// now (the current attempt's status, progress and map blocks), then live events as NOTIFY announces them.
import type { Request, Response } from 'express'
import type { Pool } from 'pg'
import { FINAL_RUN_STATES, type RunBlockEvent, type RunState } from '@shared/api/runs'
import type { RunEventRelay } from './run-event-relay'
import { runEventsAfter, type StoredRunEvent } from './run-events.repo'
import type { RunRow } from './runs.repo'

/** A comment line this often keeps proxies from closing an idle stream (docs/operations.md, live streams). */
export const SSE_PING_MS = 15_000
/** What EventSource waits before reconnecting. */
const RETRY_MS = 2_000
const PAGE = 200

function lastEventId(req: Request): number | null {
  const raw = req.get('last-event-id') ?? (typeof req.query.lastEventId === 'string' ? req.query.lastEventId : undefined)
  return raw !== undefined && /^\d{1,15}$/.test(raw) ? Number(raw) : null
}

async function blockPayload(pool: Pool, e: StoredRunEvent): Promise<RunBlockEvent | null> {
  const p = e.payload as { attempt: number; blockIndex: number }
  const { rows } = await pool.query(
    `select row_start, row_count, cols, pump_power_w, stokes_power_w, acoustic_phonons_per_m from run_map_blocks where run_id = $1 and attempt = $2 and block_index = $3`,
    [e.runId, p.attempt, p.blockIndex],
  )
  if (rows.length === 0) return null // a lost attempt's block, removed when the run finished
  const b = rows[0]
  return {
    attempt: p.attempt,
    blockIndex: p.blockIndex,
    rowStart: b.row_start,
    rowCount: b.row_count,
    cols: b.cols,
    maps: { pumpPowerW: b.pump_power_w.toString('base64'), stokesPowerW: b.stokes_power_w.toString('base64'), acousticPhononsPerM: b.acoustic_phonons_per_m.toString('base64') },
  }
}

export async function streamRunEvents(req: Request, res: Response, run: RunRow, pool: Pool, relay: RunEventRelay): Promise<void> {
  let cursor = lastEventId(req)
  const isFinal = (s: unknown) => FINAL_RUN_STATES.includes(s as RunState)
  // A finished run with nothing new: 204 tells EventSource to stop reconnecting.
  if (isFinal(run.status) && cursor !== null && (await runEventsAfter(pool, run.id, cursor, 1)).length === 0) {
    res.status(204).end()
    return
  }
  res.writeHead(200, {
    'Content-Type': 'text/event-stream; charset=utf-8',
    'Cache-Control': 'no-cache, no-transform',
    'X-Accel-Buffering': 'no',
    Connection: 'keep-alive',
  })
  res.flushHeaders()
  res.write(`retry: ${RETRY_MS}\n\n`)

  let closed = false
  let pumping = false
  let again = false
  let unsubscribe: () => void = () => {}
  const finish = () => {
    if (closed) return
    closed = true
    clearInterval(ping)
    unsubscribe()
    res.end()
  }
  const pump = async (): Promise<void> => {
    if (pumping) {
      again = true
      return
    }
    pumping = true
    try {
      do {
        again = false
        const events = await runEventsAfter(pool, run.id, cursor, PAGE)
        for (const e of events) {
          if (closed) return
          const data = e.kind === 'block' ? await blockPayload(pool, e) : e.payload
          cursor = e.id
          if (data) res.write(`id: ${e.id}\nevent: ${e.kind}\ndata: ${JSON.stringify(data)}\n\n`)
          else res.write(`id: ${e.id}\n: skipped\n\n`)
          if (e.kind === 'status' && isFinal(e.payload.status)) return finish()
        }
        if (events.length === PAGE) again = true
      } while (again && !closed)
    } catch (err) {
      req.log.warn({ err, runId: run.id }, 'event stream failed')
      finish()
    } finally {
      pumping = false
    }
  }
  const ping = setInterval(() => res.write(': ping\n\n'), SSE_PING_MS)
  res.on('close', finish)
  // Listen first, then read the log: an event landing in between is caught by the wake-up.
  unsubscribe = await relay.subscribe(run.id, () => void pump())
  if (closed) unsubscribe()
  await pump()
}
