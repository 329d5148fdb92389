import { describe, expect, it } from 'vitest'
import { configDiff, unitOfKey } from './config-diff'

const run = (fwhmNs: number, extra: Record<string, unknown> = {}) => ({
  waveguide: { name: 'Rib', lengthM: 0.05, lossDbPerM: 0 },
  windowNs: 10,
  channels: [{ pump: { pulses: [{ shape: 'gaussian', fwhmNs, centreNs: 2, peakPowerW: 1 }], backgroundPowerW: 0 }, stokes: { pulses: [] as Record<string, unknown>[], backgroundPowerW: 0 } }],
  options: { kerr: false },
  ...extra,
})

describe('configDiff', () => {
  it('lists only the settings that differ, in words with units, one value per run', () => {
    const rows = configDiff([run(0.5), run(0.5), run(0.8, { windowNs: 12 })])
    expect(rows.map((r) => r.path)).toEqual(['windowNs', 'channels.0.pump.pulses.0.fwhmNs'])
    expect(rows[0]).toEqual({ path: 'windowNs', label: 'Window length', unit: 'ns', values: ['10', '10', '12'] })
    expect(rows[1]).toMatchObject({ label: 'Pump pulse 1, width', unit: 'ns', values: ['0.5', '0.5', '0.8'] })
  })

  it('marks a setting one run does not have, and names switches on and off', () => {
    const a = run(0.5)
    const b = run(0.5, { options: { kerr: true } })
    b.channels[0].stokes.pulses.push({ shape: 'gaussian', fwhmNs: 0.1, centreNs: 5, peakPowerW: 10 })
    const rows = configDiff([a, b])
    expect(rows.find((r) => r.path === 'options.kerr')).toMatchObject({ label: 'Kerr effect', values: ['off', 'on'] })
    expect(rows.find((r) => r.path === 'channels.0.stokes.pulses.0.peakPowerW')).toMatchObject({ label: 'Stokes pulse 1, peak power', unit: 'W', values: ['—', '10'] })
  })

  it('gives nothing for identical runs, and reads units from the names', () => {
    expect(configDiff([run(1), run(1)])).toEqual([])
    expect([unitOfKey('gainCoefficientMPerW'), unitOfKey('kerrN2M2PerW'), unitOfKey('lossDbPerM'), unitOfKey('effectiveAreaUm2'), unitOfKey('lengthM'), unitOfKey('seed')]).toEqual(['m/W', 'm²/W', 'dB/m', 'µm²', 'm', ''])
  })
})
