// Runs with modulated and broadband inputs through the API: stored as sent, and every bad modulation refused
// with 400 on the field at fault.
import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { RunDetail } from '@shared/api/runs'
import { createApp } from '../../server/app'
import { silentLog, useTestDb } from './helpers'
import { chipRun, newMember, queueSchemaFor, runRoutesForTest, type Member } from './runs-fixtures'

const { db, pool } = useTestDb()
const setup = runRoutesForTest(db, pool, queueSchemaFor('run_modulation'))
let app: ReturnType<typeof createApp>
let editor: Member

beforeAll(async () => {
  const { routes } = await setup
  app = createApp({ db, pool, log: silentLog, routes })
  editor = await newMember(db, 'editor')
})

/** The chip run of the run tests with the pump and Stokes inputs extended. */
function modulatedRun(pump: Record<string, unknown>, stokes: Record<string, unknown> = {}, timeStepPs = 1) {
  const config = chipRun(10, timeStepPs)
  config.channels[0].pump = { ...config.channels[0].pump, ...pump }
  config.channels[0].stokes = { ...config.channels[0].stokes, ...stokes }
  return config
}

const submit = (config: object) => request(app).post('/api/runs').set('Authorization', editor.auth).send({ groupId: editor.groupId, title: 'modulated', config })

describe('runs with modulated and broadband inputs', () => {
  it('queues a run with a frequency-modulated pump and a broadband Stokes input and keeps both', async () => {
    const res = await submit(modulatedRun({ modulation: { rateMHz: 100, excursionMHz: 3000, delayNs: 1 } }, { broadband: { linewidthMHz: 200, seed: 9 } }))

    expect(res.status).toBe(202)
    const { rows } = await pool.query(`select config from runs where id = $1`, [RunDetail.parse(res.body).id])
    expect(rows[0].config.channels[0].pump.modulation).toEqual({ rateMHz: 100, excursionMHz: 3000, delayNs: 1 })
    expect(rows[0].config.channels[0].stokes.broadband).toEqual({ linewidthMHz: 200, seed: 9, delayNs: 0 })
  })

  it('refuses a modulation rate of 0 with 400 on that field', async () => {
    const res = await submit(modulatedRun({ modulation: { rateMHz: 0, excursionMHz: 100 } }))

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toEqual(expect.arrayContaining([{ path: 'config.channels.0.pump.modulation.rateMHz', message: expect.stringMatching(/above 0/) }]))
  })

  it('refuses a set step too coarse for the excursion with 400 on the time step, stating the largest step', async () => {
    // Carson bandwidth B = 2(3000 + 100) MHz = 6.2 GHz: at most 1/(2B) = 80.6 ps, the run asks for 100 ps.
    const res = await submit(modulatedRun({ modulation: { rateMHz: 100, excursionMHz: 3000 } }, {}, 100))

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toEqual([{ path: 'config.grid.timeStepPs', message: expect.stringMatching(/at most 80\.6 ps, two samples per Carson bandwidth/) }])
  })

  it('refuses a modulation that reaches halfway to the other wave (Δf + f_m ≥ ν_B/2) with 400 on the excursion', async () => {
    // The chip's ν_B = 7.7 GHz: Δf + f_m must stay below 3850 MHz.
    const res = await submit(modulatedRun({ modulation: { rateMHz: 100, excursionMHz: 3800 } }))

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toEqual([{ path: 'config.channels.0.pump.modulation.excursionMHz', message: expect.stringMatching(/below half the Brillouin shift \(3850 MHz\)/) }])
  })

  it('refuses a broadband seed that is not a whole number with 400 on the seed', async () => {
    const res = await submit(modulatedRun({}, { broadband: { linewidthMHz: 10, seed: 1.5 } }))

    expect(res.status).toBe(400)
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain('config.channels.0.stokes.broadband.seed')
  })
})
