// Runs one simulation in a worker thread, off the event loop that sends heartbeats and writes results.
// Started by run-executor.ts, which registers tsx in the thread first so this .ts file and its imports load.
import { parentPort, workerData } from 'node:worker_threads'
import type { SimulationConfig } from '@shared/simulation-config'
import { simulateSync, type MapFrame } from '../../solver/index'

export interface SolverThreadInput {
  config: SimulationConfig
  /** Int32 flag: non-zero asks the solver to stop at its next chunk (a few ms). */
  abortFlag: SharedArrayBuffer
}

export type SolverThreadMessage =
  | { type: 'progress'; fraction: number }
  | { type: 'frame'; frame: MapFrame }
  | { type: 'result'; status: 'finished' | 'aborted' | 'failed'; message: string; manifest: unknown; arrays: Record<string, Float64Array | Float32Array> }

/**
 * The solver hands over map rows every FRAME_INTERVAL_MS: two blocks a second is smooth enough to watch a
 * run fill in, and keeps a long run's block rows and events in the hundreds, not tens of thousands.
 */
export const FRAME_INTERVAL_MS = 500

const port = parentPort
if (!port) throw new Error('solver-thread.ts runs as a worker thread')
const input = workerData as SolverThreadInput
const flag = new Int32Array(input.abortFlag)
const post = (m: SolverThreadMessage, transfer: ArrayBuffer[] = []) => port.postMessage(m, transfer)

const result = simulateSync(input.config, {
  onProgress: (fraction) => post({ type: 'progress', fraction }),
  onFrame: (frame) => {
    const m = frame.maps
    post({ type: 'frame', frame }, [m.pumpPowerW.buffer, m.stokesPowerW.buffer, m.acousticPhononsPerM.buffer] as ArrayBuffer[])
  },
  shouldAbort: () => Atomics.load(flag, 0) !== 0,
  yieldEveryMs: FRAME_INTERVAL_MS,
})
// Each buffer once in the transfer list (two views may share one).
const buffers = new Set<ArrayBuffer>(Object.values(result.arrays).map((a) => a.buffer as ArrayBuffer))
post({ type: 'result', status: result.status, message: result.message, manifest: result.manifest, arrays: result.arrays }, [...buffers])
