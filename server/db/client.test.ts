// A checked-out client whose connection ends (a database restart, an administrator's kill) must not
// take the process down: node-postgres emits 'error' on the client, which ends Node without a listener.
import { describe, expect, it } from 'vitest'
import { testDatabaseUrl } from '../../tests/api/helpers'
import { createPool } from './client'

describe('createPool', () => {
  it('survives the loss of a checked-out connection; the broken client is dropped and the pool works on', async () => {
    const pool = createPool(testDatabaseUrl(), { max: 2, applicationName: 'sonoweave-client-test' })
    try {
      const held = await pool.connect()
      const { rows } = await held.query('select pg_backend_pid() as pid')
      const uncaught: unknown[] = []
      let settle: (v?: unknown) => void = () => {}
      const onUncaught = (err: unknown) => (uncaught.push(err), settle())
      process.on('uncaughtException', onUncaught)
      try {
        // Ends with the connection, or at once with the crash the process would have had.
        const ended = new Promise((r) => ((settle = r), held.once('end', r)))
        await pool.query('select pg_terminate_backend($1)', [rows[0].pid])
        await ended
      } finally {
        process.off('uncaughtException', onUncaught)
      }
      held.release(true)

      expect(uncaught).toEqual([])
      expect((await pool.query('select 1 as one')).rows[0].one).toBe(1)
    } finally {
      await pool.end()
    }
  })
})
