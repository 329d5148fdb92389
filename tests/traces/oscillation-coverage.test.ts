// The oscillation analysis's uncertainties hold what they promise: on synthetic traces with known truth
// (oscillation-synthetic.ts: a Gaussian pulse ten times the ripple's amplitude, a damped ripple, white or
// band-limited noise, fixed seeds) the truth lies inside ±2σ, which for a Gaussian error holds in 95.4 % of
// cases (common practice), and the spectrum and the fit agree within 2√(σ_s² + σ_f²). Checked here on every
// 11th trace of the benchmark's grid (27 traces; a stride prime to the grid's sizes, so every parameter value
// appears) (benchmarks/oscillation-coverage.ts runs all of it), and on a ≈3 GHz
// ripple riding on a broad pulse, whose envelope used to be reported as the oscillation.
import { describe, expect, it } from 'vitest'
import { analyseOscillation } from '@shared/analysis/oscillation'
import { evaluateCase, gridCases } from './oscillation-synthetic'
import { gaussianNoise } from './random'

const share = (xs: boolean[]) => xs.filter(Boolean).length / xs.length

describe('oscillation analysis on synthetic traces with known truth', () => {
  it('puts the truth inside ±2σ in at least 90 % of a fixed part of the grid, for f and τ by both methods', () => {
    const cases = gridCases().filter((_, i) => i % 11 === 0)

    const out = cases.map((c) => evaluateCase(c, (t, y) => analyseOscillation(t, y)))

    expect(cases.length).toBe(27)
    const cover = {
      spectrumF: share(out.map((o) => o.covered.spectrumF)),
      fitF: share(out.map((o) => o.covered.fitF)),
      spectrumTau: share(out.map((o) => o.covered.spectrumTau)),
      fitTau: share(out.map((o) => o.covered.fitTau)),
      agreeF: share(out.map((o) => o.agree.f)),
      agreeTau: share(out.map((o) => o.agree.tau)),
    }
    console.log('coverage on every 11th grid trace:', JSON.stringify(cover))
    for (const v of Object.values(cover)) expect(v).toBeGreaterThanOrEqual(0.9)
    // About a second per trace on an idle machine; generous for a busy one.
  }, 900_000)

  it('reports a ≈3 GHz ripple on a broad pulse, not the pulse, and both methods agree', () => {
    // A 3 ns (FWHM) pulse of height 1 with a 5 % ripple at 3 GHz decaying in 3 ns, noise 0.2 % of the pulse.
    const noise = gaussianNoise(11)
    const t = Array.from({ length: 1401 }, (_, i) => i * 0.01)
    const y = t.map((x) => Math.exp((-4 * Math.LN2 * (x - 5) ** 2) / 9) + 0.05 * Math.exp(-x / 3) * Math.sin(2 * Math.PI * 3 * x + 0.3) + 0.002 * noise())

    const r = analyseOscillation(t, y)
    const off = analyseOscillation(t, y, { envelope: 'none' })

    // With the envelope left in, the largest line is the pulse's own, well below 1 GHz.
    const peakOff = off.spectrum.frequencyGHz[off.spectrum.magnitude.indexOf(Math.max(...off.spectrum.magnitude))]
    expect(peakOff).toBeLessThan(1)
    // By default the envelope is removed (its cut-off stated) and both methods find 3 GHz within their 2σ.
    expect(r.envelope!.mode).toBe('auto')
    // The 5 % ripple on top moves the half-maximum points a little.
    expect(Math.abs(r.envelope!.pulse!.fwhmNs / 3 - 1)).toBeLessThan(0.1)
    expect(r.envelope!.cutoffGHz!).toBeLessThan(3)
    const s = r.spectral!
    const f = r.fit!
    expect(Math.abs(s.frequencyGHz - 3)).toBeLessThan(2 * s.frequencyUncertaintyGHz!)
    expect(Math.abs(f.frequencyGHz - 3)).toBeLessThan(2 * f.frequencyUncertaintyGHz!)
    expect(Math.abs(s.decayNs! - 3)).toBeLessThan(2 * s.decayUncertaintyNs!)
    expect(Math.abs(f.decayNs! - 3)).toBeLessThan(2 * f.decayUncertaintyNs!)
    expect(Math.abs(f.amplitude - 0.05)).toBeLessThan(2 * f.amplitudeUncertainty!)
    expect(r.agreement).toEqual({ frequency: true, decay: true })
  })
})
