// A waveguide with two backward resonances, each with its own acoustic field: the small-signal gain spectrum is
// the sum of their Lorentzians (Agrawal, Nonlinear Fiber Optics, ch. 9, applied to each resonance), and a pulse
// broader than their spacing rings at their frequency difference.
import { describe, expect, it } from 'vitest'
import { gaussian } from './chip-fixtures'
import { cw, lastOutPowerW, runNetwork, stepForCells } from './network-fixtures'

const L = 0.05
const lorentz = (detuningMHz: number, fwhmMHz: number) => 1 / (1 + (2 * detuningMHz / fwhmMHz) ** 2)

describe('two backward resonances', () => {
  // Main: 7.7 GHz, 200 MHz, G = 300 /(W m). Second: 7.95 GHz, 250 MHz, G = 200 /(W m).
  const second = { shiftGHz: 7.95, linewidthMHz: 250, gainCoefficientMPerW: 2e-10 }
  const lnGain = (detuningMHz: number, nz: number) =>
    Math.log(
      lastOutPowerW(
        runNetwork({
          windowNs: 60,
          detuningMHz,
          waveguide: { lossDbPerM: 0, linewidthMHz: 200, additionalResonances: [second] },
          grid: { timeStepPs: stepForCells(nz) },
          channels: [{ pump: cw(0.05), stokes: cw(1e-9) }],
        }),
        'stokes',
      ) / 1e-9,
    )

  it.each([0, 125, 250, -150])('CW gain exponent at δ = %s MHz equals G P L Σ_r L_r(Δ_r) to 1e-6 (Richardson in the step)', (d) => {
    const expected = 0.05 * L * (300 * lorentz(d, 200) + 200 * lorentz(d + 7700 - 7950, 250))
    const g = [32, 64].map((nz) => lnGain(d, nz))
    expect(Math.abs((4 * g[1] - g[0]) / 3 - expected)).toBeLessThan(1e-6)
    // Unextrapolated, the scheme is already within its second-order error.
    expect(Math.abs(g[1] - expected)).toBeLessThan(1e-4)
  })

  it('a short Stokes pulse through the pumped two-resonance waveguide rings at their 500 MHz spacing (within 1 %)', () => {
    const r = runNetwork({
      windowNs: 14,
      waveguide: { lossDbPerM: 0, linewidthMHz: 50, additionalResonances: [{ shiftGHz: 8.2, linewidthMHz: 50, gainCoefficientMPerW: 3e-10 }] },
      channels: [{ pump: cw(0.1), stokes: { pulses: [gaussian(1e-3, 1, 0.02)] } }],
    })
    const out = r.arrays.wave_stokes_out as Float64Array
    const dtNs = r.manifest.grid!.dtS * 1e9
    const transitNs = 0.05 / (299_792_458 / 2.44) * 1e9
    // The tail after the pulse: Σ_r c_r e^{(−Γ/2 + iΔ_r)t}, equal Γ, so |tail|² e^{Γt} beats at |Δ₁ − Δ₂|/2π.
    const gammaPerNs = 2 * Math.PI * 0.05
    const start = Math.ceil((1 + transitNs + 0.5) / dtNs)
    const y: number[] = []
    for (let n = start; n < out.length / 2; n++) y.push((out[2 * n] ** 2 + out[2 * n + 1] ** 2) * Math.exp(gammaPerNs * n * dtNs))
    const minima: number[] = []
    for (let i = 1; i < y.length - 1; i++)
      if (y[i] < y[i - 1] && y[i] <= y[i + 1]) {
        // Parabolic interpolation of the minimum between samples.
        const den = y[i - 1] - 2 * y[i] + y[i + 1]
        minima.push((start + i + (den > 0 ? (0.5 * (y[i - 1] - y[i + 1])) / den : 0)) * dtNs)
      }
    expect(minima.length).toBeGreaterThanOrEqual(5)
    const periodNs = (minima[minima.length - 1] - minima[0]) / (minima.length - 1)
    expect(Math.abs(1 / periodNs / 0.5 - 1)).toBeLessThan(0.01)
  })
})
