// A long-lived solver thread: takes one run at a time from its pool (solver-pool.ts) by postMessage and
// computes it off the event loop that sends heartbeats and writes results. Loading this file and the
// solver's TypeScript costs about half a second, so the thread is kept and reused between runs.
import { parentPort, workerData } from 'node:worker_threads'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { CoreLease, simulateSync, type MapFrame } from '../../solver/index'
import { solverEngine } from '../env'
import { threadCpuSeconds } from './thread-cpu'

export interface SolverThreadInput {
  /** Int32 flag: non-zero asks the solver to stop at its next chunk (a few ms). The pool clears it before each run. */
  abortFlag: SharedArrayBuffer
  /** The pool's count of computing threads per core (solver/engine/core-lease.ts) and this thread's slot in it. */
  cores: SharedArrayBuffer
  slot: number
}

/** What the pool sends: one run; the thread answers with progress and frames, then exactly one result. */
export interface SolverThreadRequest {
  type: 'run'
  seq: number
  config: SimulationConfig
}

export type SolverThreadMessage =
  | { type: 'ready' }
  | { type: 'progress'; seq: number; fraction: number }
  | { type: 'frame'; seq: number; frame: MapFrame }
  | { type: 'result'; seq: number; status: 'finished' | 'aborted' | 'failed'; message: string; manifest: unknown; arrays: Record<string, Float64Array | Float32Array>; cost?: SolverCost }

/** What the computation took on this thread (the run and its error-estimate companion): wall and CPU seconds. */
export interface SolverCost {
  wallS: number
  /** Null where the system does not give a thread's CPU time. */
  cpuS: number | null
}

/**
 * The solver hands over map rows every FRAME_INTERVAL_MS: two blocks a second is smooth enough to watch a
 * run fill in, and keeps a long run's block rows and events in the hundreds, not tens of thousands.
 */
export const FRAME_INTERVAL_MS = 500

const port = parentPort
if (!port) throw new Error('solver-thread.ts runs as a worker thread')
const input = workerData as SolverThreadInput
const flag = new Int32Array(input.abortFlag)
// A run counts its own thread while it computes, and a helper thread only when a core is free.
const lease = new CoreLease(input.cores, input.slot)
/** The step engine, from SOLVER_ENGINE (the thread inherits the process's environment). */
const engine = solverEngine()
const post = (m: SolverThreadMessage, transfer: ArrayBuffer[] = []) => port.postMessage(m, transfer)

function runOne({ seq, config }: SolverThreadRequest): void {
  // Counted from start to end of the computation; the result goes out after, so the next run sees the core free.
  lease.enter()
  let result: ReturnType<typeof simulateSync>
  const wall0 = performance.now()
  const cpu0 = threadCpuSeconds()
  try {
    result = simulateSync(config, {
      onProgress: (fraction) => post({ type: 'progress', seq, fraction }),
      onFrame: (frame) => {
        const m = frame.maps
        post({ type: 'frame', seq, frame }, [m.pumpPowerW.buffer, m.stokesPowerW.buffer, m.acousticPhononsPerM.buffer] as ArrayBuffer[])
      },
      shouldAbort: () => Atomics.load(flag, 0) !== 0,
      yieldEveryMs: FRAME_INTERVAL_MS,
      engine,
      coreLease: lease,
    })
  } finally {
    lease.leave()
  }
  const cpu1 = threadCpuSeconds()
  const cost: SolverCost = { wallS: (performance.now() - wall0) / 1000, cpuS: cpu0 !== null && cpu1 !== null ? cpu1 - cpu0 : null }
  // Transferred, not copied: the thread keeps no reference to a finished run's arrays. Each buffer once in
  // the transfer list (two views may share one).
  const buffers = new Set<ArrayBuffer>(Object.values(result.arrays).map((a) => a.buffer as ArrayBuffer))
  post({ type: 'result', seq, status: result.status, message: result.message, manifest: result.manifest, arrays: result.arrays, cost }, [...buffers])
}

// A throw inside runOne is an uncaught error of the thread: the pool fails that run and replaces the thread.
port.on('message', (m: SolverThreadRequest) => {
  if (m.type === 'run') runOne(m)
})
post({ type: 'ready' })
