// A fixed set of long-lived solver threads, one per configured thread of the worker, each computing one
// run at a time. Starting a thread and loading the solver's TypeScript is about half a second, as long
// as a short run itself, so threads are started once and reused. A thread that crashes, or does not stop
// within the grace period after an abort, is dropped and a fresh one takes its place.
import { availableParallelism } from 'node:os'
import { Worker } from 'node:worker_threads'
import { CoreLease } from '../../solver/index'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import type { SolverThreadInput, SolverThreadMessage, SolverThreadRequest } from './solver-thread'

const THREAD_FILE = new URL('./solver-thread.ts', import.meta.url).href
// Node 20 does not apply `--import tsx` from a worker's execArgv to the worker's own module loading, so
// the thread registers tsx's loader itself before importing the TypeScript entry.
const TSX_API = import.meta.resolve('tsx/esm/api')
const bootSource = (file: string) =>
  `import(${JSON.stringify(TSX_API)}).then(({ register }) => { register(); return import(${JSON.stringify(file)}) })`

export type ThreadResult = Extract<SolverThreadMessage, { type: 'result' }>
/** Progress and map frames of the run in hand. */
export type RunMessage = Extract<SolverThreadMessage, { type: 'progress' | 'frame' }>

export interface SolverPoolOptions {
  size: number
  /** After the abort flag is set, a thread still computing by then is terminated and replaced. */
  abortGraceMs?: number
  /** The thread's entry (a module URL); tests use a stand-in that speaks the same messages. */
  threadFile?: string
}

export interface PoolRun {
  /** The run's final message; null when it was aborted and its thread had to be terminated. Rejects when the thread crashed. */
  result: Promise<ThreadResult | null>
  /** Asks the solver to stop; the thread is free again (or replaced) within the grace period. */
  abort: () => void
}

interface Job {
  seq: number
  onMessage: (m: RunMessage) => void
  resolve: (r: ThreadResult | null) => void
  reject: (err: Error) => void
  aborted: boolean
  killTimer?: NodeJS.Timeout
}

interface Waiter {
  job: Job
  take: (slot: Slot) => void
}

/** One thread of the pool and the run it is computing, if any. */
class Slot {
  thread: Worker | null = null
  ready = false
  job: Job | null = null
  private readonly flag: Int32Array
  private readonly abortFlag = new SharedArrayBuffer(4)
  private readyWaiters: Array<{ ok: () => void; fail: (err: Error) => void }> = []

  constructor(
    private readonly pool: SolverPool,
    private readonly index: number,
  ) {
    this.flag = new Int32Array(this.abortFlag)
  }

  /** Starts the thread if there is none. */
  start(): void {
    if (this.thread) return
    this.ready = false
    const thread = new Worker(bootSource(this.pool.threadFile), { eval: true, workerData: { abortFlag: this.abortFlag, cores: this.pool.cores, slot: this.index } satisfies SolverThreadInput })
    // An idle pool must not keep its process alive; a run in hand keeps it alive by its own timers.
    thread.unref()
    this.thread = thread
    let crash: Error | null = null
    thread.on('message', (m: SolverThreadMessage) => {
      if (m.type === 'ready') {
        this.ready = true
        for (const w of this.readyWaiters.splice(0)) w.ok()
        return
      }
      const job = this.job
      if (!job || m.seq !== job.seq) return
      if (m.type === 'result') this.settle(job, () => job.resolve(m))
      else job.onMessage(m)
    })
    thread.on('error', (err) => {
      crash = err
    })
    thread.on('exit', () => {
      // A thread terminated mid-run never said it was done: its run (and helper) stop counting here.
      CoreLease.release(this.pool.cores, this.index)
      if (this.thread !== thread) return
      const wasReady = this.ready
      this.thread = null
      this.ready = false
      const err = crash ?? new Error('the solver thread exited')
      for (const w of this.readyWaiters.splice(0)) w.fail(err)
      const job = this.job
      // A crash fails the run; an exit without an error (terminated after an abort) ends it without a result.
      if (job) this.settle(job, () => (crash ? job.reject(crash) : job.resolve(null)))
      // Replace at once a thread that had booted; one that could not even load is retried on demand, not in a loop.
      if (wasReady && !this.pool.closed) this.start()
    })
  }

  whenReady(): Promise<void> {
    this.start()
    if (this.ready) return Promise.resolve()
    return new Promise((ok, fail) => this.readyWaiters.push({ ok, fail }))
  }

  /** Computes one run on this slot; the slot is busy until the returned promise settles. */
  async run(job: Job, config: SimulationConfig): Promise<void> {
    this.job = job
    try {
      await this.whenReady()
    } catch (err) {
      this.settle(job, () => job.reject(err as Error))
      return
    }
    if (this.job !== job) return // ended while the thread was starting
    if (job.aborted) return this.settle(job, () => job.resolve(null))
    Atomics.store(this.flag, 0, 0)
    this.thread!.ref()
    this.thread!.postMessage({ type: 'run', seq: job.seq, config } satisfies SolverThreadRequest)
  }

  abort(job: Job): void {
    if (this.job !== job || job.aborted) return
    job.aborted = true
    if (!this.ready) {
      // Nothing was sent to the thread yet: the run ends here and the thread keeps booting for the next one.
      this.settle(job, () => job.resolve(null))
      return
    }
    Atomics.store(this.flag, 0, 1)
    job.killTimer = setTimeout(() => void this.thread?.terminate(), this.pool.abortGraceMs)
  }

  /** Ends the run in hand: drops every reference to it (its callbacks hold its buffers) and frees the slot. */
  private settle(job: Job, finish: () => void): void {
    if (this.job !== job) return
    clearTimeout(job.killTimer)
    this.job = null
    this.thread?.unref()
    finish()
    this.pool.release(this)
  }

  async close(): Promise<void> {
    const t = this.thread
    this.thread = null
    this.ready = false
    for (const w of this.readyWaiters.splice(0)) w.fail(new Error('the solver pool was closed'))
    const job = this.job
    if (job) this.settle(job, () => job.resolve(null))
    await t?.terminate()
  }
}

export class SolverPool {
  readonly abortGraceMs: number
  readonly threadFile: string
  closed = false
  /** Threads computing per core, shared with every solver thread (a run takes a helper thread only from a free core). */
  readonly cores: SharedArrayBuffer
  private readonly slots: Slot[]
  private readonly waiting: Waiter[] = []
  private seq = 0

  constructor(o: SolverPoolOptions) {
    if (!(o.size >= 1)) throw new Error('a solver pool needs at least one thread')
    this.abortGraceMs = o.abortGraceMs ?? 500
    this.threadFile = o.threadFile ?? THREAD_FILE
    this.cores = CoreLease.buffer(availableParallelism(), o.size)
    this.slots = Array.from({ length: o.size }, (_, i) => new Slot(this, i))
  }

  /** Starts every thread now and resolves once all are loaded, so the first run does not pay for the start either. */
  async warm(): Promise<void> {
    await Promise.all(this.slots.map((s) => s.whenReady()))
  }

  /** Threads computing a run now. */
  busy(): number {
    return this.slots.filter((s) => s.job).length
  }

  /** Queues a run for the next free thread (the worker never takes more runs than threads, so it rarely waits). */
  run(config: SimulationConfig, onMessage: (m: RunMessage) => void): PoolRun {
    let resolve!: (r: ThreadResult | null) => void
    let reject!: (err: Error) => void
    const result = new Promise<ThreadResult | null>((ok, fail) => ((resolve = ok), (reject = fail)))
    const job: Job = { seq: ++this.seq, onMessage, resolve, reject, aborted: false }
    let slot: Slot | null = null
    const waiter: Waiter = { job, take: (s) => ((slot = s), void s.run(job, config)) }
    const free = this.slots.find((s) => !s.job)
    if (this.closed) resolve(null)
    else if (free) waiter.take(free)
    else this.waiting.push(waiter)
    return {
      result,
      abort: () => {
        if (slot) return slot.abort(job)
        // Still waiting for a thread: leave the queue and end without a result.
        const i = this.waiting.indexOf(waiter)
        if (i >= 0) this.waiting.splice(i, 1)
        job.aborted = true
        resolve(null)
      },
    }
  }

  /** Called by a slot once its run is settled: hands it to the next waiting run. */
  release(slot: Slot): void {
    const next = this.waiting.shift()
    if (next && !this.closed) next.take(slot)
  }

  async close(): Promise<void> {
    this.closed = true
    for (const w of this.waiting.splice(0)) w.job.resolve(null)
    await Promise.all(this.slots.map((s) => s.close()))
  }
}
