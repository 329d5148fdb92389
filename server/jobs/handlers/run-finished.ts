// After a run ends (succeeded or failed), its author gets an e-mail unless their setting is off. A
// sweep's points send none: the sweep mails one digest when its last point ends (sweep-finish.ts).
import { eq } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { runs } from '../../db/schema'
import type { Logger } from '../../logger'
import { notifyFinished, type FinishedNotice } from '../../modules/mail/notify'
import type { RunOutcome } from '../run-executor'

/** "38 ms", "4.2 s", "3 min 05 s", "2 h 14 min": a short run is not rounded down to "0.0 s". */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds) || seconds < 0) return ''
  if (seconds < 1) return `${Math.max(1, Math.round(seconds * 1000))} ms`
  if (seconds < 60) return `${seconds < 10 ? seconds.toFixed(1) : Math.round(seconds)} s`
  const s = Math.round(seconds)
  if (s < 3600) return `${Math.floor(s / 60)} min ${String(s % 60).padStart(2, '0')} s`
  return `${Math.floor(s / 3600)} h ${String(Math.floor((s % 3600) / 60)).padStart(2, '0')} min`
}

/**
 * wallS is the run's wall time from its stored start and finish; the solver's own timer (figures) is
 * the fallback, and neither is shown when it is unknown or zero.
 */
export function runFinishedNotice(o: RunOutcome, wallS?: number | null): FinishedNotice {
  const seconds = wallS && wallS > 0 ? wallS : (o.manifest?.figures?.wallTimeS ?? 0)
  const wall = seconds > 0 ? ` in ${formatDuration(seconds)}` : ''
  return o.status === 'succeeded'
    ? { title: `Run '${o.title}' succeeded`, url: `/runs/${o.runId}`, summary: `The run finished${wall}. Its traces, maps and figures of merit are ready to view and download.` }
    : { title: `Run '${o.title}' failed`, url: `/runs/${o.runId}`, summary: `The run failed${wall}: ${o.message}` }
}

/** Mails the author about a finished single run; a sweep point sends nothing. Returns whether a mail went out. */
export async function mailRunOutcome(db: Db, outcome: RunOutcome & { authorId: string }): Promise<boolean> {
  const [row] = await db.select({ sweepId: runs.sweepId, startedAt: runs.startedAt, finishedAt: runs.finishedAt }).from(runs).where(eq(runs.id, outcome.runId))
  if (!row || row.sweepId) return false
  const wallS = row.startedAt && row.finishedAt ? (row.finishedAt.getTime() - row.startedAt.getTime()) / 1000 : null
  return notifyFinished(db, outcome.authorId, 'run', runFinishedNotice(outcome, wallS))
}

/** The worker's onFinished hook; mail trouble is logged and never touches the run. */
export function notifyOnFinish(o: { db: Db; log: Logger }): (outcome: RunOutcome) => void {
  return (outcome) => {
    if (!outcome.authorId || (outcome.status !== 'succeeded' && outcome.status !== 'failed')) return
    mailRunOutcome(o.db, { ...outcome, authorId: outcome.authorId }).catch((err) => o.log.warn({ err, runId: outcome.runId }, 'run-finished mail failed'))
  }
}
