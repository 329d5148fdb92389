// GET /api/sweeps/:id/sensing-map for a correlation scan: a sweep over the detuning and the Stokes source delay of a
// CW pump and CW probe sharing one frequency modulation, on a 10 m fibre with a 3 m section 20 K warmer. The points
// are solved in this file (no workers) and stored as a worker stores them; the route assembles the map.
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { SensingMapResponse } from '@shared/api/sensing-map'
import { SweepDetail } from '@shared/api/sweeps'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { createApp } from '../../server/app'
import { silentLog, useTestDb } from './helpers'
import { newMember, queueSchemaFor, runRoutesForTest, type Member } from './runs-fixtures'
import { sweepsForTest } from './sweeps-fixtures'
import { correlationConfig, correlationProbe, delayForNs, VG_M_PER_NS, type CorrelationSetup } from '../solver/correlation-fixtures'

const { db, pool } = useTestDb()
const schema = queueSchemaFor('sensing-corr')
const setup = runRoutesForTest(db, pool, schema).then(async (r) => ({ ...r, sweeps: await sweepsForTest(db, pool, r.jobs.boss, { feedIntervalMs: 60_000 }) }))
afterAll(async () => (await setup).sweeps.module.stop())

const SCAN: CorrelationSetup = { lengthM: 10, rateMHz: 8, excursionMHz: 100, pumpPowerW: 0.1, probePowerW: 1e-4, segments: [{ startM: 2, endM: 5, temperatureOffsetK: 20 }] }
/** Peaks at 3.5 m (inside the warm section), 6.5 m and 8.5 m (outside it). */
const POSITIONS_M = [3.5, 6.5, 8.5]
const DETUNINGS = { kind: 'linear', start: -60, stop: 90, count: 11 }

let app: ReturnType<typeof createApp>
let editor: Member
let outsider: Member
let sweepId: string

const get = (path: string, who?: Member) => (who ? request(app).get(`/api${path}`).set('Authorization', who.auth) : request(app).get(`/api${path}`))
const post = (body: object) => request(app).post('/api/sweeps').set('Authorization', editor.auth).send(body)

/** Solve every point of the sweep and store it as the worker does: its probe trace, then status succeeded. */
async function solvePoints(detail: SweepDetail): Promise<void> {
  for (const p of detail.points) {
    const { rows } = await pool.query('select config, attempt from runs where id = $1', [p.runId])
    const { powerW } = correlationProbe(rows[0].config as SimulationConfig)
    // Stored as the complex field √P (a real amplitude): the route reads |A|².
    const out = new Float64Array(2 * powerW.length)
    powerW.forEach((v, i) => (out[2 * i] = Math.sqrt(v)))
    await pool.query(
      `insert into run_arrays (run_id, attempt, name, dtype, shape, units, description, data) values ($1, $2, 'ch1_stokes_out', 'c16', $3, '√W', 'probe', $4)`,
      [p.runId, rows[0].attempt, JSON.stringify([powerW.length]), Buffer.from(out.buffer)],
    )
    await pool.query(`update runs set status = 'succeeded', progress = 1, finished_at = now() where id = $1`, [p.runId])
  }
}

beforeAll(async () => {
  const { routes, sweeps } = await setup
  app = createApp({ db, pool, log: silentLog, routes: [...routes, ...sweeps.routes] })
  editor = await newMember(db, 'editor', undefined, 'Ines Varga')
  outsider = await newMember(db, 'owner', undefined, 'Someone Else')
  // The delay axis first: the route finds each axis by its field, not by its place.
  const res = await post({
    groupId: editor.groupId,
    title: 'Correlation scan',
    baseConfig: correlationConfig(SCAN, 0, 0),
    axes: [
      { field: 'modulationDelayNs', values: { kind: 'list', values: POSITIONS_M.map((z) => delayForNs(SCAN, z)) } },
      { field: 'detuningMHz', values: DETUNINGS },
    ],
  })
  expect(res.status).toBe(202)
  sweepId = res.body.id
  await solvePoints(SweepDetail.parse(res.body))
}, 120_000)

describe('sensing map of a correlation scan', () => {
  it('reads the shift at the positions the delays select, with the peak spacing and nominal resolution', async () => {
    const res = await get(`/sweeps/${sweepId}/sensing-map`, editor)
    expect(res.status).toBe(200)
    const m = SensingMapResponse.parse(res.body)
    expect(m.readOut).toBe('correlation')
    expect(m.pointsUsed).toBe(33)
    m.positionsM.forEach((z, i) => expect(z).toBeCloseTo(POSITIONS_M[i], 6))
    expect(m.detuningsMHz).toHaveLength(11)
    // d_m = v_g/(2 f_m) and Δz = v_g Δν_B/(2π f_m Δf) (Hotate & Hasegawa 2000, IEICE Trans. Electron. E83-C, 405).
    expect(m.peakSpacingM).toBeCloseTo(VG_M_PER_NS / (2 * 8e-3), 6)
    expect(m.nominalResolutionM).toBeCloseTo((VG_M_PER_NS * 1e9 * 30e6) / (2 * Math.PI * 8e6 * 100e6), 6)
    // 20 K at ≈ 1 MHz/K (common practice) inside the section, none outside.
    expect(Math.abs(m.fittedShiftMHz[0]! - 20)).toBeLessThan(2)
    expect(Math.abs(m.fittedShiftMHz[2]!)).toBeLessThan(2)
    expect(m.hotSpots).toHaveLength(1)
    expect(m.rangeStartM).toBeCloseTo(3.5, 6)
  })

  it('downloads the table as CSV naming the read-out and the gain map as NPY', async () => {
    const csv = await get(`/sweeps/${sweepId}/sensing-map?format=csv`, editor)
    expect(csv.status).toBe(200)
    expect(csv.text.split('\n')[0]).toMatch(/correlation read-out/)
    expect(csv.text.split('\n')[0]).toMatch(/peak spacing/)
    expect(csv.text.split('\n')).toHaveLength(2 + 3 + 1)
    const npy = await get(`/sweeps/${sweepId}/sensing-map?format=npy`, editor).buffer(true).parse((r, cb) => {
      const parts: Buffer[] = []
      r.on('data', (c: Buffer) => parts.push(c))
      r.on('end', () => cb(null, Buffer.concat(parts)))
    })
    expect(npy.status).toBe(200)
    expect((npy.body as Buffer).toString('latin1', 0, 200)).toMatch(/'shape': \(3, 11\)/)
  })

  it('refuses a scan whose pump and probe do not share one modulation, with a sentence', async () => {
    const base = correlationConfig(SCAN, 0, 0)
    base.channels[0].pump.modulation = { rateMHz: 6, excursionMHz: 100, delayNs: 0 }
    const res = await post({ groupId: editor.groupId, title: 'Mismatched', baseConfig: base, axes: [{ field: 'detuningMHz', values: DETUNINGS }, { field: 'modulationDelayNs', values: { kind: 'list', values: [0, 10] } }] })
    expect(res.status).toBe(202)
    const map = await get(`/sweeps/${res.body.id}/sensing-map`, editor)
    expect(map.status).toBe(422)
    expect(map.body.error.code).toBe('not_a_sensing_scan')
    expect(map.body.error.message).toMatch(/share one modulation/)
  })

  it('refuses a bad request naming the field in words, and follows the sweep read rule', async () => {
    const bad = await get(`/sweeps/${sweepId}/sensing-map?noiseRms=7`, editor)
    expect(bad.status).toBe(400)
    expect(bad.body.error.message).toMatch(/Detector noise: must be at most 0\.5/)
    expect(bad.body.error.message).not.toMatch(/noiseRms/i)
    expect((await get(`/sweeps/${sweepId}/sensing-map`, outsider)).status).toBe(404)
    expect((await get(`/sweeps/${sweepId}/sensing-map`)).status).toBe(401)
  })
})
