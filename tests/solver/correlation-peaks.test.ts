/*
 * Correlation read-out: CW pump and counter-propagating CW Stokes share one sinusoidal frequency modulation
 * (rate f_m, excursion Δf). Their beat is stationary only where the two modulations arrive in step, so the
 * acoustic field builds up at correlation peaks spaced d_m = v_g/(2 f_m), of width Δz ≈ v_g Δν_B/(2π f_m Δf)
 * (Hotate & Hasegawa 2000, IEICE Trans. Electron. E83-C, 405). A peak sits where z/v_g + t_p = (L − z)/v_g + t_s
 * (mod 1/f_m), t_p and t_s the modulation delays, so delaying the Stokes modulation by t moves the peaks by v_g t/2.
 *
 * Averaging the Lorentzian response 1/(1 + (2δν/Δν_B)²) over the beat's sinusoidal frequency swing
 * δν = 2Δf sin(2π f_m δz/v_g)·sin(θ) gives 1/√(1 + (4Δf·2π f_m δz/(v_g Δν_B))²) near a peak (the standard integral
 * ∫dθ/(1 + c² sin²θ) = 2π/√(1 + c²)), whose FWHM is √3/2 of the formula above when f_m ≪ Δν_B (docs/model.md,
 * modulated and broadband sources). The observable is the time-averaged |b|² of the solver's state.
 */
import { describe, expect, it } from 'vitest'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { planGrid, SimulationRun } from '../../solver/driver'

const WAVEGUIDE = {
  // Standard single-mode silica fibre figures (Agrawal, Nonlinear Fiber Optics, ch. 9; values from memory).
  name: 'silica test fibre',
  groupIndex: 1.468,
  effectiveAreaUm2: 80,
  gainCoefficientMPerW: 5e-11,
  brillouinShiftGHz: 10.85,
  linewidthMHz: 25,
  wavelengthNm: 1550,
}
const VG = 299_792_458 / WAVEGUIDE.groupIndex

interface Peak {
  zM: number
  widthM: number
}

/** Time-averaged |b|²(z) over the last `periods` modulation periods, and its peaks above half the largest. */
function correlationPeaks(rateMHz: number, excursionMHz: number, lengthM: number, stokesDelayNs = 0): Peak[] {
  const avgNs = 2000 / rateMHz
  // Fill the guide (one transit), let the sound settle (≈ 8 phonon lifetimes 1/(πΔν_B)), then average.
  const windowNs = (lengthM / VG) * 1e9 + 100 + avgNs
  const config = SimulationConfig.parse({
    waveguide: { ...WAVEGUIDE, lengthM },
    windowNs,
    channels: [
      {
        pump: { backgroundPowerW: 0.01, modulation: { rateMHz, excursionMHz } },
        stokes: { backgroundPowerW: 0.001, modulation: { rateMHz, excursionMHz, delayNs: stokesDelayNs } },
      },
    ],
    options: { errorEstimate: false },
  })
  const grid = planGrid(config)
  const run = new SimulationRun(config, grid)
  const nodes = grid.nz + 1
  const mean = new Float64Array(nodes)
  const fromN = Math.ceil((windowNs - avgNs) / (grid.dtS * 1e9))
  while (!run.done) {
    run.advance(1)
    if (run.n - 1 < fromN) continue
    for (let j = 0; j < nodes; j++) mean[j] += run.state.bRe[j] ** 2 + run.state.bIm[j] ** 2
  }
  const top = Math.max(...mean)
  const peaks: Peak[] = []
  for (let j = 1; j < nodes - 1; j++) {
    if (!(mean[j] >= mean[j - 1] && mean[j] > mean[j + 1] && mean[j] > 0.5 * top)) continue
    const half = mean[j] / 2
    let a = j
    while (a > 0 && mean[a] > half) a--
    let b = j
    while (b < nodes - 1 && mean[b] > half) b++
    // Half-maximum crossings by linear interpolation between nodes.
    const za = (a + (half - mean[a]) / (mean[a + 1] - mean[a])) * grid.dzM
    const zb = (b - 1 + (mean[b - 1] - half) / (mean[b - 1] - mean[b])) * grid.dzM
    peaks.push({ zM: j * grid.dzM, widthM: zb - za })
  }
  return peaks
}

describe('correlation read-out with a shared frequency modulation', () => {
  it.each([
    [10, 500, 25],
    [4, 400, 60],
    [8, 1200, 30],
  ])('f_m = %s MHz, Δf = %s MHz, L = %s m: peaks d_m = v_g/(2f_m) apart, width v_g Δν_B/(2π f_m Δf) within 15 per cent', (rateMHz, excursionMHz, lengthM) => {
    const peaks = correlationPeaks(rateMHz, excursionMHz, lengthM)
    const spacingM = VG / (2 * rateMHz * 1e6)
    const widthM = (VG * WAVEGUIDE.linewidthMHz * 1e6) / (2 * Math.PI * rateMHz * 1e6 * excursionMHz * 1e6)
    // With both delays 0 a peak sits at mid-guide and the others d_m from it.
    const expected = [-2, -1, 0, 1, 2].map((k) => lengthM / 2 + k * spacingM).filter((z) => z > 0 && z < lengthM)
    expect(peaks.map((p) => p.zM)).toHaveLength(expected.length)
    peaks.forEach((p, i) => {
      expect(Math.abs(p.zM - expected[i])).toBeLessThan(0.01 * spacingM)
      expect(Math.abs(p.widthM / widthM - 1)).toBeLessThan(0.15)
      // Tighter, against the quasi-static average (√3/2 of the formula), which holds for f_m ≪ Δν_B.
      expect(Math.abs(p.widthM / ((Math.sqrt(3) / 2) * widthM) - 1)).toBeLessThan(0.03)
    })
    for (let i = 1; i < peaks.length; i++) expect(Math.abs((peaks[i].zM - peaks[i - 1].zM) / spacingM - 1)).toBeLessThan(0.01)
  })

  it('moves the peaks by v_g·t/2 when the Stokes modulation is delayed by t', () => {
    const delayNs = 20
    const [first] = correlationPeaks(10, 500, 25, delayNs)
    const spacingM = VG / (2 * 10e6)
    const shiftedM = 25 / 2 + (VG * delayNs * 1e-9) / 2 - spacingM
    expect(Math.abs(first.zM - shiftedM)).toBeLessThan(0.05)
  })
})
