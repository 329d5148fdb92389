// manifest.json carries the derived quantities the form showed, so a ZIP read years later still has the gain
// parameter, κ and the thresholds the run was set up with.
import { describe, expect, it } from 'vitest'
import type { SimulationManifest } from '@shared/physics/simulation-result'
import { buildRunManifest } from '../../solver/io/manifest'
import { estimateResources } from '@shared/physics/resource-estimate'
import { chooseGrid } from '@shared/physics/grid-step'
import { chipConfig } from './chip-fixtures'

describe('the run manifest', () => {
  it('lists the derived quantities, with the further resonance’s G = η g/A_eff and the cascade threshold', () => {
    const config = chipConfig({
      waveguide: { additionalResonances: [{ shiftGHz: 7.9, linewidthMHz: 40, gainCoefficientMPerW: 2e-10 }] },
      channels: [{ pump: { pulses: [], backgroundPowerW: 0.05 } }],
      options: { cascade: { stokesOrders: 2, seedPowerW: 1e-9 } },
    })
    const grid = chooseGrid(config)
    const solverManifest = { arrays: [], grid: { dtS: grid.dtS, dzM: grid.dzM, nz: grid.nz, nt: grid.nt } } as unknown as SimulationManifest
    const m = buildRunManifest(solverManifest, config, estimateResources(config, grid), { startedAt: '', finishedAt: '', wallTimeS: 0 })
    const row = (q: string) => m.derived.find((r) => r.quantity === q)
    // η g/A_eff with the chip fixture's own area and polarisation factor.
    const w = config.waveguide
    expect(row('backwardResonance1GainParameter')?.value).toBeCloseTo((w.polarisationFactor * 2e-10) / (w.effectiveAreaUm2 * 1e-12), 9)
    expect(row('backwardResonance1GainParameter')?.unit).toBe('1/(W m)')
    expect(row('cascadeFirstThresholdW')?.value).toBeGreaterThan(0)
    // On the run's own grid: the time step row is the grid's.
    expect(row('timeStepPs')?.value).toBeCloseTo(grid.dtS * 1e12, 9)
  })
})
