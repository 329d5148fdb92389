// The estimate endpoints: a run's estimate and the sweep's carry the basis of their time (the benchmark
// figures until this server has run enough of the same kind, then its own measured speed), paused runs do
// not count, and a bad request is a 400 naming the field.
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { RunEstimateResponse, SpeedCalibration } from '@shared/api/estimates'
import { SweepEstimateResponse } from '@shared/api/sweeps'
import { chooseGrid } from '@shared/physics/grid-step'
import { predictKernel } from '@shared/physics/resource-estimate'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { createApp } from '../../server/app'
import { insertRunCost } from '../../server/modules/estimates/run-costs.repo'
import { silentLog, useTestDb } from './helpers'
import { chipRun, newMember, queueSchemaFor, runRoutesForTest, type Member } from './runs-fixtures'
import { powerSweep, sweepsForTest, tinySweepBase } from './sweeps-fixtures'

const { db, pool } = useTestDb()
const setup = runRoutesForTest(db, pool, queueSchemaFor('estimates-api')).then(async (r) => ({ ...r, sweeps: await sweepsForTest(db, pool, r.jobs.boss, { feedIntervalMs: 60_000 }) }))
// Before pool.end (hooks run in reverse): the feeder holds a LISTEN connection of the pool.
afterAll(async () => (await setup).sweeps.module.stop())
let app: ReturnType<typeof createApp>
let editor: Member

beforeAll(async () => {
  const { routes, sweeps } = await setup
  app = createApp({ db, pool, log: silentLog, routes: [...routes, ...sweeps.routes] })
  editor = await newMember(db, 'editor')
})

const post = (path: string, body: unknown, who: Member | null = editor) => {
  const r = request(app).post(`/api${path}`)
  return (who ? r.set('Authorization', who.auth) : r).send(body as object)
}
const config = chipRun()
const kernel = predictKernel(SimulationConfig.parse(config), chooseGrid(SimulationConfig.parse(config)))

/** A finished run of `kernel` at `perS` cell-updates/s: 4 s of wall time, its thread busy throughout unless cpuS says otherwise. */
const observe = (perS: number, over: { wallS?: number; cpuS?: number | null } = {}) =>
  insertRunCost(pool, { runId: null as unknown as string, kernel, cellUpdates: perS * (over.wallS ?? 4), envelopeRatio: 1, wallS: over.wallS ?? 4, cpuS: over.cpuS === undefined ? (over.wallS ?? 4) : over.cpuS })

describe('estimate endpoints', () => {
  it('without runs of this kind, the time comes from the benchmark figures, and says so', async () => {
    const res = await post('/runs/estimate', { config })
    expect(res.status).toBe(200)
    const body = RunEstimateResponse.parse(res.body)
    expect(body.ok).toBe(true)
    expect(body.estimate.timeBasis).toMatchObject({ source: 'benchmark', runs: 0, kernel })
    expect(body.estimate.timeBasis.fastSeconds).toBeLessThan(body.estimate.expectedSeconds)
    expect(body.estimate.timeBasis.slowSeconds).toBeGreaterThan(body.estimate.expectedSeconds)
    const speed = SpeedCalibration.parse((await request(app).get('/api/runs/speed').set('Authorization', editor.auth)).body)
    expect(speed.kernels).toEqual([])
  })

  it('after runs of the same kind, uses their measured speed; a paused run does not count', async () => {
    for (const perS of [20e6, 22e6, 24e6, 26e6]) await observe(perS)
    // Paused: 60 s on the clock, 1 s computing — a speed of 1/15 of the truth.
    await observe(24e6 / 15, { wallS: 60, cpuS: 1 })
    const res = await post('/runs/estimate', { config })
    const body = RunEstimateResponse.parse(res.body)
    expect(body.estimate.timeBasis).toMatchObject({ source: 'recent-runs', runs: 4, kernel })
    // Weighted median of 26, 24, 22, 20 M/s (newest first, weights 1, 0.9, 0.81, 0.729): ascending, the cumulative
    // weight 0.729, 1.539, 2.439 first reaches half the total 3.439 at 24 M/s (the plain median would be 23).
    expect(body.estimate.cellUpdatesPerS).toBeCloseTo(24e6, -3)
    expect(body.estimate.expectedSeconds).toBeCloseTo(body.estimate.cellUpdates / body.estimate.cellUpdatesPerS, 9)
    const speed = SpeedCalibration.parse((await request(app).get('/api/runs/speed').set('Authorization', editor.auth)).body)
    expect(speed.kernels).toHaveLength(1)
    expect(speed.kernels[0]).toMatchObject({ kernel, runs: 4 })
  })

  it('a submitted run stores the estimate with its basis, and a sweep estimate carries it too', async () => {
    const created = await post('/runs', { groupId: editor.groupId, title: 'Calibrated', config })
    expect(created.status).toBe(202)
    const { rows } = await pool.query(`select estimate from runs where id = $1`, [created.body.id])
    expect(rows[0].estimate.timeBasis).toMatchObject({ source: 'recent-runs', runs: 4 })
    const base = tinySweepBase()
    const sweepKernel = predictKernel(SimulationConfig.parse(base), chooseGrid(SimulationConfig.parse(base)))
    const res = await post('/sweeps/estimate', { baseConfig: base, axes: powerSweep(editor.groupId, '', 3).axes })
    expect(res.status).toBe(200)
    const body = SweepEstimateResponse.parse(res.body)
    expect(body.estimate.timeBasis).toMatchObject({ source: sweepKernel.path === kernel.path && sweepKernel.engine === kernel.engine ? 'recent-runs' : 'benchmark', kernel: sweepKernel })
  })

  it('refuses a bad request with a 400 naming the field, and callers not signed in with 401', async () => {
    const bad = await post('/runs/estimate', { config: { ...config, windowNs: -5 } })
    expect(bad.status).toBe(400)
    expect(bad.body.error.fields.map((f: { path: string }) => f.path)).toContain('config.windowNs')
    const missing = await post('/runs/estimate', {})
    expect(missing.status).toBe(400)
    expect(missing.body.error.fields.map((f: { path: string }) => f.path)).toContain('config')
    expect((await post('/runs/estimate', { config }, null)).status).toBe(401)
    expect((await request(app).get('/api/runs/speed')).status).toBe(401)
  })
})
