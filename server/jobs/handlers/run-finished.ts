// After a run ends (succeeded or failed), its author gets an e-mail unless they opted out.
import type { Db } from '../../db/client'
import type { Logger } from '../../logger'
import { notifyRunFinished, type FinishedNotice } from '../../modules/mail/notify'
import type { RunOutcome } from '../run-executor'

export function runFinishedNotice(o: RunOutcome): FinishedNotice {
  const figures = o.manifest?.figures
  const wall = figures ? ` in ${figures.wallTimeS.toFixed(1)} s` : ''
  return o.status === 'succeeded'
    ? { title: `Run '${o.title}' succeeded`, url: `/runs/${o.runId}`, summary: `The run finished${wall}. Its traces, maps and figures of merit are ready to view and download.` }
    : { title: `Run '${o.title}' failed`, url: `/runs/${o.runId}`, summary: `The run failed: ${o.message}` }
}

/** The worker's onFinished hook; mail trouble is logged and never touches the run. */
export function notifyOnFinish(o: { db: Db; log: Logger }): (outcome: RunOutcome) => void {
  return (outcome) => {
    if (!outcome.authorId) return
    notifyRunFinished(o.db, outcome.authorId, runFinishedNotice(outcome)).catch((err) => o.log.warn({ err, runId: outcome.runId }, 'run-finished mail failed'))
  }
}
