// Convergence order of the multi-wave scheme with every new term on at once (counter- and co-propagating
// waves, two backward resonances, a forward resonance with a mismatched anti-Stokes, a second Stokes order):
// halving Δt must divide the error by 4 (second order; Strang splitting and Heun's predictor–corrector,
// e.g. Hairer, Lubich & Wanner, Geometric Numerical Integration, ch. II — common practice).
import { describe, expect, it } from 'vitest'
import { gaussian } from './chip-fixtures'
import { lastOutPowerW, runNetwork, stepForCells } from './network-fixtures'

// A window of whole coarse steps, so every grid ends at the same time.
const WINDOW_NS = 354 * stepForCells(24) * 1e-3

function energies(nz: number): Record<string, number> {
  const r = runNetwork({
    windowNs: WINDOW_NS,
    detuningMHz: 20,
    waveguide: {
      lossDbPerM: 10,
      additionalResonances: [{ shiftGHz: 7.9, linewidthMHz: 60, gainCoefficientMPerW: 2e-10 }],
      forwardResonances: [{ frequencyMHz: 2000, linewidthMHz: 80, gainCoefficientMPerW: 3e-10, antiStokesMismatchPerM: 40 }],
    },
    grid: { timeStepPs: stepForCells(nz) },
    options: { cascade: { stokesOrders: 2, seedPowerW: 1e-3 } },
    channels: [
      {
        pump: { pulses: [gaussian(3, 1.5, 0.3)] },
        stokes: { pulses: [gaussian(0.3, 1.7, 0.3)] },
        coProbe: { pulses: [gaussian(0.01, 1.5, 0.3)] },
        forwardInputs: [{ stokes: { pulses: [gaussian(0.05, 1.4, 0.3)] }, antiStokes: { pulses: [gaussian(0.02, 1.6, 0.3)] } }],
      },
    ],
  })
  // The second order's CW seed switches on at t = 0: an energy sum over that jump is first order, so it is
  // compared by its power at the end of the run; the pulsed waves by their output energies.
  return { ...Object.fromEntries(r.manifest.figures!.waves!.waves.map((w) => [w.key, w.energyOutJ])), stokes_2: lastOutPowerW(r, 'stokes_2') }
}

describe('multi-wave scheme convergence', () => {
  it('halving Δt divides the error of every wave’s output (energy, or end power for the CW-seeded order) by 4 ± 0.2', () => {
    const e = [24, 48, 96].map(energies)
    for (const key of ['pump', 'stokes', 'stokes_2', 'forward_stokes_1', 'forward_anti_stokes_1']) {
      const ratio = (e[0][key] - e[1][key]) / (e[1][key] - e[2][key])
      expect({ key, ratio: Math.abs(ratio - 4) < 0.2 ? 4 : ratio }).toEqual({ key, ratio: 4 })
    }
  })
})
