// A LISTEN held on one pooled connection for as long as the caller wants it, reopened after the database drops
// it. A lost connection is destroyed exactly once (never handed back twice), and a late socket error on it
// still finds a listener: an 'error' event without one would end the process.
import type { Pool, PoolClient } from 'pg'
import type { Logger } from '../logger'

export interface HeldListen {
  /** Stops listening and closes the connection; no reconnect afterwards. */
  stop(): Promise<void>
  /** True while a LISTEN connection is in place. */
  readonly listening: boolean
}

const ignore = () => {}
/** Handing back with an error destroys the connection, which ends its LISTEN without a round trip that could hang. */
const STOPPED = new Error('listener stopped')

export async function holdListen(o: {
  pool: Pool
  channel: string
  onNotification: (payload: string | undefined) => void
  /** Called after a reconnect: notifications sent while the connection was away are lost. */
  onReconnect?: () => void
  log?: Logger
  /** What the log lines call this listener. */
  name: string
  retryMs?: number
}): Promise<HeldListen> {
  const retryMs = o.retryMs ?? 1_000
  let stopped = false
  let client: PoolClient | null = null
  let handBackHeld: ((err?: Error) => void) | null = null
  let retry: NodeJS.Timeout | null = null
  let lostOnce = false
  const later = () => {
    if (!stopped && !retry) retry = setTimeout(() => ((retry = null), void open()), retryMs)
  }
  const open = async (): Promise<void> => {
    let c: PoolClient
    try {
      c = await o.pool.connect()
    } catch (err) {
      o.log?.warn({ err }, `${o.name}: could not reach the database; retrying`)
      lostOnce = true
      return later()
    }
    let handedBack = false
    const handBack = (err?: Error) => {
      if (handedBack) return
      handedBack = true
      c.removeListener('notification', onNotification)
      c.removeListener('error', onError)
      if (err) c.on('error', ignore)
      c.release(err ?? false)
    }
    const onNotification = (n: { channel: string; payload?: string }) => {
      if (n.channel === o.channel) o.onNotification(n.payload)
    }
    const onError = (err: Error) => {
      if (client === c) (client = null), (handBackHeld = null)
      handBack(err)
      o.log?.warn({ err }, `${o.name}: connection lost; reconnecting`)
      lostOnce = true
      later()
    }
    c.on('notification', onNotification)
    c.on('error', onError)
    try {
      await c.query(`listen ${o.channel}`)
    } catch (err) {
      handBack(err as Error)
      lostOnce = true
      return later()
    }
    if (handedBack) return // lost between the LISTEN and here; onError scheduled the retry
    if (stopped) return handBack(STOPPED)
    client = c
    handBackHeld = handBack
    if (lostOnce) o.onReconnect?.()
  }
  await open()
  return {
    get listening() {
      return client !== null
    },
    async stop() {
      stopped = true
      if (retry) clearTimeout(retry)
      retry = null
      const c = client
      const handBack = handBackHeld
      client = null
      handBackHeld = null
      if (c && handBack) handBack(STOPPED)
    },
  }
}
