// The pg-boss handler for the run queue: read the payload with the shared schema first, then execute.
// An unreadable payload is dropped (it will never become readable); transient faults throw, so pg-boss
// retries the job.
import type PgBoss from 'pg-boss'
import type { Pool } from 'pg'
import { RunJobPayload } from '@shared/api/runs'
import type { Logger } from '../../logger'
import { executeRun, type RunHandle, type RunOutcome } from '../run-executor'

export interface RunSimulationContext {
  pool: Pool
  log: Logger
  workerId: string
  /** The run in hand (with its job), or null once it is done. */
  track: (runId: string, handle: RunHandle | null, jobId: string) => void
  onFinished?: (outcome: RunOutcome) => void
}

export function runSimulationHandler(ctx: RunSimulationContext): (jobs: PgBoss.Job<unknown>[]) => Promise<void> {
  return async ([job]) => {
    const payload = RunJobPayload.safeParse(job.data)
    if (!payload.success) {
      ctx.log.error({ jobId: job.id, issues: payload.error.issues }, 'unreadable run job dropped')
      return
    }
    const outcome = await executeRun({
      pool: ctx.pool,
      log: ctx.log,
      runId: payload.data.runId,
      jobId: job.id,
      workerId: ctx.workerId,
      track: (runId, handle) => ctx.track(runId, handle, job.id),
    })
    if (outcome.status === 'succeeded' || outcome.status === 'failed') ctx.onFinished?.(outcome)
  }
}
