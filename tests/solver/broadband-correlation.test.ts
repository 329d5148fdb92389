/*
 * Correlation read-out with a broadband source: CW pump and counter-propagating CW Stokes carry one source's
 * random phase W (linewidth Δν; the same seed and linewidth), the Stokes delayed by t_d. At z the beat carries
 * W(t − z/v_g) − W(t − (L − z)/v_g − t_d): the two readings are τ = 2δz/v_g apart, δz the distance from
 * z_c = L/2 + v_g t_d/2. For a Wiener phase the beat keeps its phase over t' with probability amplitude
 * exp(−2πΔν·min(t', |τ|)), and the sound (amplitude decay a = πΔν_B) averages it, so the mean local gain is
 *
 *   g(δz)/g(0) = [a + b·e^{−(a + b)|τ|}]/(a + b),   b = 2πΔν,
 *
 * one peak at z_c over a floor Δν_B/(Δν_B + 2Δν), whose excess has FWHM v_g ln 2/(π(Δν_B + 2Δν)): about
 * (ln 2/2)·v_g/(πΔν), a fixed part of the source's correlation length, when Δν ≫ Δν_B. (Derived from the
 * Wiener phase model, common practice, in docs/model.md, modulated and broadband sources.) The observable is
 * the time-averaged local gain −Im(u v* b*) of the solver's state, averaged over three seeds.
 */
import { describe, expect, it } from 'vitest'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { planGrid, SimulationRun } from '../../solver/driver'

// Standard single-mode silica fibre figures (Agrawal, Nonlinear Fiber Optics, ch. 9; values from memory).
const BRILLOUIN_LINEWIDTH_MHZ = 25
const WAVEGUIDE = { name: 'silica test fibre', groupIndex: 1.468, effectiveAreaUm2: 80, gainCoefficientMPerW: 5e-11, brillouinShiftGHz: 10.85, linewidthMHz: BRILLOUIN_LINEWIDTH_MHZ, wavelengthNm: 1550 }
const VG = 299_792_458 / WAVEGUIDE.groupIndex

/** Mean local gain along z (arbitrary units) and the node spacing. */
function localGain(linewidthMHz: number, stokesDelayNs: number, lengthM: number): { gain: Float64Array; dzM: number } {
  const windowNs = 2000
  let mean = new Float64Array(0)
  let dzM = 0
  const seeds = [1, 2, 3]
  for (const seed of seeds) {
    const source = { linewidthMHz, seed }
    const config = SimulationConfig.parse({
      waveguide: { ...WAVEGUIDE, lengthM },
      windowNs,
      channels: [{ pump: { backgroundPowerW: 0.01, broadband: source }, stokes: { backgroundPowerW: 0.001, broadband: { ...source, delayNs: stokesDelayNs } } }],
      grid: { mapRows: 16, mapCols: 16 },
      options: { errorEstimate: false },
    })
    const grid = planGrid(config)
    const run = new SimulationRun(config, grid)
    const nodes = grid.nz + 1
    if (mean.length === 0) mean = new Float64Array(nodes)
    dzM = grid.dzM
    // After the guide has filled, the delayed phase has arrived and the sound has settled.
    const fromN = Math.ceil(((lengthM / VG) * 1e9 + 50 + Math.abs(stokesDelayNs)) / (grid.dtS * 1e9))
    const s = run.state
    while (!run.done) {
      run.advance(1)
      if (run.n - 1 < fromN) continue
      for (let j = 0; j < nodes; j++) {
        // u·conj(v)·conj(b); its imaginary part is minus the local gain.
        const pr = s.uRe[j] * s.vRe[j] + s.uIm[j] * s.vIm[j]
        const pi = s.uIm[j] * s.vRe[j] - s.uRe[j] * s.vIm[j]
        mean[j] -= (pi * s.bRe[j] - pr * s.bIm[j]) / seeds.length
      }
    }
  }
  return { gain: mean, dzM }
}

describe('correlation read-out with a shared broadband source', () => {
  it.each([
    [250, 0, 2],
    [100, 5, 3],
  ])('Δν = %s MHz, Stokes delay %s ns, L = %s m: one peak at L/2 + v_g t_d/2 with the floor and width of the Wiener model', (linewidthMHz, delayNs, lengthM) => {
    const { gain, dzM } = localGain(linewidthMHz, delayNs, lengthM)
    const n = gain.length
    let top = 0
    for (let j = 0; j < n; j++) if (gain[j] > gain[top]) top = j
    expect(Math.abs(top * dzM - (lengthM / 2 + (VG * delayNs * 1e-9) / 2))).toBeLessThan(2 * dzM)

    // Floor from the guide's ends, more than ten widths from the peak.
    const floor = (gain.slice(0, 5).reduce((a, b) => a + b) + gain.slice(n - 5).reduce((a, b) => a + b)) / 10
    const expectedFloor = BRILLOUIN_LINEWIDTH_MHZ / (BRILLOUIN_LINEWIDTH_MHZ + 2 * linewidthMHz)
    expect(Math.abs(floor / gain[top] / expectedFloor - 1)).toBeLessThan(0.1)

    const half = floor + (gain[top] - floor) / 2
    let a = top
    while (a > 0 && gain[a] > half) a--
    let b = top
    while (b < n - 1 && gain[b] > half) b++
    const widthM = (b - 1 + (gain[b - 1] - half) / (gain[b - 1] - gain[b]) - (a + (half - gain[a]) / (gain[a + 1] - gain[a]))) * dzM
    const expectedWidthM = (VG * Math.LN2) / (Math.PI * (BRILLOUIN_LINEWIDTH_MHZ + 2 * linewidthMHz) * 1e6)
    expect(Math.abs(widthM / expectedWidthM - 1)).toBeLessThan(0.08)
  })
})
