// The JSON Schema printed by `npm run solve -- --schema` carries the options for waves in both directions with
// their units, limits and defaults, generated from the same zod schemas the form and the API use.
import { beforeAll, describe, expect, it } from 'vitest'
import { MAX_EXTRA_RESONANCES, MAX_STOKES_ORDERS } from '@shared/physics/resonances'
import { runCli } from './run-cli'

type Node = { type?: string; properties?: Record<string, Node>; items?: Node; required?: string[]; description?: string; default?: unknown } & Record<string, unknown>
let schema: Node

beforeAll(async () => {
  const r = await runCli(['--schema'])
  expect(r.code).toBe(0)
  schema = JSON.parse(r.stdout)
})

const props = (n: Node | undefined): Record<string, Node> => n?.properties ?? {}

describe('the JSON Schema of the configuration', () => {
  it('has the further backward resonances: at most 3, each with shift, linewidth and gain and their units', () => {
    const list = props(schema.properties!.waveguide).additionalResonances
    expect(list.type).toBe('array')
    expect(list.maxItems).toBe(MAX_EXTRA_RESONANCES)
    expect(list.default).toEqual([])
    const row = list.items!
    expect(row.required).toEqual(['shiftGHz', 'linewidthMHz', 'gainCoefficientMPerW'])
    expect(props(row).shiftGHz.description).toMatch(/\(GHz\)/)
    expect(props(row).linewidthMHz.description).toMatch(/\(MHz\)/)
    expect(props(row).gainCoefficientMPerW.description).toMatch(/\(m\/W\)/)
    expect(props(row).shiftGHz.exclusiveMinimum).toBe(0)
  })

  it('has the forward resonances with an anti-Stokes mismatch in 1/m that defaults to 0', () => {
    const row = props(schema.properties!.waveguide).forwardResonances.items!
    expect(row.required).toEqual(['frequencyMHz', 'linewidthMHz', 'gainCoefficientMPerW'])
    expect(props(row).frequencyMHz.description).toMatch(/\(MHz\)/)
    expect(props(row).antiStokesMismatchPerM.default).toBe(0)
    expect(props(row).antiStokesMismatchPerM.description).toMatch(/\(1\/m\)/)
  })

  it('has the co-propagating probe (optional) and forward inputs on each channel, as port inputs', () => {
    const channel = schema.properties!.channels.items!
    const probe = props(channel).coProbe
    expect(channel.required ?? []).not.toContain('coProbe')
    expect(probe.description).toMatch(/no backward gain/)
    expect(Object.keys(props(probe))).toEqual(expect.arrayContaining(['pulses', 'backgroundPowerW']))
    const forward = props(channel).forwardInputs
    expect(forward.maxItems).toBe(3)
    expect(Object.keys(props(forward.items))).toEqual(['stokes', 'antiStokes'])
  })

  it('has the cascade (1 to 4 orders, seed power in W) and the forward anti-Stokes toggle with their defaults', () => {
    const options = props(schema.properties!.options)
    const cascade = props(options.cascade)
    expect(cascade.stokesOrders).toMatchObject({ type: 'integer', minimum: 1, maximum: MAX_STOKES_ORDERS, default: 1 })
    expect(cascade.seedPowerW).toMatchObject({ minimum: 0, default: 0 })
    expect(cascade.seedPowerW.description).toMatch(/\(W\)/)
    expect(options.forwardAntiStokes).toMatchObject({ type: 'boolean', default: true })
  })
})
