// A SIGKILLed worker cannot delete its own row in the workers table (which the queue view and the admin
// page read); the watchdog removes it once it has missed its presence updates, and leaves live ones.
import { afterAll, describe, expect, it } from 'vitest'
import { expireStaleWorkers } from '../../server/jobs/watchdog'
import { useTestDb } from '../api/helpers'
import { queueSchemaFor } from '../api/runs-fixtures'
import { spawnWorker, waitFor, type WorkerProcess } from './worker-process'

const { pool } = useTestDb()
const spawned: WorkerProcess[] = []
afterAll(async () => {
  await Promise.all(spawned.map((w) => w.stop()))
})

const EXPIRE_AFTER_MS = 3_000

describe('stale worker rows', () => {
  it('removes the row of a killed worker once it is older than the expiry, and keeps a live one', async () => {
    const worker = await spawnWorker(queueSchemaFor('worker-expiry'))
    spawned.push(worker)
    const pid = worker.child.pid!
    const { rows: before } = await pool.query(`select id from workers where pid = $1`, [pid])
    expect(before).toHaveLength(1)

    worker.child.kill('SIGKILL')
    await new Promise((r) => worker.child.once('exit', r))
    await waitFor('the killed worker to miss its updates', async () => {
      const { rows } = await pool.query(`select now() - last_seen_at > make_interval(secs => $2) as stale from workers where pid = $1`, [pid, EXPIRE_AFTER_MS / 1000])
      return rows[0]?.stale === true
    }, 60_000, 250)
    await pool.query(`insert into workers (id, host, pid, threads, busy) values ('live-worker', 'lab-host', 1, 2, 1)`)

    const removed = await expireStaleWorkers(pool, EXPIRE_AFTER_MS)

    expect(removed).toEqual([before[0].id])
    const { rows: after } = await pool.query(`select id from workers order by id`)
    expect(after.map((r) => r.id)).toEqual(['live-worker'])
  })
})
