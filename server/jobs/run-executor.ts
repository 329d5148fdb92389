// Executes one taken run: the solver in a worker thread, and on this thread the heartbeat, throttled
// progress, map blocks and the final all-or-nothing write.
import { Worker } from 'node:worker_threads'
import type { Pool } from 'pg'
import { SimulationConfig } from '@shared/simulation-config'
import { chooseGrid } from '@shared/grid-step'
import { estimateResources } from '@shared/resource-estimate'
import type { SimulationManifest } from '@shared/simulation-result'
import { buildRunManifest } from '../../solver/io/manifest'
import type { Logger } from '../logger'
import { claimRun, finishFailed, finishSucceeded, heartbeat, writeMapBlock, writeProgress } from './run-store'
import type { SolverThreadInput, SolverThreadMessage } from './solver-thread'

/** Heartbeat period; the watchdog's staleness threshold must be several of these. */
export const HEARTBEAT_MS = 3_000
/** At most one progress write per this period (the solver reports every 1 %). */
export const PROGRESS_INTERVAL_MS = 1_000
/** After the abort flag is set, the thread is terminated if it has not returned by then. */
const ABORT_GRACE_MS = 500

const THREAD_FILE = new URL('./solver-thread.ts', import.meta.url).href
// Node 20 does not apply `--import tsx` from a worker's execArgv to the worker's own module loading, so
// the thread registers tsx's loader itself before importing the TypeScript entry.
const TSX_API = import.meta.resolve('tsx/esm/api')
const THREAD_BOOT = `import(${JSON.stringify(TSX_API)}).then(({ register }) => { register(); return import(${JSON.stringify(THREAD_FILE)}) })`

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

type ThreadResult = Extract<SolverThreadMessage, { type: 'result' }>

/** The thread's final message, or null when it ended without one (terminated after an abort). */
function threadResult(thread: Worker, onMessage: (m: SolverThreadMessage) => void): Promise<ThreadResult | null> {
  return new Promise((resolve, reject) => {
    thread.on('message', (m: SolverThreadMessage) => (m.type === 'result' ? resolve(m) : onMessage(m)))
    thread.on('error', reject)
    thread.on('exit', () => resolve(null))
  })
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
    const message = 'The stored configuration is not valid for this solver version: ' + parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')
    await finishFailed(pool, runId, attempt, message)
    return { ...base, status: 'failed', message, manifest: null }
  }
  const config = parsed.data
  const startedAt = new Date()
  const abortFlag = new SharedArrayBuffer(4)
  const flag = new Int32Array(abortFlag)
  const thread = new Worker(THREAD_BOOT, {
    eval: true,
    workerData: { config, abortFlag } satisfies SolverThreadInput,
  })
  let stopReason: 'cancelled' | 'lost' | 'shutdown' | null = null
  let killTimer: NodeJS.Timeout | undefined
  const abort = (why: 'cancelled' | 'lost' | 'shutdown') => {
    if (stopReason) return
    stopReason = why
    Atomics.store(flag, 0, 1)
    killTimer = setTimeout(() => void thread.terminate(), ABORT_GRACE_MS)
  }
  o.track(runId, { runId, attempt, abort })

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
      result = await threadResult(thread, (m) => {
        if (m.type === 'progress') {
          pendingProgress = m.fraction
          if (Date.now() - lastProgressAt >= PROGRESS_INTERVAL_MS) flushProgress()
        } else if (m.type === 'frame') {
          const f = m.frame
          const block = { blockIndex: blockIndex++, rowStart: f.rowStart, rowCount: f.rowCount, cols: f.cols, ...f.maps }
          queueWrite(() => writeMapBlock(pool, runId, attempt, block))
        }
      })
    } catch (err) {
      // The solver thread crashed: the same config would crash again, so the run fails rather than retries.
      const message = `The solver stopped unexpectedly: ${(err as Error).message}`
      log.error({ err, runId, attempt }, 'solver thread failed')
      await writes
      await finishFailed(pool, runId, attempt, message)
      return { ...base, status: 'failed', message, manifest: null }
    }
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
    const runManifest = buildRunManifest(manifest, config, estimateResources(config, chooseGrid(config)), {
      startedAt: startedAt.toISOString(),
      finishedAt: finishedAt.toISOString(),
      wallTimeS: (finishedAt.getTime() - startedAt.getTime()) / 1000,
    })
    const stored = await finishSucceeded(pool, runId, attempt, { manifest: runManifest, figures: manifest.figures, arrays: result.arrays })
    if (!stored) return { ...base, status: 'stopped', message: 'no longer ours', manifest: null }
    return { ...base, status: 'succeeded', message: result.message, manifest }
  } finally {
    // A database error above propagates: pg-boss retries the job, and the watchdog hands the run back
    // once its heartbeat (stopped here) goes stale.
    clearInterval(beat)
    clearTimeout(killTimer)
    o.track(runId, null)
    void thread.terminate()
  }
}
