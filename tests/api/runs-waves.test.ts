// Submitting runs with waves in both directions: further and forward resonances, a co-propagating probe, forward
// inputs and Stokes cascades. Good configs are queued; each bad one is a 400 whose message names the field in
// words (shared/api/issue-path-labels.ts) and never a raw path or a 500.
import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { RunDetail } from '@shared/api/runs'
import { createApp } from '../../server/app'
import { silentLog, useTestDb } from './helpers'
import { chipRun, newMember, queueSchemaFor, runRoutesForTest, type Member } from './runs-fixtures'

const { db, pool } = useTestDb()
const setup = runRoutesForTest(db, pool, queueSchemaFor('runs_waves'))
let app: ReturnType<typeof createApp>
let editor: Member

beforeAll(async () => {
  const { routes } = await setup
  app = createApp({ db, pool, log: silentLog, routes })
  editor = await newMember(db, 'editor')
})

const cw = { pulses: [], backgroundPowerW: 1e-6 }
/** The small chip run with changes to its waveguide, its one channel and its options. */
function config(o: { waveguide?: object; channel?: object; options?: object } = {}) {
  const base = chipRun()
  return {
    ...base,
    waveguide: { ...base.waveguide, ...o.waveguide },
    channels: [{ ...base.channels[0], ...o.channel }],
    options: { ...base.options, ...o.options },
  }
}
const submit = (c: object) => request(app).post('/api/runs').set('Authorization', editor.auth).send({ groupId: editor.groupId, title: 'waves', config: c })
/** Dotted JSON paths are for programs (in `fields`); the message a person reads carries none. */
const RAW_PATH = /\b(config|channels|waveguide|options)\.[\w.]+|additionalResonances|forwardResonances|forwardInputs|coProbe|stokesOrders|seedPowerW/

describe('POST /api/runs with further waves', () => {
  it('queues a run with a further resonance, a forward resonance with its inputs, a co-propagating probe and two Stokes orders', async () => {
    const res = await submit(
      config({
        waveguide: {
          additionalResonances: [{ shiftGHz: 7.9, linewidthMHz: 40, gainCoefficientMPerW: 2e-10 }],
          forwardResonances: [{ frequencyMHz: 4350, linewidthMHz: 12, gainCoefficientMPerW: 2.6e-9 }],
        },
        channel: { coProbe: cw, forwardInputs: [{ stokes: cw }] },
        options: { cascade: { stokesOrders: 2, seedPowerW: 1e-9 } },
      }),
    )
    expect(res.status, JSON.stringify(res.body)).toBe(202)
    const run = RunDetail.parse(res.body)
    expect(run.config.waveguide.additionalResonances).toHaveLength(1)
    expect(run.config.channels[0].coProbe?.backgroundPowerW).toBe(1e-6)
    expect(run.config.options.cascade).toEqual({ stokesOrders: 2, seedPowerW: 1e-9 })
  })

  const cases: Array<[string, object, string, RegExp]> = [
    ['forward inputs without a forward resonance', { channel: { forwardInputs: [{ stokes: cw }] } }, 'config.channels.0.forwardInputs.0', /Forward inputs of resonance 1: The waveguide has no forward resonance/],
    ['a negative shift of a further resonance', { waveguide: { additionalResonances: [{ shiftGHz: -1, linewidthMHz: 40, gainCoefficientMPerW: 2e-10 }] } }, 'config.waveguide.additionalResonances.0.shiftGHz', /Waveguide, further backward resonance 1, shift: must be more than 0 GHz/],
    ['four further resonances (at most 3)', { waveguide: { additionalResonances: Array.from({ length: 4 }, () => ({ shiftGHz: 7.9, linewidthMHz: 40, gainCoefficientMPerW: 2e-10 })) } }, 'config.waveguide.additionalResonances', /Waveguide, further backward resonances: must have at most 3 entries/],
    ['a forward resonance without its gain', { waveguide: { forwardResonances: [{ frequencyMHz: 4350, linewidthMHz: 12 }] } }, 'config.waveguide.forwardResonances.0.gainCoefficientMPerW', /Waveguide, forward resonance 1, gain coefficient: is required/],
    ['five Stokes orders', { options: { cascade: { stokesOrders: 5 } } }, 'config.options.cascade.stokesOrders', /Stokes orders: at most 4 orders/],
    ['a negative seed power', { options: { cascade: { stokesOrders: 2, seedPowerW: -1 } } }, 'config.options.cascade.seedPowerW', /Seed power of the higher Stokes orders: /],
    ['a co-propagating probe pulse outside the window', { channel: { coProbe: { pulses: [{ shape: 'gaussian', peakPowerW: 0.01, centreNs: 50, fwhmNs: 0.3 }] } } }, 'config.channels.0.coProbe.pulses.0.centreNs', /Co-propagating probe pulse 1, centre time: The pulse centre must lie inside the simulated window/],
    ['a co-propagating probe with the higher-order acoustic term', { channel: { coProbe: cw }, options: { higherOrderAcoustic: true } }, 'config.options.higherOrderAcoustic', /Higher-order acoustic term: .*turn the higher-order acoustic term off/],
    ['a forward Stokes pulse with a negative power', { waveguide: { forwardResonances: [{ frequencyMHz: 4350, linewidthMHz: 12, gainCoefficientMPerW: 2.6e-9 }] }, channel: { forwardInputs: [{ stokes: { pulses: [{ shape: 'gaussian', peakPowerW: -1, centreNs: 3, fwhmNs: 0.3 }] } }] } }, 'config.channels.0.forwardInputs.0.stokes.pulses.0.peakPowerW', /Forward Stokes of resonance 1, pulse 1, peak power: /],
  ]

  it.each(cases)('refuses %s with 400, the field in words in the message and its path in fields', async (_what, over, path, words) => {
    const res = await submit(config(over))
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(path)
    expect(res.body.error.message).toMatch(words)
    expect(res.body.error.message).not.toMatch(RAW_PATH)
  })
})
