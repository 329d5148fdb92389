// The service view for site administrators: how deep the run queue has been and how many solver threads
// were busy over the last hour, and each worker process with what it has done (GET /api/queue/activity).
import { z } from 'zod'
import { QueueWorker } from './runs'

/** One reading of the whole service, taken by the API process every sampleIntervalS. */
export const QueueSample = z.object({
  at: z.iso.datetime({ offset: true }),
  /** Runs waiting for a solver thread. */
  queued: z.number().int().nonnegative(),
  /** Runs being computed. */
  running: z.number().int().nonnegative(),
  /** Solver threads computing a run, over the workers seen in the last minute. */
  busyThreads: z.number().int().nonnegative(),
  /** Solver threads those workers have. */
  threads: z.number().int().nonnegative(),
})
export type QueueSample = z.infer<typeof QueueSample>

export const WorkerActivity = QueueWorker.extend({
  /** Runs this worker took and finished (succeeded or failed) since it started. */
  runsFinished: z.number().int().nonnegative(),
})
export type WorkerActivity = z.infer<typeof WorkerActivity>

export const QueueActivity = z.object({
  sampleIntervalS: z.number().positive(),
  /** The samples cover at most this long, oldest first; fewer after the API process has (re)started. */
  windowS: z.number().positive(),
  samples: z.array(QueueSample),
  workers: z.array(WorkerActivity),
})
export type QueueActivity = z.infer<typeof QueueActivity>
