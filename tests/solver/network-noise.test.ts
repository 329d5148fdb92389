// Thermal noise of several acoustic fields: each keeps the fluctuation–dissipation level of its own resonance,
// ⟨|b|²⟩Δz/ħω = n_th(Ω) = 1/(e^{ħΩ/k_BT} − 1) (Callen & Welton 1951; V9 of docs/validation.md for one field).
import { describe, expect, it } from 'vitest'
import { BOLTZMANN_J_PER_K, REDUCED_PLANCK_J_S } from '@shared/physics/physical-constants'
import { planGrid } from '../../solver/driver'
import { NetworkRun } from '../../solver/network/network-run'
import { chipConfig } from './chip-fixtures'

describe('thermal noise with several fields', () => {
  it('a backward field at 7.7 GHz and a forward field at 0.5 GHz each hold n_th of their own frequency (5 %, 4000 nodes)', () => {
    const config = chipConfig({
      windowNs: 0.5,
      waveguide: { lengthM: 1, forwardResonances: [{ frequencyMHz: 500, linewidthMHz: 50, gainCoefficientMPerW: 3e-10 }] },
      grid: { timeStepPs: 1 / (4000 * (299_792_458 / 2.44)) * 1e12 },
      options: { noise: { enabled: true, temperatureK: 300, seed: 5 }, forwardAntiStokes: false, errorEstimate: false },
      channels: [{}],
    })
    const grid = planGrid(config)
    const run = new NetworkRun(config, grid)
    run.advance(grid.nt + 1)
    const fields = run.net.set.fields
    expect(fields.map((f) => f.kind)).toEqual(['backward', 'forward'])
    fields.forEach((f, k) => {
      const nTh = 1 / Math.expm1((REDUCED_PLANCK_J_S * 2 * Math.PI * f.resonanceGHz * 1e9) / (BOLTZMANN_J_PER_K * 300))
      let sum = 0
      for (let j = 1; j < grid.nz; j++) sum += run.wave.bRe[k][j] ** 2 + run.wave.bIm[k][j] ** 2
      const occupation = ((sum / (grid.nz - 1)) * grid.dzM) / run.net.fields[k].phononJ
      expect(Math.abs(occupation / nTh - 1)).toBeLessThan(0.05)
    })
  })
})
