// Thermal noise checked without random numbers: the exact stationary covariance of the scheme's own
// one-step map (tests/solver/scheme-covariance.ts) against closed forms.
import { describe, expect, it } from 'vitest'
import { chipConfig } from './chip-fixtures'
import { acousticVariance, schemeMaps, spontaneousStokesClosedFormW, stationaryNoise } from './scheme-covariance'

const VG = 299_792_458 / 2.44
const LENGTH_M = 0.05
const GAIN_PER_WM = 300

function noisyChip(cells: number, pumpW: number, detuningMHz = 0, noise: { temperatureK?: number; zeroPoint?: boolean } = {}) {
  return chipConfig({
    windowNs: 1,
    detuningMHz,
    channels: [{ pump: { backgroundPowerW: pumpW } }],
    grid: { timeStepPs: (LENGTH_M / (VG * cells)) * 1e12, mapRows: 16, mapCols: 16 },
    options: { noise: { enabled: true, temperatureK: 300, seed: 1, ...noise } },
  })
}

/** Relative error of the scheme's stationary spontaneous Stokes power against the closed form. */
function spontaneousError(cells: number, pumpW: number): number {
  const maps = schemeMaps(noisyChip(cells, pumpW))
  const m = maps.run.model
  const exact = spontaneousStokesClosedFormW(m.stokesPhotonJ, m.noiseOccupation, m.rates.gammaBPerS, GAIN_PER_WM * pumpW * LENGTH_M)
  return stationaryNoise(maps).stokesOutW / exact - 1
}

describe('thermal noise, exact stationary covariance of the scheme', () => {
  it('gives every node the fluctuation–dissipation variance ħω_s n_th/(wΔz), w = ½ at the facets (Callen & Welton 1951)', () => {
    for (const detuningMHz of [0, 40]) {
      const maps = schemeMaps(noisyChip(30, 0, detuningMHz))
      const m = maps.run.model
      const perNode = (m.stokesPhotonJ * m.noiseOccupation) / m.dzM
      const variance = acousticVariance(maps, stationaryNoise(maps).P)
      for (let j = 0; j < maps.nodes; j++) {
        const weight = j === 0 || j === m.nz ? 0.5 : 1
        expect(Math.abs((variance[j] * weight) / perNode - 1)).toBeLessThan(1e-10)
      }
    }
  })

  it('gives the spontaneous Stokes power of the closed form ħω_s n_th ∫(e^{gL} − 1)dν to 1e-4 at G_B P L = 3 (Boyd, Rzążewski & Narum 1990)', () => {
    expect(Math.abs(spontaneousError(50, 0.2))).toBeLessThan(1e-4)
  })

  it('matches the small-gain limit ħω_s n_th G_B P L Γ_B/4 of the same closed form', () => {
    const maps = schemeMaps(noisyChip(40, 0.002))
    const m = maps.run.model
    const g0 = GAIN_PER_WM * 0.002 * LENGTH_M
    const smallGain = (m.stokesPhotonJ * m.noiseOccupation * g0 * m.rates.gammaBPerS) / 4
    // e^{gL} − 1 = gL + (gL)²/2 + …, and ∫g² dν = ½ G_B P ∫g dν for a Lorentzian: the next term is G₀/4.
    expect(stationaryNoise(maps).stokesOutW / smallGain - 1).toBeCloseTo(g0 / 4, 3)
  })

  it('with the zero-point term, spontaneous emission goes with n_th + 1: at 2 K the power is (n_th + 1)/n_th of the classical one', () => {
    const classical = schemeMaps(noisyChip(30, 0.2, 0, { temperatureK: 2 }))
    const quantum = schemeMaps(noisyChip(30, 0.2, 0, { temperatureK: 2, zeroPoint: true }))
    const nTh = classical.run.model.thermalOccupation
    expect(nTh).toBeLessThan(10)
    expect(quantum.run.model.noiseOccupation).toBe(nTh + 1)
    const ratio = stationaryNoise(quantum).stokesOutW / stationaryNoise(classical).stokesOutW
    expect(Math.abs(ratio / ((nTh + 1) / nTh) - 1)).toBeLessThan(1e-12)
  })

  it('converges at second order: halving Δt divides the error by 4 ± 0.3', () => {
    const coarse = spontaneousError(20, 0.2)
    const fine = spontaneousError(40, 0.2)
    expect(Math.abs(coarse / fine - 4)).toBeLessThan(0.3)
  })

  it('with the higher-order acoustic term the spontaneous Stokes power also converges at second order (ratio of successive differences 4 ± 0.3)', () => {
    // No simple closed form here (the second acoustic root adds a non-Lorentzian response), so the order is
    // read from three grids: (P₈ − P₁₆)/(P₁₆ − P₃₂) → 4 for a second-order scheme (common practice).
    const lengthM = 0.005
    const power = (cells: number) =>
      stationaryNoise(
        schemeMaps(
          chipConfig({
            windowNs: 1,
            waveguide: { lengthM },
            channels: [{ pump: { backgroundPowerW: 1 } }],
            grid: { timeStepPs: (lengthM / (VG * cells)) * 1e12, mapRows: 16, mapCols: 16 },
            options: { higherOrderAcoustic: true, noise: { enabled: true, temperatureK: 300, seed: 1 }, errorEstimate: false },
          }),
        ),
      ).stokesOutW
    const [p8, p16, p32] = [8, 16, 32].map(power)
    expect(Math.abs((p8 - p16) / (p16 - p32) - 4)).toBeLessThan(0.3)
  })
})
