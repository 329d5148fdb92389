// A held LISTEN must outlive its connection: the database (or an administrator) ends it, and notifications
// reach the caller again once it has reconnected; stop() ends it for good.
import { describe, expect, it } from 'vitest'
import { testDatabaseUrl } from '../../tests/api/helpers'
import { createPool } from './client'
import { holdListen } from './held-listen'

const CHANNEL = 'held_listen_test'

async function until(what: () => boolean | Promise<boolean>, label: string, ms = 20_000): Promise<void> {
  const end = Date.now() + ms
  while (!(await what())) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${label}`)
    await new Promise((r) => setTimeout(r, 50))
  }
}

describe('holdListen', () => {
  it('reconnects after its connection is killed, tells the caller, and delivers notifications again', async () => {
    const pool = createPool(testDatabaseUrl(), { max: 3, applicationName: 'sonoweave-held-listen-test' })
    const got: (string | undefined)[] = []
    let reconnects = 0
    const uncaught: unknown[] = []
    const onUncaught = (err: unknown) => uncaught.push(err)
    process.on('uncaughtException', onUncaught)
    try {
      const held = await holdListen({ pool, channel: CHANNEL, name: 'test listener', retryMs: 100, onNotification: (p) => got.push(p), onReconnect: () => reconnects++ })
      expect(held.listening).toBe(true)
      await pool.query(`select pg_notify($1, 'one')`, [CHANNEL])
      await until(() => got.includes('one'), 'the first notification')

      const listeners = async () =>
        (await pool.query(`select pid from pg_stat_activity where application_name = 'sonoweave-held-listen-test' and query ilike 'listen%'`)).rows.map((r) => r.pid as number)
      const [pid] = await listeners()
      expect(pid).toBeGreaterThan(0)
      await pool.query('select pg_terminate_backend($1)', [pid])
      await until(async () => reconnects === 1 && held.listening && (await listeners()).some((p) => p !== pid), 'the reconnect')
      await pool.query(`select pg_notify($1, 'two')`, [CHANNEL])
      await until(() => got.includes('two'), 'a notification after the reconnect')

      await held.stop()
      expect(held.listening).toBe(false)
      await until(async () => (await listeners()).length === 0, 'the listener to close')
      await pool.query(`select pg_notify($1, 'three')`, [CHANNEL])
      await new Promise((r) => setTimeout(r, 300))
      expect(got).not.toContain('three')
      expect(uncaught).toEqual([])
    } finally {
      process.off('uncaughtException', onUncaught)
      await pool.end()
    }
  })
})
