// The fits API against the real PostgreSQL and pg-boss: a closed-form fit answered at once, a solver fit
// run by the fit worker through its queue, and the group rules (trace and run must share a group).
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { FitDetail } from '@shared/fits'
import { sampleAt } from '@shared/trace-align'
import { createApp } from '../../server/app'
import { runArrays, runs } from '../../server/db/schema'
import { startJobService } from '../../server/jobs/job-service'
import { fitsRoutes } from '../../server/modules/fits/fits.routes'
import { tracesRoutes } from '../../server/modules/traces/traces.routes'
import { simulateSync } from '../../solver/index'
import { chipConfig, gaussian } from '../solver/chip-fixtures'
import { gaussianNoise } from '../traces/random'
import { silentLog, testDatabaseUrl, useTestDb } from './helpers'
import { newMember, queueSchemaFor, type Member } from './runs-fixtures'

const { db, pool } = useTestDb()
let app: ReturnType<typeof createApp>
let editor: Member
let viewer: Member
let outsider: Member
let runId: string
let traceId: string

// Stokes amplifier on the test chip (CW pump 0.3 W, 1 ns Stokes pulse), 20 ps steps: a few ms per solve.
const config = chipConfig({
  windowNs: 8,
  channels: [{ pump: { pulses: [], backgroundPowerW: 0.3 }, stokes: { pulses: [gaussian(1e-3, 3, 0.6)], backgroundPowerW: 0 } }],
  grid: { timeStepPs: 20, mapRows: 16, mapCols: 16, mapReduction: 'max' },
})

async function storedRun(groupId: string, authorId: string, status: 'succeeded' | 'running' = 'succeeded'): Promise<string> {
  const [r] = await db.insert(runs).values({ groupId, authorId, title: 'Stokes amplifier', config, configHash: 'x'.repeat(64), solverVersion: '0.1.0', status, attempt: 1 }).returning({ id: runs.id })
  if (status !== 'succeeded') return r.id
  const result = simulateSync(config)
  const rows = result.manifest.arrays
    .filter((a) => a.name === 'time_ns' || a.name.startsWith('ch1_'))
    .map((a) => ({ runId: r.id, attempt: 1, name: a.name, dtype: a.dtype, shape: a.shape, units: a.units, description: a.description, data: Buffer.from(result.arrays[a.name].buffer) }))
  await db.insert(runArrays).values(rows)
  return r.id
}

/** The run's Stokes output, delayed 0.25 ns, ×800 (a detector in V at 800 V/W), 1 % noise, as CSV in µs and V. */
function measuredCsv(): Buffer {
  const r = simulateSync(config)
  const a = r.channels[0].stokesOut
  const model = { timeNs: r.timeNs, values: Float64Array.from({ length: a.length / 2 }, (_, i) => a[2 * i] ** 2 + a[2 * i + 1] ** 2) }
  const noise = gaussianNoise(21)
  const lines = ['time (us),detector (V)']
  const peak = 800 * Math.max(...Array.from(model.values))
  for (let t = 1; t <= 7.5; t += 0.02) lines.push(`${(t / 1000).toFixed(8)},${(800 * sampleAt(model, t - 0.25) + 0.01 * peak * noise()).toExponential(6)}`)
  return Buffer.from(lines.join('\n'))
}

const jobs = startJobService({ databaseUrl: testDatabaseUrl(), pool, log: silentLog, threads: 1, bossSchema: queueSchemaFor('fits_api'), watchdog: false })
afterAll(async () => (await jobs).stop())

beforeAll(async () => {
  const { boss } = await jobs
  app = createApp({ db, pool, log: silentLog, routes: [['/traces', tracesRoutes({ db })], ['/fits', fitsRoutes({ db, boss })]] })
  editor = await newMember(db, 'editor')
  viewer = await newMember(db, 'viewer', editor.groupId, 'Mei Okafor')
  outsider = await newMember(db, 'editor', undefined, 'Other Lab')
  runId = await storedRun(editor.groupId, editor.userId)
  const settings = { groupId: editor.groupId, name: 'Amplified Stokes pulse', timeColumn: 0, timeUnit: 'us', signalColumns: [1], signalUnit: 'V', responsivityVPerW: 800 }
  const up = await request(app).post('/api/traces').set('Authorization', editor.auth).attach('file', measuredCsv(), 'amp.csv').field('settings', JSON.stringify(settings))
  expect(up.status).toBe(201)
  traceId = up.body.id
})

const fitBody = (extra: Record<string, unknown> = {}) => ({ traceId, runId, port: 'stokesOut', timeOffsetNs: { min: -1, max: 1 }, ...extra })

describe('POST /api/fits', () => {
  it('solves offset and scale in closed form at once (201) and keeps the inputs for reopening', async () => {
    const res = await request(app).post('/api/fits').set('Authorization', editor.auth).send(fitBody())

    expect(res.status).toBe(201)
    const fit = FitDetail.parse(res.body)
    expect(fit.status).toBe('succeeded')
    expect(fit.inputs).toMatchObject({ traceId, runId, port: 'stokesOut' })
    const [offset, scale] = fit.result!.models[0].parameters
    // Volts were turned into watts by the 800 V/W responsivity: the scale is 1 within noise.
    expect(offset.value).toBeCloseTo(0.25, 2)
    expect(scale.value).toBeCloseTo(1, 1)
    const again = FitDetail.parse((await request(app).get(`/api/fits/${fit.id}`).set('Authorization', viewer.auth)).body)
    expect(again.result).toEqual(fit.result)
  })

  it('queues a fit with a freed linewidth (202); the fit worker finishes it with progress and uncertainties', async () => {
    const res = await request(app)
      .post('/api/fits')
      .set('Authorization', editor.auth)
      .send(fitBody({ free: { linewidthMHz: { min: 10, max: 100 } }, maxIterations: 10 }))
    expect(res.status).toBe(202)
    expect(res.body.status).toBe('queued')

    let fit = FitDetail.parse(res.body)
    const deadline = Date.now() + 90_000
    while (fit.status !== 'succeeded' && fit.status !== 'failed' && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 500))
      fit = FitDetail.parse((await request(app).get(`/api/fits/${fit.id}`).set('Authorization', editor.auth)).body)
    }

    expect(fit.error).toBeNull()
    expect(fit.status).toBe('succeeded')
    expect(fit.result!.method).toBe('levenbergMarquardt')
    const width = fit.result!.models[0].parameters.find((p) => p.name === 'linewidthMHz')!
    // The measurement was made with the run's own 34 MHz.
    expect(Math.abs(width.value - 34)).toBeLessThan(3 * width.uncertainty!)
    expect(fit.message).toMatch(/Done after \d+ model evaluations/)
  })

  it('refuses a viewer (403), a non-member (404), a run of another group (404) and an unfinished run (409)', async () => {
    const otherRun = await storedRun(outsider.groupId, outsider.userId)
    const running = await storedRun(editor.groupId, editor.userId, 'running')

    expect((await request(app).post('/api/fits').set('Authorization', viewer.auth).send(fitBody())).status).toBe(403)
    expect((await request(app).post('/api/fits').set('Authorization', outsider.auth).send(fitBody())).status).toBe(404)
    expect((await request(app).post('/api/fits').set('Authorization', editor.auth).send(fitBody({ runId: otherRun }))).status).toBe(404)
    expect((await request(app).post('/api/fits').set('Authorization', editor.auth).send(fitBody({ runId: running }))).status).toBe(409)
  })

  it('rejects bad bounds with 400 and the field path', async () => {
    const res = await request(app)
      .post('/api/fits')
      .set('Authorization', editor.auth)
      .send(fitBody({ timeOffsetNs: { min: 1, max: -1 }, free: { gainCoefficientMPerW: { min: 2, max: 1 } } }))

    expect(res.status).toBe(400)
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toEqual(expect.arrayContaining(['timeOffsetNs.max', 'free.gainCoefficientMPerW.max']))
  })

  it('lists a trace’s fits for a viewer and hides them from non-members', async () => {
    const list = await request(app).get('/api/fits').query({ traceId }).set('Authorization', viewer.auth)
    expect(list.status).toBe(200)
    expect(list.body.items.length).toBeGreaterThanOrEqual(1)
    expect((await request(app).get('/api/fits').query({ traceId }).set('Authorization', outsider.auth)).status).toBe(404)
    expect((await request(app).get(`/api/fits/${list.body.items[0].id}`).set('Authorization', outsider.auth)).status).toBe(404)
  })
})
