// A real worker process records what each finished run cost (the speed calibration's observations) and the
// engine, thread count and kernel in the run's manifest; the observation matches the run's own counters.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { kernelKey } from '@shared/physics/kernel-class'
import { createApp } from '../../server/app'
import { silentLog, useTestDb } from '../api/helpers'
import { chipRun, newMember, queueSchemaFor, runRoutesForTest, type Member } from '../api/runs-fixtures'
import { spawnWorker, waitFor, type WorkerProcess } from './worker-process'
import request from 'supertest'

const { db, pool } = useTestDb()
const schema = queueSchemaFor('run-costs')
const setup = runRoutesForTest(db, pool, schema)
let app: ReturnType<typeof createApp>
let editor: Member
const workers: WorkerProcess[] = []

beforeAll(async () => {
  const { routes } = await setup
  app = createApp({ db, pool, log: silentLog, routes })
  editor = await newMember(db, 'editor')
  workers.push(await spawnWorker(schema))
})
afterAll(async () => {
  await Promise.all(workers.map((w) => w.stop()))
})

describe('run cost observations', () => {
  it('a finished run stores its kernel class in the manifest and one cost row with its cell-updates and times', async () => {
    const res = await request(app).post('/api/runs').set('Authorization', editor.auth).send({ groupId: editor.groupId, title: 'Costed', config: chipRun() })
    expect(res.status).toBe(202)
    const id = res.body.id
    const run = await waitFor('the run to succeed', async () => {
      const r = (await pool.query(`select status, error, manifest from runs where id = $1`, [id])).rows[0]
      if (r.status === 'failed') throw new Error(`run failed: ${r.error}`)
      return r.status === 'succeeded' && r
    }, 120_000)
    const kernel = run.manifest.kernel
    expect(kernel).toMatchObject({ engine: expect.stringMatching(/^(ts|wasm)$/), threads: expect.any(Number), path: expect.any(String) })
    // The manifest's estimate says where its time came from: the first run of this database has no history.
    expect(run.manifest.estimate.timeBasis).toMatchObject({ source: 'benchmark', runs: 0, kernel })
    const cost = await waitFor('the cost row', async () => (await pool.query(`select * from run_costs where run_id = $1`, [id])).rows[0], 30_000)
    expect(cost.kernel).toBe(kernelKey(kernel))
    // The run and its error-estimate companion, as counted by the solver.
    const companion = run.manifest.figures?.errorEstimate?.cellUpdates ?? 0
    expect(Number(cost.cell_updates)).toBe(run.manifest.counters.cellUpdates + companion)
    expect(Number(cost.envelope_ratio)).toBe(1)
    expect(Number(cost.wall_s)).toBeGreaterThan(0)
    // The solver thread's own time is at least the solver's counted time of the run itself.
    expect(Number(cost.wall_s)).toBeGreaterThanOrEqual(run.manifest.counters.wallTimeS * 0.99)
    // Linux gives a thread's CPU time (10 ms ticks).
    expect(cost.cpu_s).not.toBeNull()
    expect(Number(cost.cpu_s)).toBeGreaterThanOrEqual(0)
  })
})
