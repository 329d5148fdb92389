// Inputs that used to reach PostgreSQL or the solver and came back as 500s or stored Infinity: each now a
// 4xx naming the field. (PostgreSQL refuses U+0000 in text and the \uD800 escape in jsonb; JSON.parse
// reads 1e999 as Infinity and 5e-324 as the smallest subnormal double.)
import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBody } from '@shared/api/api-error'
import { createApp } from '../../server/app'
import { tracesRoutes } from '../../server/modules/traces/traces.routes'
import { waveguidesRoutes } from '../../server/modules/waveguides/waveguides.routes'
import { CHIP_WAVEGUIDE } from '../solver/chip-fixtures'
import { silentLog, useTestDb } from './helpers'
import { chipRun, newMember, queueSchemaFor, runRoutesForTest, type Member } from './runs-fixtures'

const { db, pool } = useTestDb()
let app: ReturnType<typeof createApp>
let editor: Member

beforeAll(async () => {
  const { routes } = await runRoutesForTest(db, pool, queueSchemaFor('hostile_input'))
  app = createApp({ db, pool, log: silentLog, routes: [...routes, ['/traces', tracesRoutes({ db })], ['/waveguides', waveguidesRoutes({ db })]] })
  editor = await newMember(db, 'editor')
})

/** The field paths of a 400 answer, after checking it has the error envelope. */
function fieldsOf(res: request.Response): string[] {
  expect(res.status).toBe(400)
  return ApiErrorBody.parse(res.body).error.fields?.map((f) => f.path) ?? []
}

const postRun = (body: object) => request(app).post('/api/runs').set('Authorization', editor.auth).send({ groupId: editor.groupId, title: 'Hostile', ...body })

describe('text fields', () => {
  it('refuses a NUL character in a run title with 400 naming the title', async () => {
    const res = await postRun({ title: 'Pump\u0000depletion', config: chipRun() })

    expect(fieldsOf(res)).toEqual(['title'])
    expect(res.body.error.fields[0].message).toBe('must not contain control characters')
  })

  it('refuses a lone surrogate in run notes and in a waveguide name, naming each field', async () => {
    const run = await postRun({ notes: 'half an emoji \ud83d', config: chipRun() })
    const wg = await request(app)
      .post('/api/waveguides')
      .set('Authorization', editor.auth)
      .send({ groupId: editor.groupId, waveguide: { ...CHIP_WAVEGUIDE, name: 'Rib \udc00' } })

    expect(fieldsOf(run)).toEqual(['notes'])
    expect(fieldsOf(wg)).toEqual(['waveguide.name'])
  })

  it('keeps whole emoji, accents, tabs and line breaks', async () => {
    const res = await postRun({ title: 'Ré-écriture 😀', notes: 'line 1\n\tline 2', config: chipRun() })

    expect(res.status).toBe(202)
    expect(res.body).toMatchObject({ title: 'Ré-écriture 😀', notes: 'line 1\n\tline 2' })
  })

  it('answers ?q=%00 on the run and trace searches with 400 naming q', async () => {
    const runs = await request(app).get(`/api/runs?groupId=${editor.groupId}&q=%00`).set('Authorization', editor.auth)
    const traces = await request(app).get(`/api/traces?groupId=${editor.groupId}&q=a%00b`).set('Authorization', editor.auth)

    expect(fieldsOf(runs)).toEqual(['q'])
    expect(fieldsOf(traces)).toEqual(['q'])
  })
})

describe('paths', () => {
  it('answers malformed percent-encoding in a run id with 400 naming the id', async () => {
    const res = await request(app).get('/api/runs/%E0%A4%A').set('Authorization', editor.auth)

    expect(fieldsOf(res)).toEqual(['id'])
  })

  it('answers an encoded NUL in an array name with 400, not a database error', async () => {
    const run = await postRun({ config: chipRun() })
    const res = await request(app).get(`/api/runs/${run.body.id}/arrays/time%00ns`).set('Authorization', editor.auth)

    expect(fieldsOf(res)).toEqual(['name'])
  })
})

describe('numbers whose derived values would overflow', () => {
  it('refuses windowNs 5e-324 with 400 naming the window, with or without a step of its own', async () => {
    const config = chipRun()
    const auto = await postRun({ config: { ...config, windowNs: 5e-324, channels: [{}], grid: { mapRows: 64, mapCols: 64 } } })
    const stepped = await postRun({ config: { ...config, windowNs: 5e-324, channels: [{}] } })

    expect(fieldsOf(auto)).toContain('config.windowNs')
    expect(fieldsOf(stepped)).toContain('config.windowNs')
  })

  it('refuses a step below the floor, and Infinity (1e999 in the JSON text) anywhere in the config', async () => {
    const tiny = await postRun({ config: { ...chipRun(), grid: { timeStepPs: 1e-9 } } })
    const text = JSON.stringify({ groupId: editor.groupId, title: 'Hostile', config: chipRun() }).replace('"lengthM":0.05', '"lengthM":1e999')
    const infinite = await request(app).post('/api/runs').set('Authorization', editor.auth).set('Content-Type', 'application/json').send(text)

    expect(fieldsOf(tiny)).toContain('config.grid.timeStepPs')
    expect(fieldsOf(infinite)).toEqual(['config.waveguide.lengthM'])
  })

  it('refuses a run whose step rules ask for a step below 1 fs with 422 naming the power that drives them', async () => {
    // A 1 MW continuous pump on the test chip: G_B·P·Δz ≤ 0.05 (docs/numerics.md) asks for Δt ≈ 1e-6 ps.
    const res = await postRun({ config: { ...chipRun(), channels: [{ pump: { pulses: [], backgroundPowerW: 1e6 }, stokes: { pulses: [], backgroundPowerW: 0 } }], grid: { mapRows: 64, mapCols: 64 } } })

    expect(res.status).toBe(422)
    expect(ApiErrorBody.parse(res.body).error.fields?.map((f) => f.path)).toEqual(['config.channels.0.pump.backgroundPowerW'])
    expect(res.body.error.message).not.toMatch(/Infinity|NaN/)
  })

  it('refuses a trace sampleIntervalNs of 1e308 (the time axis would reach Infinity) with 400 naming it', async () => {
    const settings = { groupId: editor.groupId, name: 'Equally spaced', timeColumn: null, sampleIntervalNs: 1e308, timeUnit: 'ns', signalColumns: [0], signalUnit: 'arb' }
    const res = await request(app)
      .post('/api/traces')
      .set('Authorization', editor.auth)
      .attach('file', Buffer.from('1\n2\n3\n4\n'), 'spaced.csv')
      .field('settings', JSON.stringify(settings))

    expect(res.status).toBeGreaterThanOrEqual(400)
    expect(res.status).toBeLessThan(500)
    expect(ApiErrorBody.parse(res.body).error.fields?.map((f) => f.path)).toContain('settings.sampleIntervalNs')
  })
})
