// One LISTEN connection per process relays run-event NOTIFYs to the open SSE streams of that run. The
// connection is held only while someone is watching; after a reconnect every watcher is woken so it
// catches up from the event log (nothing is lost: the log, not the NOTIFY, carries the data).
//
// The database may restart at any moment: while the connection is held, while it is being opened, or
// after it went back to the pool. Every path therefore catches its errors, a lost connection is
// reopened with a capped exponential backoff while anyone watches, and each connection is handed back
// exactly once, without our listeners on it.
import type { Pool, PoolClient } from 'pg'
import type { Logger } from '../../logger'
import { RUN_EVENTS_CHANNEL } from './run-events.repo'

type Wake = () => void
const ignore = () => {}

/** First reconnect delay and its cap: retries double from 250 ms to 10 s while the database is away. */
export const RELAY_BACKOFF = { firstMs: 250, maxMs: 10_000 }

export class RunEventRelay {
  private readonly watchers = new Map<string, Set<Wake>>()
  private client: PoolClient | null = null
  private connecting: Promise<boolean> | null = null
  private retryTimer: NodeJS.Timeout | null = null
  private failures = 0
  private closed = false

  constructor(
    private readonly pool: Pool,
    private readonly log?: Pick<Logger, 'warn' | 'info'>,
  ) {}

  /**
   * Calls `wake` after each event of the run. Resolves once the LISTEN is in place, or, when the
   * database cannot be reached, once a reconnect is scheduled (the watcher is woken when it succeeds).
   */
  async subscribe(runId: string, wake: Wake): Promise<() => void> {
    if (this.closed) return () => {}
    let set = this.watchers.get(runId)
    if (!set) this.watchers.set(runId, (set = new Set()))
    set.add(wake)
    let done = false
    const unsubscribe = () => {
      if (done) return
      done = true
      set.delete(wake)
      if (set.size === 0 && this.watchers.get(runId) === set) this.watchers.delete(runId)
      if (this.watchers.size === 0) this.stopListening()
    }
    if (!(await this.ensureListening())) this.scheduleReconnect()
    return unsubscribe
  }

  /** True when a LISTEN connection is in place afterwards; never throws. */
  private ensureListening(): Promise<boolean> {
    if (this.client) return Promise.resolve(true)
    if (this.closed || this.watchers.size === 0) return Promise.resolve(false)
    this.connecting ??= this.connect().finally(() => (this.connecting = null))
    return this.connecting
  }

  private async connect(): Promise<boolean> {
    let c: PoolClient
    try {
      c = await this.pool.connect()
    } catch (err) {
      this.log?.warn({ err }, 'run event relay: could not reach the database')
      return false
    }
    let handedBack = false
    const handBack = (err?: Error) => {
      if (handedBack) return
      handedBack = true
      c.removeListener('notification', onNotification)
      c.removeListener('error', onError)
      // A lost or failed connection is destroyed; the pool keeps only healthy ones. A destroyed client
      // can still report its socket's end (ECONNRESET), and nobody else listens to it any more: an
      // 'error' event without a listener would end the process.
      if (err) c.on('error', ignore)
      c.release(err ?? false)
    }
    const onNotification = (n: { payload?: string }) => {
      if (!n.payload) return
      try {
        const { runId } = JSON.parse(n.payload) as { runId: string }
        this.watchers.get(runId)?.forEach((w) => w())
      } catch {
        /* not ours */
      }
    }
    const onError = (err: Error) => {
      if (this.client === c) this.client = null
      handBack(err)
      this.log?.warn({ err }, 'run event relay: connection lost; reconnecting')
      this.scheduleReconnect()
    }
    c.on('notification', onNotification)
    c.on('error', onError)
    try {
      await c.query(`listen ${RUN_EVENTS_CHANNEL}`)
    } catch (err) {
      handBack(err as Error)
      return false
    }
    if (handedBack) return false // lost between the LISTEN and here
    this.client = c
    this.unlisten = async () => {
      try {
        await c.query(`unlisten ${RUN_EVENTS_CHANNEL}`)
        handBack()
      } catch (err) {
        handBack(err as Error)
      }
    }
    // Everyone left while the connection was being opened.
    if (this.watchers.size === 0 || this.closed) this.stopListening()
    return this.client === c
  }

  /** Stops the held connection's LISTEN and hands it back; set by connect() for the connection it made. */
  private unlisten: () => Promise<void> = async () => {}

  private stopListening(): void {
    if (this.retryTimer) clearTimeout(this.retryTimer)
    this.retryTimer = null
    this.failures = 0
    if (!this.client) return
    this.client = null
    void this.unlisten()
  }

  private scheduleReconnect(): void {
    if (this.retryTimer || this.closed || this.watchers.size === 0) return
    const delayMs = Math.min(RELAY_BACKOFF.maxMs, RELAY_BACKOFF.firstMs * 2 ** this.failures)
    this.failures++
    this.retryTimer = setTimeout(() => {
      this.retryTimer = null
      void this.ensureListening()
        .then((ok) => {
          if (!ok) return this.scheduleReconnect()
          this.log?.info({ attempts: this.failures }, 'run event relay: listening again')
          this.failures = 0
          this.wakeAll()
        })
        .catch((err) => this.log?.warn({ err }, 'run event relay: waking watchers failed'))
    }, delayMs)
  }

  private wakeAll(): void {
    for (const set of this.watchers.values()) set.forEach((w) => w())
  }

  /** Watchers of all runs (for tests and the load benchmark). */
  get watching(): number {
    let n = 0
    for (const set of this.watchers.values()) n += set.size
    return n
  }

  /** True while a LISTEN connection is held. */
  get listening(): boolean {
    return this.client !== null
  }

  close(): void {
    this.closed = true
    this.watchers.clear()
    this.stopListening()
  }
}
