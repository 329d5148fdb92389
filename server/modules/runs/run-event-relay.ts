// One LISTEN connection per process relays run-event NOTIFYs to the open SSE streams of that run. The
// connection is held only while someone is watching; after a reconnect every watcher is woken so it
// catches up from the event log (nothing is lost: the log, not the NOTIFY, carries the data).
import type { Pool, PoolClient } from 'pg'
import { RUN_EVENTS_CHANNEL } from './run-events.repo'

type Wake = () => void

export class RunEventRelay {
  private readonly watchers = new Map<string, Set<Wake>>()
  private client: PoolClient | null = null
  private connecting: Promise<void> | null = null
  private closed = false

  constructor(private readonly pool: Pool) {}

  /** Calls `wake` after each event of the run; resolves once the LISTEN is in place. */
  async subscribe(runId: string, wake: Wake): Promise<() => void> {
    let set = this.watchers.get(runId)
    if (!set) this.watchers.set(runId, (set = new Set()))
    set.add(wake)
    await this.ensureListening()
    return () => {
      set.delete(wake)
      if (set.size === 0) this.watchers.delete(runId)
      if (this.watchers.size === 0) this.release()
    }
  }

  private ensureListening(): Promise<void> {
    if (this.client || this.closed) return Promise.resolve()
    this.connecting ??= (async () => {
      try {
        const c = await this.pool.connect()
        c.on('notification', (n) => {
          if (!n.payload) return
          try {
            const { runId } = JSON.parse(n.payload) as { runId: string }
            this.watchers.get(runId)?.forEach((w) => w())
          } catch {
            /* not ours */
          }
        })
        c.on('error', () => {
          if (this.client === c) this.client = null
          c.release(true)
          if (this.watchers.size > 0 && !this.closed) {
            setTimeout(() => void this.ensureListening().then(() => this.wakeAll()), 1_000)
          }
        })
        await c.query(`listen ${RUN_EVENTS_CHANNEL}`)
        this.client = c
      } finally {
        this.connecting = null
      }
    })()
    return this.connecting
  }

  private wakeAll(): void {
    for (const set of this.watchers.values()) set.forEach((w) => w())
  }

  private release(): void {
    const c = this.client
    this.client = null
    if (c) void c.query(`unlisten ${RUN_EVENTS_CHANNEL}`).finally(() => c.release())
  }

  close(): void {
    this.closed = true
    this.watchers.clear()
    this.release()
  }
}
