// The relay against a stand-in pool whose connections can be dropped and whose connect() can fail, as
// they do while PostgreSQL restarts. node-postgres throws when a client is released twice; the stand-in
// does the same, so a double release fails the test instead of passing silently.
import { EventEmitter } from 'node:events'
import type { Pool } from 'pg'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { RELAY_BACKOFF, RunEventRelay } from './run-event-relay'
import { RUN_EVENTS_CHANNEL } from './run-events.repo'

class FakeClient extends EventEmitter {
  queries: string[] = []
  releases: Array<unknown> = []
  failQueries = false
  async query(sql: string) {
    this.queries.push(sql)
    if (this.failQueries) throw new Error('Connection terminated unexpectedly')
    return { rows: [] }
  }
  release(err?: unknown) {
    if (this.releases.length > 0) throw new Error('Release called on client which has already been released to the pool.')
    this.releases.push(err)
    // node-postgres's pool listens for errors of the clients it keeps, not of those it destroys.
    if (!err) this.on('error', () => {})
  }
  notify(runId: string) {
    this.emit('notification', { channel: RUN_EVENTS_CHANNEL, payload: JSON.stringify({ runId }) })
  }
}

class FakePool {
  clients: FakeClient[] = []
  down = false
  connects = 0
  async connect() {
    this.connects++
    if (this.down) throw new Error('connect ECONNREFUSED 127.0.0.1:5432')
    const c = new FakeClient()
    this.clients.push(c)
    return c
  }
}

const uncaught: unknown[] = []
const onUncaught = (err: unknown) => uncaught.push(err)

describe('RunEventRelay', () => {
  let pool: FakePool
  let relay: RunEventRelay

  beforeEach(() => {
    vi.useFakeTimers()
    process.on('unhandledRejection', onUncaught)
    uncaught.length = 0
    pool = new FakePool()
    relay = new RunEventRelay(pool as unknown as Pool)
  })

  afterEach(() => {
    relay.close()
    vi.useRealTimers()
    process.off('unhandledRejection', onUncaught)
  })

  it('hands a closed stream’s connection back once, and ignores its later loss', async () => {
    const unsubscribe = await relay.subscribe('run-a', () => {})
    const [c] = pool.clients

    unsubscribe()
    unsubscribe()
    await vi.advanceTimersByTimeAsync(0)
    // The database restarts after the connection went back to the pool.
    c.emit('error', new Error('terminating connection due to administrator command'))

    expect(c.queries).toEqual([`listen ${RUN_EVENTS_CHANNEL}`, `unlisten ${RUN_EVENTS_CHANNEL}`])
    expect(c.releases).toEqual([false])
    expect(c.listenerCount('error')).toBe(1) // the pool's own
    expect(relay.listening).toBe(false)
  })

  it('destroys a connection lost while its stream is open, reconnects with backoff and wakes the watcher', async () => {
    const wake = vi.fn()
    await relay.subscribe('run-a', wake)
    const [first] = pool.clients
    pool.down = true

    first.emit('error', new Error('terminating connection due to administrator command'))
    // Three failed attempts: 250, 500 and 1000 ms apart.
    await vi.advanceTimersByTimeAsync(RELAY_BACKOFF.firstMs * (1 + 2 + 4))
    const failedAttempts = pool.connects - 1
    pool.down = false
    await vi.advanceTimersByTimeAsync(RELAY_BACKOFF.firstMs * 8)

    expect(first.releases).toHaveLength(1)
    expect(first.releases[0]).toBeInstanceOf(Error)
    // The destroyed client's socket may still report its end; that must not be an unheard 'error'.
    expect(() => first.emit('error', new Error('read ECONNRESET'))).not.toThrow()
    expect(failedAttempts).toBe(3)
    expect(pool.clients).toHaveLength(2)
    expect(pool.clients[1].queries).toEqual([`listen ${RUN_EVENTS_CHANNEL}`])
    expect(relay.listening).toBe(true)
    expect(wake).toHaveBeenCalledTimes(1) // once, to catch up from the log
    pool.clients[1].notify('run-a')
    expect(wake).toHaveBeenCalledTimes(2)
    expect(uncaught).toEqual([])
  })

  it('caps the backoff at its maximum while the database stays away', async () => {
    await relay.subscribe('run-a', () => {})
    pool.down = true
    pool.clients[0].emit('error', new Error('gone'))
    await vi.advanceTimersByTimeAsync(60_000)
    const before = pool.connects

    await vi.advanceTimersByTimeAsync(RELAY_BACKOFF.maxMs * 3)

    expect(pool.connects - before).toBe(3)
    expect(uncaught).toEqual([])
  })

  it('still subscribes while the database is down, and listens once it is back', async () => {
    pool.down = true
    const wake = vi.fn()

    const unsubscribe = await relay.subscribe('run-a', wake)
    pool.down = false
    await vi.advanceTimersByTimeAsync(RELAY_BACKOFF.firstMs)

    expect(relay.listening).toBe(true)
    expect(wake).toHaveBeenCalledTimes(1)
    unsubscribe()
    await vi.advanceTimersByTimeAsync(0)
    expect(pool.clients[0].releases).toEqual([false])
    expect(uncaught).toEqual([])
  })

  it('destroys a connection whose LISTEN fails, and one whose UNLISTEN fails, once each', async () => {
    const unsubscribe = await relay.subscribe('run-a', () => {})
    const [c] = pool.clients
    c.failQueries = true

    unsubscribe()
    await vi.advanceTimersByTimeAsync(0)
    c.emit('error', new Error('late'))

    expect(c.releases).toHaveLength(1)
    expect(c.releases[0]).toBeInstanceOf(Error)

    pool.connect = async function (this: FakePool) {
      const bad = new FakeClient()
      bad.failQueries = true
      this.clients.push(bad)
      return bad
    }
    await relay.subscribe('run-b', () => {})
    expect(pool.clients[1].releases).toHaveLength(1)
    expect(relay.listening).toBe(false)
    expect(uncaught).toEqual([])
  })

  it('stops retrying once the last watcher leaves, and after close()', async () => {
    const unsubscribe = await relay.subscribe('run-a', () => {})
    pool.down = true
    pool.clients[0].emit('error', new Error('gone'))
    unsubscribe()
    const before = pool.connects

    await vi.advanceTimersByTimeAsync(60_000)

    expect(pool.connects).toBe(before)
    relay.close()
    expect(await relay.subscribe('run-b', () => {}).then((u) => typeof u)).toBe('function')
    expect(relay.watching).toBe(0)
    await vi.advanceTimersByTimeAsync(60_000)
    expect(pool.connects).toBe(before)
  })
})
