// The one place queue policy is declared: names, priorities, retry and expiry of both queues. pg-boss 10 facts this relies on (docs/operations.md, the job queue): it has no
// heartbeat, expireIn is also a hard runtime limit (an expired handler is retried while it still runs),
// createQueue does not update an existing queue's options, and send() to an unknown queue returns null.
import PgBoss from 'pg-boss'

export const RUN_QUEUE = 'solver-runs'

export const RUN_QUEUE_OPTIONS = {
  // pg-boss 10's ceiling (it refuses more than 24 h). Far longer than any run the resource limits admit
  // (2e10 cell-updates ≈ 11 min on one core), so a healthy run is never cut off; lost workers are found
  // by our own heartbeat instead (watchdog.ts).
  expireInSeconds: 24 * 3600 - 60,
  // Tries after the first when a worker is lost; a run that kills its worker every time ends failed.
  retryLimit: 3,
  retryDelay: 0,
  retryBackoff: false,
  // Finished jobs are only bookkeeping: the run row holds the outcome.
  retentionDays: 7,
} as const

export const FIT_QUEUE = 'trace-fits'

/**
 * A fit is CPU work of minutes (each Levenberg–Marquardt step is several solver runs), so it has its own queue:
 * fits never wait behind, or block, simulation runs. One priority for all fits: first come, first served.
 */
export const FIT_QUEUE_OPTIONS = {
  // Also the hard runtime limit: far above the 100-iteration cap on the small grids fits use. A lost worker's
  // fit is found by its heartbeat (watchdog.ts), not by this.
  expireInSeconds: 6 * 3600,
  // Tries after the first when a worker is lost; a fit that kills its worker twice ends failed.
  retryLimit: 1,
  retryDelay: 5,
  retentionDays: 7,
} as const

/**
 * pg-boss fetches `priority desc, created_on`. A single run is sent with SINGLE_RUN_PRIORITY minus its rank in
 * its author's line (fair-priority.ts), a rank of at most MAX_SINGLE_RUN_RANK; fed sweep points sit below every
 * single run, so a sweep never starves interactive work. A run handed back after a lost worker keeps its rank.
 */
export const SINGLE_RUN_PRIORITY = 0
// pg-boss stores priority as a 32-bit integer; the sweep priority below must fit too.
export const MAX_SINGLE_RUN_RANK = 1_000_000_000
export const SWEEP_POINT_PRIORITY = SINGLE_RUN_PRIORITY - MAX_SINGLE_RUN_RANK - 1

/** Most often a worker asks pg-boss for a job (s); 0.5 is pg-boss 10's minimum. */
export const POLL_INTERVAL_S = 0.5

export const DEFAULT_BOSS_SCHEMA = 'pgboss'

export interface BossOptions {
  databaseUrl: string
  /** A separate pg-boss schema per test file keeps parallel test files from taking each other's jobs. */
  schema?: string
  applicationName?: string
  /** Connections pg-boss may hold. */
  max?: number
}

export function createBoss(o: BossOptions): PgBoss {
  return new PgBoss({
    connectionString: o.databaseUrl,
    schema: o.schema ?? DEFAULT_BOSS_SCHEMA,
    application_name: o.applicationName ?? 'sonoweave-queue',
    max: o.max ?? 4,
    // Expiry is not how we recover lost runs (the watchdog is), so maintenance need not be frequent.
    maintenanceIntervalSeconds: 120,
  })
}

const QUEUES = [
  [RUN_QUEUE, RUN_QUEUE_OPTIONS],
  [FIT_QUEUE, FIT_QUEUE_OPTIONS],
] as const

/** Creates each queue when missing and applies the declared policy when it already exists. */
export async function declareQueues(boss: PgBoss): Promise<void> {
  for (const [name, options] of QUEUES) {
    await boss.createQueue(name, { name, ...options })
    await boss.updateQueue(name, { name, ...options })
  }
}
