// GET /api/sweeps/:id/sensing-map: a detuning sweep of a pulsed pump and a CW probe on a short fibre with a
// hot spot. The points are solved in this file (no workers) and stored as a worker stores them; the route
// assembles the map, and the read rule is the sweep's (group role or share link).
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { SensingMapResponse } from '@shared/api/sensing-map'
import { SweepDetail } from '@shared/api/sweeps'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { createApp } from '../../server/app'
import { silentLog, useTestDb } from './helpers'
import { newMember, queueSchemaFor, runRoutesForTest, type Member } from './runs-fixtures'
import { powerSweep, sweepsForTest } from './sweeps-fixtures'
import { probeTrace, sensingConfig, VG_M_PER_NS, type ScanSetup } from '../solver/sensing-fixtures'
import { zipEntries } from '../e2e/zip-entries'

const { db, pool } = useTestDb()
const schema = queueSchemaFor('sensing-map')
const setup = runRoutesForTest(db, pool, schema).then(async (r) => ({ ...r, sweeps: await sweepsForTest(db, pool, r.jobs.boss, { feedIntervalMs: 60_000 }) }))
afterAll(async () => (await setup).sweeps.module.stop())

const DZ = (VG_M_PER_NS * 50) / 2
const SCAN: ScanSetup = { lengthM: 20 * DZ, pumpFwhmNs: 50, pumpPowerW: 0.2 / DZ, probePowerW: 1e-4, segments: [{ startM: 8 * DZ, endM: 11 * DZ, temperatureOffsetK: 30 }] }

let app: ReturnType<typeof createApp>
let editor: Member
let outsider: Member
let sweepId: string

const get = (path: string, who?: Member) => (who ? request(app).get(`/api${path}`).set('Authorization', who.auth) : request(app).get(`/api${path}`))

/** Solve every point of the sweep and store it as the worker does: its probe trace, then status succeeded. */
async function solvePoints(detail: SweepDetail): Promise<void> {
  for (const p of detail.points) {
    const { rows } = await pool.query('select config, attempt from runs where id = $1', [p.runId])
    const { run } = probeTrace(rows[0].config as SimulationConfig)
    const out = run.traces[0].stokesOut
    await pool.query(
      `insert into run_arrays (run_id, attempt, name, dtype, shape, units, description, data) values ($1, $2, 'ch1_stokes_out', 'c16', $3, '√W', 'probe', $4)`,
      [p.runId, rows[0].attempt, JSON.stringify([out.length / 2]), Buffer.from(out.buffer)],
    )
    const manifest = { arrays: [{ name: 'ch1_stokes_out', dtype: 'c16', shape: [out.length / 2], units: '√W', description: 'probe' }] }
    await pool.query(`update runs set status = 'succeeded', progress = 1, finished_at = now(), manifest = $2 where id = $1`, [p.runId, JSON.stringify(manifest)])
  }
}

beforeAll(async () => {
  const { routes, sweeps } = await setup
  app = createApp({ db, pool, log: silentLog, routes: [...routes, ...sweeps.routes] })
  editor = await newMember(db, 'editor', undefined, 'Ines Varga')
  outsider = await newMember(db, 'owner', undefined, 'Someone Else')
  const res = await request(app)
    .post('/api/sweeps')
    .set('Authorization', editor.auth)
    .send({ groupId: editor.groupId, title: 'Hot spot scan', baseConfig: sensingConfig(SCAN, 0), axes: [{ field: 'detuningMHz', values: { kind: 'linear', start: -80, stop: 120, count: 26 } }] })
  expect(res.status).toBe(202)
  sweepId = res.body.id
  await solvePoints(SweepDetail.parse(res.body))
})

describe('sensing map of a sweep', () => {
  it('returns the map, the fitted shift profile and the hot spot found within 3σ', async () => {
    const res = await get(`/sweeps/${sweepId}/sensing-map?noiseRms=0.001`, editor)
    expect(res.status).toBe(200)
    const m = SensingMapResponse.parse(res.body)
    expect(m.pointsUsed).toBe(26)
    expect(m.gainLn.length).toBe(m.positionsM.length)
    expect(m.gainLn[0].length).toBe(26)
    // τ of a Gaussian pulse in v_g·τ/2: its equivalent rectangular duration ∫P dt/P_peak = √(π/(4 ln 2))·FWHM
    // (the Gaussian integral, a closed form).
    expect(m.nominalResolutionM).toBeCloseTo(DZ * Math.sqrt(Math.PI / (4 * Math.LN2)), 6)
    expect(m.outsideScan).toHaveLength(m.positionsM.length)
    expect(m.outsideScan!.some(Boolean)).toBe(false)
    // 30 K at ≈ 1 MHz/K (common practice): the shift change the solver was given.
    expect(m.hotSpots).toHaveLength(1)
    expect(m.hotSpots[0].trueShiftMHz).toBeCloseTo(30, 9)
    expect(m.hotSpots[0].status).toBe('detected')
    expect(Math.abs(m.hotSpots[0].fittedShiftMHz! - 30)).toBeLessThanOrEqual(3 * m.hotSpots[0].sigmaMHz!)
  })

  it('downloads the table as CSV with units and the gain map as NPY', async () => {
    const csv = await get(`/sweeps/${sweepId}/sensing-map?format=csv`, editor)
    expect(csv.status).toBe(200)
    expect(csv.headers['content-type']).toMatch(/text\/csv/)
    expect(csv.text.split('\n')[1]).toMatch(/^position_m,true_shift_change_mhz,fitted_shift_change_mhz,sigma_mhz,residual_mhz/)
    const npy = await get(`/sweeps/${sweepId}/sensing-map?format=npy`, editor).buffer(true).parse((r, cb) => {
      const parts: Buffer[] = []
      r.on('data', (c: Buffer) => parts.push(c))
      r.on('end', () => cb(null, Buffer.concat(parts)))
    })
    expect(npy.status).toBe(200)
    const bytes = npy.body as Buffer
    expect(bytes.subarray(1, 6).toString('latin1')).toBe('NUMPY')
    expect(bytes.toString('latin1', 0, 200)).toMatch(/'shape': \(\d+, 26\)/)
  })

  it("streams every point's arrays into the sweep's ZIP", async () => {
    const zip = await get(`/sweeps/${sweepId}/download?arrays=1`, editor).buffer(true).parse((r, cb) => {
      const parts: Buffer[] = []
      r.on('data', (c: Buffer) => parts.push(c))
      r.on('end', () => cb(null, Buffer.concat(parts)))
    })
    expect(zip.status).toBe(200)
    const names = zipEntries(zip.body as Buffer).map((e) => e.name)
    expect(names.filter((n) => /^points\/point-\d{3}\/ch1_stokes_out\.npy$/.test(n))).toHaveLength(26)
    expect(names).toContain('README.txt')
  })

  it('refuses a sweep that is not a detuning scan, with a sentence', async () => {
    const res = await request(app).post('/api/sweeps').set('Authorization', editor.auth).send(powerSweep(editor.groupId, 'Power sweep', 2))
    const map = await get(`/sweeps/${res.body.id}/sensing-map`, editor)
    expect(map.status).toBe(422)
    expect(map.body.error.code).toBe('not_a_sensing_scan')
    expect(map.body.error.message).toMatch(/detuning/)
  })

  it('follows the sweep read rule: outsiders get 404, nobody signed in 401', async () => {
    expect((await get(`/sweeps/${sweepId}/sensing-map`, outsider)).status).toBe(404)
    expect((await get(`/sweeps/${sweepId}/sensing-map`)).status).toBe(401)
    expect((await get(`/sweeps/${sweepId}/sensing-map?noiseRms=7`, editor)).status).toBe(400)
  })
})
