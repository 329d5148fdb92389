// The beyond-SVEA acoustic option must reduce to the plain (SVEA) model as the acoustic frequency grows
// (docs/model.md, options, "What must hold"): the neglected ∂t²b term is O(1/(Ω_B·T)).
import { describe, expect, it } from 'vitest'
import { simulateSync } from '../../solver/index'
import { chipConfig, gaussian } from './chip-fixtures'

function stored(nuBGHz: number, higherOrderAcoustic: boolean) {
  const r = simulateSync(
    chipConfig({
      waveguide: { brillouinShiftGHz: nuBGHz },
      windowNs: 4.5,
      grid: { timeStepPs: 1000 / (20 * 16), mapRows: 16, mapCols: 16 },
      options: { higherOrderAcoustic },
      channels: [{ pump: { pulses: [gaussian(0.01, 1, 0.1, 'data')] }, stokes: { pulses: [gaussian(10, 1, 0.1, 'write'), gaussian(10, 2, 0.1, 'read')] } }],
    }),
  )
  expect(r.status).toBe('finished')
  return r.manifest.figures!.channels[0].retrievalEfficiency!
}

describe('higher-order acoustic option', () => {
  it('converges to the SVEA result as ν_B grows (2 → 4 → 8 → 16 GHz)', () => {
    const gaps = [2, 4, 8, 16].map((nu) => Math.abs(stored(nu, true) / stored(nu, false) - 1))
    for (let i = 1; i < gaps.length; i++) expect(gaps[i]).toBeLessThan(0.7 * gaps[i - 1])
    expect(gaps[0]).toBeGreaterThan(1e-4) // the option does change short-pulse results
    expect(gaps[3]).toBeLessThan(0.01)
  })

  it('warns when a pulse is shorter than 5 acoustic periods in SVEA mode', () => {
    const r = simulateSync(chipConfig({ windowNs: 4, waveguide: { brillouinShiftGHz: 2 }, channels: [{ pump: { pulses: [gaussian(0.1, 2, 0.5)] } }] }))
    expect(r.manifest.warnings.map((w) => w.code)).toContain('svea-short-pulse')
  })

  it('refuses a user step longer than 1/(20 ν_B)', () => {
    expect(() => chipConfig({ grid: { timeStepPs: 10 }, options: { higherOrderAcoustic: true } })).toThrow(/1\/\(20 ν_B\)/)
  })
})
