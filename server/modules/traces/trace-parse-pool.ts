// One long-lived thread that parses uploaded trace files, one file at a time, in arrival order. Parsing a
// file of 25 MB takes about a second of CPU; on the API's own thread that second would stall every other
// request. One file at a time also bounds the memory uploads can take together. The thread has a heap
// limit of its own: a file that would exhaust it costs the thread, which is replaced, not the server.
import { Worker } from 'node:worker_threads'
import type { TraceImportSettings } from '@shared/api/traces'
import type { ParseReply } from './trace-parse-thread'

const THREAD_FILE = new URL('./trace-parse-thread.ts', import.meta.url).href
// The thread registers tsx itself, so it loads the same way under `node --import tsx`, the worker process
// and vitest (whose workers do not pass --import on to new threads).
const BOOTSTRAP = `import(${JSON.stringify(import.meta.resolve('tsx/esm/api'))}).then((m) => { m.register(); return import(${JSON.stringify(THREAD_FILE)}) })`
/** The thread's own heap limit; a 25 MB file needs well under a tenth of it (tests/traces/parse-limits.test.ts). */
const THREAD_HEAP_MB = 384
/** A parse still running after this long is stopped; a file at the upload limit takes about a second. */
const PARSE_DEADLINE_MS = 120_000

export type ParseSuccess = Extract<ParseReply, { ok: true }>
export type ParseFailure = Extract<ParseReply, { ok: false }>

/** The thread could not finish the parse: it ran out of its memory or time (`reason`), or it crashed. */
export class ParseThreadError extends Error {
  constructor(
    message: string,
    readonly reason: 'memory' | 'deadline' | 'crash',
  ) {
    super(message)
    this.name = 'ParseThreadError'
  }
}

interface Job {
  seq: number
  bytes: Uint8Array
  settings: TraceImportSettings
  deadlineMs: number
  resolve: (r: ParseSuccess | ParseFailure) => void
  reject: (err: Error) => void
}

export interface TraceParsePoolOptions {
  /** The thread's heap limit (MB). */
  heapMb?: number
  /** How long one parse may take (ms), unless the call says otherwise. */
  deadlineMs?: number
}

export class TraceParsePool {
  /** Files parsed to an answer so far (successes and refusals), for the tests that check the thread did the work. */
  answered = 0
  private readonly heapMb: number
  private readonly deadlineMs: number
  private thread: Worker | null = null
  private ready: Promise<void> | null = null
  private queue: Job[] = []
  private current: Job | null = null
  private seq = 0

  constructor(o: TraceParsePoolOptions = {}) {
    this.heapMb = o.heapMb ?? THREAD_HEAP_MB
    this.deadlineMs = o.deadlineMs ?? PARSE_DEADLINE_MS
  }

  /** Parses `bytes` in the thread. The bytes are copied, so the caller keeps its buffer. */
  parse(bytes: Uint8Array, settings: TraceImportSettings, o: { deadlineMs?: number } = {}): Promise<ParseSuccess | ParseFailure> {
    return new Promise((resolve, reject) => {
      this.queue.push({ seq: ++this.seq, bytes, settings, deadlineMs: o.deadlineMs ?? this.deadlineMs, resolve, reject })
      this.pump()
    })
  }

  async stop(): Promise<void> {
    const t = this.thread
    this.thread = null
    this.ready = null
    for (const job of this.queue.splice(0)) job.reject(new ParseThreadError('The server is stopping', 'crash'))
    if (t) await t.terminate()
  }

  private start(): Promise<void> {
    if (this.ready) return this.ready
    const thread = new Worker(BOOTSTRAP, { eval: true, resourceLimits: { maxOldGenerationSizeMb: this.heapMb } })
    // The thread keeps the process alive only while it has a file in hand (pump refs it, finish unrefs it).
    thread.unref()
    this.thread = thread
    this.ready = new Promise<void>((ok, fail) => {
      thread.on('message', (m: ParseReply | { type: 'ready' }) => {
        if ('type' in m) return ok()
        const job = this.current
        if (!job || m.seq !== job.seq) return
        this.answered++
        this.finish(job, () => job.resolve(m))
      })
      let lost: ParseThreadError | null = null
      thread.on('error', (err: Error & { code?: string }) => {
        lost =
          err.code === 'ERR_WORKER_OUT_OF_MEMORY'
            ? new ParseThreadError(`the file needs more than the ${this.heapMb} MB of memory one upload may use`, 'memory')
            : new ParseThreadError(`the parser stopped: ${err.message}`, 'crash')
      })
      thread.on('exit', () => {
        if (this.thread !== thread) return
        this.thread = null
        this.ready = null
        const err = lost ?? new ParseThreadError('the parser stopped unexpectedly', 'crash')
        fail(err)
        const job = this.current
        if (job) this.finish(job, () => job.reject(err))
      })
    })
    // A start that failed is reported to the job that waited for it; the next job starts a fresh thread.
    this.ready.catch(() => {})
    return this.ready
  }

  private timer: NodeJS.Timeout | null = null

  private finish(job: Job, settle: () => void): void {
    if (this.current !== job) return
    if (this.timer) clearTimeout(this.timer)
    this.timer = null
    this.current = null
    settle()
    this.pump()
    if (!this.current) this.thread?.unref()
  }

  private pump(): void {
    if (this.current || this.queue.length === 0) return
    const job = this.queue.shift()!
    this.current = job
    const started = this.start()
    this.thread?.ref()
    started.then(
      () => {
        if (this.current !== job || !this.thread) return
        // A copy the thread can own (Buffer#slice would be a view: transferring it would empty the caller's).
        const bytes = new Uint8Array(job.bytes)
        this.thread.postMessage({ seq: job.seq, bytes, settings: job.settings }, [bytes.buffer])
        const thread = this.thread
        this.timer = setTimeout(() => {
          this.finish(job, () => job.reject(new ParseThreadError(`reading the file took longer than ${job.deadlineMs / 1000} s`, 'deadline')))
          if (this.thread === thread) {
            this.thread = null
            this.ready = null
          }
          void thread.terminate()
        }, job.deadlineMs)
        this.timer.unref()
      },
      (err: Error) => this.finish(job, () => job.reject(err)),
    )
  }
}

/** The server's pool: started on the first upload, stopped with the server. */
export const traceParsePool = new TraceParsePool()
