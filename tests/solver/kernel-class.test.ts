// The estimate's prediction of the kernel class (shared/physics/resource-estimate.ts predictKernel) against the
// class the solver reports in the run's manifest after choosing its kernel (solver/driver.ts): the estimate
// calibrates its speed by that class, so the two must name the same code for every option combination.
import { describe, expect, it } from 'vitest'
import { SimulationConfig, type SimulationConfigInput } from '@shared/physics/simulation-config'
import { chooseGrid } from '@shared/physics/grid-step'
import { predictKernel } from '@shared/physics/resource-estimate'
import { simulate } from '../../solver/index'

const base = (over: Partial<SimulationConfigInput> = {}): SimulationConfigInput => ({
  waveguide: { lengthM: 0.05, groupIndex: 2.44, effectiveAreaUm2: 2.3, gainCoefficientMPerW: 7e-10, brillouinShiftGHz: 7.7, linewidthMHz: 34 },
  channels: [{ pump: { pulses: [], backgroundPowerW: 0.05 } }],
  windowNs: 2,
  ...over,
})
const wg = base().waveguide!
// n₂ of silica, about 2.6e-20 m²/W (common practice; Agrawal, Nonlinear Fiber Optics, ch. 2).
const kerrWg = { ...wg, kerrN2M2PerW: 2.6e-20 }
const off = { errorEstimate: false }

const cases: Array<[string, SimulationConfigInput, string]> = [
  ['plain', base({ options: off }), 'wasm/plain'],
  ['Kerr', base({ waveguide: kerrWg, options: { ...off, kerr: true } }), 'wasm/kerr'],
  ['Kerr switched on with n₂ = 0 (nothing to compute)', base({ options: { ...off, kerr: true } }), 'wasm/plain'],
  ['thermal noise', base({ options: { ...off, noise: { enabled: true } } }), 'ts/noise'],
  ['second-order acoustic term', base({ options: { ...off, higherOrderAcoustic: true } }), 'ts/higher-order'],
  ['Kerr with noise', base({ waveguide: kerrWg, options: { ...off, kerr: true, noise: { enabled: true } } }), 'ts/kerr-noise'],
  ['Kerr with the second-order acoustic term', base({ waveguide: kerrWg, options: { ...off, kerr: true, higherOrderAcoustic: true } }), 'ts/higher-order-kerr'],
  ['Kerr with the second-order acoustic term and noise', base({ waveguide: kerrWg, options: { ...off, kerr: true, higherOrderAcoustic: true, noise: { enabled: true } } }), 'ts/higher-order-kerr'],
  ['two channels', base({ channels: [{ offsetGHz: 0 }, { offsetGHz: 5 }], options: off }), 'ts/channels'],
  ['two channels with Kerr', base({ waveguide: kerrWg, channels: [{ offsetGHz: 0 }, { offsetGHz: 5 }], options: { ...off, kerr: true } }), 'ts/channels-kerr'],
  ['two channels with Kerr switched on and n₂ = 0', base({ channels: [{ offsetGHz: 0 }, { offsetGHz: 5 }], options: { ...off, kerr: true } }), 'ts/channels'],
  ['two channels with Kerr and thermal noise', base({ waveguide: kerrWg, channels: [{ offsetGHz: 0 }, { offsetGHz: 5 }], options: { ...off, kerr: true, noise: { enabled: true } } }), 'ts/channels-kerr-noise'],
  ['two channels with thermal noise', base({ channels: [{ offsetGHz: 0 }, { offsetGHz: 5 }], options: { ...off, noise: { enabled: true } } }), 'ts/channels-noise'],
  ['two channels with the second-order acoustic term', base({ channels: [{ offsetGHz: 0 }, { offsetGHz: 5 }], options: { ...off, higherOrderAcoustic: true } }), 'ts/channels-higher-order'],
  ['a longitudinal profile', base({ waveguide: { ...wg, profile: { segments: [{ startM: 0.01, endM: 0.03, shiftOffsetMHz: 20 }] } }, options: off }), 'ts/profile'],
  ['a forward resonance', base({ waveguide: { ...wg, forwardResonances: [{ frequencyMHz: 2000, linewidthMHz: 80, gainCoefficientMPerW: 3e-10, antiStokesMismatchPerM: 40 }] }, options: off }), 'ts/network'],
]

describe('kernel class: the estimate predicts the kernel the solver runs', () => {
  for (const [name, input, expected] of cases) {
    it(name, async () => {
      const config = SimulationConfig.parse(input)
      const predicted = predictKernel(config, chooseGrid(config))
      const r = await simulate(config, { engine: 'auto' })
      expect(r.status).toBe('finished')
      expect(r.manifest.kernel).toEqual(predicted)
      expect(`${predicted.engine}/${predicted.path}`).toBe(expected)
    })
  }

  it('records the forced engine: the plain scheme on the TypeScript kernels is the ts/plain class', async () => {
    const r = await simulate(SimulationConfig.parse(base({ options: off })), { engine: 'ts' })
    expect(r.manifest.kernel).toEqual({ engine: 'ts', threads: 1, path: 'plain' })
  })
})
