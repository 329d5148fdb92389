// Executes one taken run: the solver on one of the worker's kept solver threads (solver-pool.ts), and on
// this thread the heartbeat, throttled progress, map blocks and the final all-or-nothing write.
import type { Pool } from 'pg'
import { describeIssuePath } from '@shared/api/issue-path-labels'
import '@shared/api/issue-messages'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { chooseGrid } from '@shared/physics/grid-step'
import { envelopeCounts, estimateResources, PLAIN_FIELDS, PLAIN_WAVES } from '@shared/physics/resource-estimate'
import type { SimulationManifest } from '@shared/physics/simulation-result'
import { buildRunManifest } from '../../solver/index'
import type { Logger } from '../logger'
import { insertRunCost } from '../modules/estimates/run-costs.repo'
import { loadSpeedCalibration } from '../modules/estimates/speed-calibration.service'
import { claimRun, finishFailed, finishSucceeded, heartbeat, writeMapBlock, writeProgress } from './run-store'
import { SolverPool, type PoolRun, type RunMessage, type ThreadResult } from './solver-pool'

/** Heartbeat period; the watchdog's staleness threshold must be several of these. */
export const HEARTBEAT_MS = 3_000
/** At most one progress write per this period (the solver reports every 1 %). */
export const PROGRESS_INTERVAL_MS = 1_000
/** After the abort flag is set, the thread is terminated (and replaced) if it has not returned by then. */
export const ABORT_GRACE_MS = 500

/** Each worker's solver threads, by worker id (worker.ts registers them; the run handler passes the id). */
const solverPools = new Map<string, SolverPool>()
let fallbackPool: SolverPool | null = null

export function registerSolverPool(workerId: string, pool: SolverPool | null): void {
  if (pool) solverPools.set(workerId, pool)
  else solverPools.delete(workerId)
}

function solverPoolFor(workerId: string): SolverPool {
  const pool = solverPools.get(workerId)
  if (pool) return pool
  // A caller without a registered worker still gets kept threads (one), not a thread per run.
  fallbackPool ??= new SolverPool({ size: 1, abortGraceMs: ABORT_GRACE_MS })
  return fallbackPool
}

export interface RunHandle {
  runId: string
  attempt: number
  /** Stops the solver; the thread is gone within ABORT_GRACE_MS. */
  abort: (why: 'cancelled' | 'lost' | 'shutdown') => void
}

export interface ExecuteOptions {
  pool: Pool
  log: Logger
  runId: string
  jobId: string
  workerId: string
  /** Called with the handle once the run is taken, and with null when it is done. */
  track: (runId: string, handle: RunHandle | null) => void
}

export interface RunOutcome {
  runId: string
  attempt: number
  status: 'succeeded' | 'failed' | 'stopped' | 'skipped'
  authorId: string | null
  title: string
  message: string
  manifest: SimulationManifest | null
}

/** Channels are named by number only when there are several. */
const channelCountOf = (config: unknown) => {
  const ch = (config as { channels?: unknown } | null)?.channels
  return Array.isArray(ch) ? ch.length : 1
}

export async function executeRun(o: ExecuteOptions): Promise<RunOutcome> {
  const { pool, log, runId } = o
  const claim = await claimRun(pool, runId, o.workerId, o.jobId)
  if (!claim.ok) {
    // Cancelled while queued, already finished, or deleted: nothing to do (pg-boss completes the job).
    log.info({ runId, reason: claim.reason, status: claim.status }, 'run not taken')
    return { runId, attempt: 0, status: 'skipped', authorId: null, title: '', message: claim.reason, manifest: null }
  }
  const { attempt } = claim
  const base = { runId, attempt, authorId: claim.authorId, title: claim.title }
  const parsed = SimulationConfig.safeParse(claim.config)
  if (!parsed.success) {
    const message = 'The stored configuration is not valid for this solver version: ' + parsed.error.issues.map((i) => `${describeIssuePath(i.path, channelCountOf(claim.config))}: ${i.message}`).join('; ')
    await finishFailed(pool, runId, attempt, message)
    return { ...base, status: 'failed', message, manifest: null }
  }
  const config = parsed.data
  const startedAt = new Date()
  let stopReason: 'cancelled' | 'lost' | 'shutdown' | null = null
  let solving: PoolRun | null = null
  const abort = (why: 'cancelled' | 'lost' | 'shutdown') => {
    if (stopReason) return
    stopReason = why
    solving?.abort()
  }

  // Writes go one after another so events keep the solver's order; the final write waits for them.
  let writes: Promise<unknown> = Promise.resolve()
  const queueWrite = (w: () => Promise<boolean>) => {
    writes = writes.then(w).then(
      (stillOurs) => (stillOurs === false ? abort('lost') : undefined),
      (err) => log.warn({ err, runId }, 'a progress write failed'),
    )
  }
  let lastProgressAt = 0
  let pendingProgress: number | null = null
  let blockIndex = 0
  const flushProgress = () => {
    if (pendingProgress === null) return
    const f = pendingProgress
    pendingProgress = null
    lastProgressAt = Date.now()
    queueWrite(() => writeProgress(pool, runId, attempt, f))
  }
  const onThreadMessage = (m: RunMessage) => {
    if (m.type === 'progress') {
      pendingProgress = m.fraction
      if (Date.now() - lastProgressAt >= PROGRESS_INTERVAL_MS) flushProgress()
    } else {
      const f = m.frame
      const block = { blockIndex: blockIndex++, rowStart: f.rowStart, rowCount: f.rowCount, cols: f.cols, ...f.maps }
      queueWrite(() => writeMapBlock(pool, runId, attempt, block))
    }
  }

  solving = solverPoolFor(o.workerId).run(config, onThreadMessage)
  o.track(runId, { runId, attempt, abort })
  const beat = setInterval(() => {
    heartbeat(pool, runId, attempt).then(
      (ours) => (ours ? undefined : abort('lost')),
      (err) => log.warn({ err, runId }, 'heartbeat failed'),
    )
    if (pendingProgress !== null) flushProgress()
  }, HEARTBEAT_MS)

  try {
    let result: ThreadResult | null
    try {
      result = await solving.result
    } catch (err) {
      // The solver thread crashed: the same config would crash again, so the run fails rather than retries.
      const message = `The solver stopped unexpectedly: ${(err as Error).message}`
      log.error({ err, runId, attempt }, 'solver thread failed')
      await writes
      await finishFailed(pool, runId, attempt, message)
      return { ...base, status: 'failed', message, manifest: null }
    }
    // The last reported progress is written too, not left to a throttle window that the run outlived: a
    // short run on a warm thread finishes well inside one PROGRESS_INTERVAL_MS.
    if (!stopReason && result?.status === 'finished') flushProgress()
    await writes
    if (stopReason || !result || result.status === 'aborted') {
      log.info({ runId, attempt, stopReason }, 'run stopped')
      return { ...base, status: 'stopped', message: stopReason ?? 'stopped', manifest: null }
    }
    const manifest = result.manifest as SimulationManifest
    if (result.status === 'failed') {
      await finishFailed(pool, runId, attempt, result.message)
      return { ...base, status: 'failed', message: result.message, manifest }
    }
    const finishedAt = new Date()
    // The estimate with this server's measured speed as it stood when the run ended (this run not yet counted).
    const estimate = estimateResources(config, chooseGrid(config), 1, await loadSpeedCalibration(pool, log))
    const runManifest = buildRunManifest(manifest, config, estimate, {
      startedAt: startedAt.toISOString(),
      finishedAt: finishedAt.toISOString(),
      wallTimeS: (finishedAt.getTime() - startedAt.getTime()) / 1000,
    })
    const stored = await finishSucceeded(pool, runId, attempt, { manifest: runManifest, figures: manifest.figures, arrays: result.arrays })
    if (!stored) return { ...base, status: 'stopped', message: 'no longer ours', manifest: null }
    await recordCost(o, config, manifest, result.cost)
    return { ...base, status: 'succeeded', message: result.message, manifest }
  } finally {
    // A database error above propagates: pg-boss retries the job, and the watchdog hands the run back
    // once its heartbeat (stopped here) goes stale.
    clearInterval(beat)
    o.track(runId, null)
  }
}

/**
 * What the finished run cost, for the speed calibration of later estimates (modules/estimates/). The run is
 * stored already: a failed write here costs one observation, never the run.
 */
async function recordCost(o: ExecuteOptions, config: SimulationConfig, manifest: SimulationManifest, cost: ThreadResult['cost']): Promise<void> {
  if (!manifest.kernel || !cost) return
  const { waves, fields } = envelopeCounts(config)
  // The error estimate's companion ran in the same measured time.
  const cellUpdates = manifest.counters.cellUpdates + (manifest.figures?.errorEstimate?.cellUpdates ?? 0)
  const observation = { runId: o.runId, kernel: manifest.kernel, cellUpdates, envelopeRatio: (waves + fields) / (PLAIN_WAVES + PLAIN_FIELDS), wallS: cost.wallS, cpuS: cost.cpuS }
  await insertRunCost(o.pool, observation).catch((err) => o.log.warn({ err, runId: o.runId }, 'the run cost was not recorded'))
}
