// The fits API against the real PostgreSQL and pg-boss: a closed-form fit answered at once, a solver fit
// run by the fit worker through its queue, the group rules (trace and run must share a group), deleting a
// running fit, and the watchdog handing back a fit whose worker stopped sending heartbeats.
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { FitDetail, FitRequest } from '@shared/api/fits'
import { sampleAt } from '@shared/analysis/trace-align'
import { createApp } from '../../server/app'
import { runArrays, runs } from '../../server/db/schema'
import { startJobService } from '../../server/jobs/job-service'
import { FIT_QUEUE } from '../../server/jobs/queues'
import { startWatchdog } from '../../server/jobs/watchdog'
import { fitsRoutes } from '../../server/modules/fits/fits.routes'
import { tracesRoutes } from '../../server/modules/traces/traces.routes'
import { simulateSync } from '../../solver/index'
import { chipConfig, gaussian } from '../solver/chip-fixtures'
import { gaussianNoise } from '../traces/random'
import { waitFor } from '../jobs/worker-process'
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

async function storedRun(groupId: string, authorId: string, status: 'succeeded' | 'running' = 'succeeded', runConfig = config): Promise<string> {
  const [r] = await db.insert(runs).values({ groupId, authorId, title: 'Stokes amplifier', config: runConfig, configHash: 'x'.repeat(64), solverVersion: '0.1.0', status, attempt: 1 }).returning({ id: runs.id })
  if (status !== 'succeeded') return r.id
  const result = simulateSync(runConfig)
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

const bossSchema = queueSchemaFor('fits_api')
const jobs = startJobService({ databaseUrl: testDatabaseUrl(), pool, log: silentLog, threads: 1, bossSchema, watchdog: false })
afterAll(async () => (await jobs).stop())

beforeAll(async () => {
  const { boss } = await jobs
  app = createApp({ db, pool, log: silentLog, routes: [['/traces', tracesRoutes({ db })], ['/fits', fitsRoutes({ db, pool, boss })]] })
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

const jobState = async (jobId: string) => (await (await jobs).boss.getJobById(FIT_QUEUE, jobId))?.state

describe('a running fit', () => {
  it('stores the fit and its job together', async () => {
    const res = await request(app).post('/api/fits').set('Authorization', editor.auth).send(fitBody({ free: { linewidthMHz: { min: 10, max: 100 } }, maxIterations: 2 }))
    const { rows } = await pool.query(`select job_id from fits where id = $1`, [res.body.id])
    const job = await (await jobs).boss.getJobById(FIT_QUEUE, rows[0].job_id)
    expect(job?.data).toEqual({ schemaVersion: 1, fitId: res.body.id })
  })

  it('stops its thread when deleted, ends its job and leaves nothing stored', async () => {
    const { fitWorker } = await jobs
    // The same amplifier on 0.5 ps steps (about a second per model evaluation here), three parameters freed:
    // dozens of evaluations, so the fit is still running when it is deleted.
    const slowRun = await storedRun(editor.groupId, editor.userId, 'succeeded', { ...config, grid: { ...config.grid, timeStepPs: 0.5 } })
    const free = { linewidthMHz: { min: 10, max: 100 }, gainCoefficientMPerW: { min: 1e-11, max: 1e-8 }, detuningMHz: { min: -20, max: 20 } }
    const res = await request(app).post('/api/fits').set('Authorization', editor.auth).send(fitBody({ runId: slowRun, free, maxIterations: 100 }))
    expect(res.status).toBe(202)
    const id: string = res.body.id
    const { rows } = await pool.query(`select job_id from fits where id = $1`, [id])
    await waitFor('the fit thread to start', async () => fitWorker!.running().includes(id), 120_000)

    expect((await request(app).delete(`/api/fits/${id}`).set('Authorization', editor.auth)).status).toBe(204)

    await waitFor('the fit thread to stop', async () => !fitWorker!.running().includes(id), 60_000)
    expect(await jobState(rows[0].job_id)).toBe('cancelled')
    expect((await pool.query(`select 1 from fits where id = $1`, [id])).rowCount).toBe(0)
    expect((await request(app).get(`/api/fits/${id}`).set('Authorization', editor.auth)).status).toBe(404)
  })
})

describe('the watchdog', () => {
  const request_ = () => FitRequest.parse(fitBody({ free: { linewidthMHz: { min: 10, max: 100 } }, maxIterations: 10 }))

  /** A fit a worker took and then fell silent on: row running with an hour-old heartbeat, job active. */
  async function silentFit(attempt: number): Promise<{ id: string; jobId: string }> {
    const { boss } = await jobs
    const { rows } = await pool.query(
      `insert into fits (group_id, author_id, trace_id, run_id, inputs, status, attempt, started_at, heartbeat_at, message)
       values ($1, $2, $3, $4, $5, 'running', $6, now() - interval '1 hour', now() - interval '1 hour', 'Model evaluation 3') returning id`,
      [editor.groupId, editor.userId, traceId, runId, JSON.stringify(request_()), attempt],
    )
    const id: string = rows[0].id
    // Deferred, so the live worker does not fetch it, then marked taken as a worker would have.
    const jobId = (await boss.send(FIT_QUEUE, { schemaVersion: 1, fitId: id }, { startAfter: 3600 }))!
    await pool.query(`update ${bossSchema}.job set state = 'active', started_on = now(), retry_count = $2 where id = $1`, [jobId, attempt - 1])
    await pool.query(`update fits set job_id = $2 where id = $1`, [id, jobId])
    return { id, jobId }
  }

  async function withWatchdog<T>(work: () => Promise<T>): Promise<T> {
    const dog = startWatchdog({ pool, boss: (await jobs).boss, log: silentLog, staleAfterMs: 10_000, intervalMs: 200 })
    try {
      return await work()
    } finally {
      dog.stop()
    }
  }

  it('hands back a fit whose heartbeat stopped; a live worker then finishes it', async () => {
    const { id, jobId } = await silentFit(1)

    const fit = await withWatchdog(() =>
      waitFor('the fit to be finished by another worker', async () => {
        const f = FitDetail.parse((await request(app).get(`/api/fits/${id}`).set('Authorization', editor.auth)).body)
        return (f.status === 'succeeded' || f.status === 'failed') && f
      }, 120_000),
    )

    expect(fit.error).toBeNull()
    expect(fit.status).toBe('succeeded')
    expect((await pool.query(`select attempt from fits where id = $1`, [id])).rows[0].attempt).toBe(2)
    // The queue marks the job completed only once the handler has returned, just after the fit row is written.
    expect(await waitFor('the job to be completed', async () => (await jobState(jobId)) === 'completed' && 'completed')).toBe('completed')
  })

  it('fails a fit with the reason once its tries are spent', async () => {
    const { id, jobId } = await silentFit(2)

    const fit = await withWatchdog(() =>
      waitFor('the fit to be given up', async () => {
        const f = FitDetail.parse((await request(app).get(`/api/fits/${id}`).set('Authorization', editor.auth)).body)
        return f.status !== 'running' && f
      }),
    )

    expect(fit.status).toBe('failed')
    expect(fit.error).toMatch(/stopped responding; the fit was tried 2 times and is given up/)
    expect(['failed', 'cancelled']).toContain(await jobState(jobId))
  })
})
