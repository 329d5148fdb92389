// How many threads advance one run: 1, or 2 with z cut into chunks the threads share (engine/threaded-engine.ts).
// Automatic: two when the run is on the WebAssembly engine's plain SVEA path, the grid is long enough for the
// per-step barriers to pay and the run long enough to pay the helper's start (THREAD_MIN_CELLS and
// THREAD_MIN_NODE_STEPS in shared/physics/resource-estimate.ts, beside the speed factor; `npm run bench --
// --threads` measures them, benchmarks/README.md), and the machine has a core to spare: at least two cores, a
// load average (runnable threads, this run's own included) below cores − ½, and, in the server, a free core in
// the count its solver threads share (engine/core-lease.ts). A busy machine keeps one thread per run: there a
// helper would only wait for its turn at every barrier.
import { availableParallelism, loadavg } from 'node:os'
import { THREAD_MIN_CELLS, THREAD_MIN_NODE_STEPS } from '@shared/physics/resource-estimate'
import type { Model } from '../problem/coupled-modes'
import { fastPathApplies } from '../steppers/interaction-kernel'
import { EngineUnavailableError } from './wasm-engine'
import type { CoreLease } from './core-lease'

/** 'auto' (default) or a forced thread count. */
export type ThreadChoice = 'auto' | number
/** Largest count the options accept: one helper thread beside the run's own (docs/numerics.md, "Threaded step"). */
export const MAX_THREADS = 2

/** A forced thread count this run cannot use; the message is for the user. */
export class ThreadCountError extends EngineUnavailableError {}

/** Why the threaded engine cannot run this model (a sentence for the user), or null when it can. */
export function threadProblem(m: Model, engine: 'ts' | 'wasm', profile: boolean): string | null {
  if (profile || !fastPathApplies(m) || m.advectionCourant > 0) return 'Two threads cover a uniform waveguide, one channel with the slowly varying acoustic envelope, no Kerr effect, no thermal noise and no acoustic advection'
  if (engine !== 'wasm') return 'Two threads run on the WebAssembly engine only; choose the automatic or the WebAssembly engine'
  return null
}

/** What the automatic choice looks at besides the model (tests pass their own). */
export interface MachineLoad {
  cores: number
  /** One-minute load average; 0 where the system gives none. */
  load: number
}
const machineNow = (): MachineLoad => ({ cores: availableParallelism(), load: loadavg()[0] })

/**
 * The thread count of a run; a forced count above 1 that cannot run throws ThreadCountError. With a lease (the
 * server's solver threads, engine/core-lease.ts) a helper is counted there, and the automatic choice takes one
 * only while a core is free in it; the caller gives it back when the run ends.
 */
export function resolveThreads(choice: ThreadChoice, m: Model, engine: 'ts' | 'wasm', profile: boolean, machine: () => MachineLoad = machineNow, lease?: CoreLease): number {
  if (choice !== 'auto') {
    if (!Number.isInteger(choice) || choice < 1 || choice > MAX_THREADS) throw new ThreadCountError(`The thread count is 1 or ${MAX_THREADS}`)
    const problem = choice > 1 ? threadProblem(m, engine, profile) : null
    if (problem) throw new ThreadCountError(problem)
    if (choice > 1) lease?.takeHelper()
    return choice
  }
  if (threadProblem(m, engine, profile) || m.nz < THREAD_MIN_CELLS || m.nodes * (m.nt + 1) < THREAD_MIN_NODE_STEPS) return 1
  const { cores, load } = machine()
  if (cores < 2 || load >= cores - 0.5) return 1
  return !lease || lease.tryTakeHelper() ? 2 : 1
}
