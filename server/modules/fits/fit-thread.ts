// Runs one whole fit in a worker thread: every model evaluation is a synchronous solver run, so the
// worker's event loop (heartbeats, other jobs, progress writes) stays free. Started by
// server/jobs/handlers/fit.ts through a bootstrap that registers tsx.
import { parentPort, workerData } from 'node:worker_threads'
import type { FitResult } from '@shared/api/fits'
import { runFit, type FitInputs } from './fit-engine'

export type FitThreadMessage =
  | { type: 'progress'; fraction: number; message: string }
  | { type: 'result'; result: FitResult }
  | { type: 'error'; message: string }

const port = parentPort
if (!port) throw new Error('fit-thread.ts runs as a worker thread')
const input = workerData as { inputs: FitInputs; abortFlag: SharedArrayBuffer }
const flag = new Int32Array(input.abortFlag)
const post = (m: FitThreadMessage) => port.postMessage(m)

try {
  const result = runFit(input.inputs, {
    onProgress: (fraction, message) => post({ type: 'progress', fraction, message }),
    shouldAbort: () => Atomics.load(flag, 0) !== 0,
  })
  post({ type: 'result', result })
} catch (err) {
  post({ type: 'error', message: (err as Error).message })
}
