// Thermal acoustic noise from the fluctuation–dissipation theorem
// (Callen & Welton 1951): ⟨|b|²⟩Δz/ħω_s = n_th = 1/(e^{ħΩ_B/k_BT} − 1) = 811.3 at 7.7 GHz, 300 K.
import { describe, expect, it } from 'vitest'
import { simulateSync } from '../../solver/index'
import { chipConfig } from './chip-fixtures'

const HBAR = 6.62607015e-34 / (2 * Math.PI)
const OMEGA_S = 2 * Math.PI * (299_792_458 / 1550e-9 - 7.7e9)
const VG = 299_792_458 / 2.44

function meanPhonons(seeds: number, cells: number, windowNs: number, higherOrder = false) {
  let sum = 0, count = 0
  for (let seed = 1; seed <= seeds; seed++) {
    const r = simulateSync(
      chipConfig({
        windowNs,
        grid: { timeStepPs: (0.05 / (VG * cells)) * 1e12, mapRows: 16, mapCols: 16 },
        options: { higherOrderAcoustic: higherOrder, noise: { enabled: true, temperatureK: 300, seed } },
      }),
    )
    expect(r.status).toBe('finished')
    const b = r.finalAcoustic[0]
    const nodes = b.length / 2
    for (let j = 0; j < nodes; j++) {
      // A facet node stands for half a cell (trapezoid weight ½) and carries twice the variance.
      const weight = j === 0 || j === nodes - 1 ? 0.5 : 1
      sum += (weight * (b[2 * j] ** 2 + b[2 * j + 1] ** 2) * r.manifest.grid!.dzM) / (HBAR * OMEGA_S)
      count += weight
    }
  }
  return sum / count
}

describe('thermal noise', () => {
  it('50 cells × 400 realisations give ⟨|b|²⟩Δz/ħω_s = n_th = 811.3 within 3 %', () => {
    const nTh = 1 / Math.expm1((HBAR * 2 * Math.PI * 7.7e9) / (1.380649e-23 * 300))
    expect(nTh).toBeCloseTo(811.3, 1)
    expect(Math.abs(meanPhonons(400, 50, 0.1) / nTh - 1)).toBeLessThan(0.03)
  })

  it('with the higher-order term the stationary ⟨|b|²⟩ doubles within 6 % (the second root of the acoustic wave equation holds as much again)', () => {
    // Starts thermal (n_th) with ∂t b = 0 and relaxes at Γ_B towards 2·n_th; 30 ns = 6.4/Γ_B.
    const nTh = 1 / Math.expm1((HBAR * 2 * Math.PI * 7.7e9) / (1.380649e-23 * 300))
    const expected = nTh * (2 - Math.exp(-2 * Math.PI * 34e6 * 30e-9))
    expect(Math.abs(meanPhonons(40, 64, 30, true) / expected - 1)).toBeLessThan(0.06)
  })

  it('is reproducible bit for bit with the same seed and differs with another', () => {
    const run = (seed: number) =>
      simulateSync(chipConfig({ windowNs: 2, channels: [{ pump: { backgroundPowerW: 0.2 } }], options: { noise: { enabled: true, temperatureK: 300, seed } } })).channels[0].stokesOut
    const a = run(7), b = run(7), c = run(8)
    expect(Buffer.from(a.buffer).equals(Buffer.from(b.buffer))).toBe(true)
    expect(Buffer.from(a.buffer).equals(Buffer.from(c.buffer))).toBe(false)
    // Noise-initiated Stokes is present at the output (spontaneous scattering seeded by thermal phonons).
    expect(a.some((x) => x !== 0)).toBe(true)
  })

  it('warns when n_th < 10 that the classical model undercounts spontaneous emission, and not at room temperature', () => {
    const at = (temperatureK: number, zeroPoint = false) =>
      simulateSync(chipConfig({ windowNs: 1, options: { noise: { enabled: true, temperatureK, seed: 1, zeroPoint } } })).manifest.warnings.find((w) => w.code === 'cold-noise')
    // n_th = 1/(e^{hν_B/k_BT} − 1) at 7.7 GHz: 4.9 at 2 K, 10.3 at 4 K.
    expect(at(2)?.message).toMatch(/n_th \+ 1.*zero-point/)
    expect(at(2, true)?.message).toMatch(/only approximate/)
    expect(at(4)).toBeUndefined()
    expect(at(295)).toBeUndefined()
  })
})
