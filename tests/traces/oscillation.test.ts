// Frequency and decay of a closed-form damped sinusoid y = A e^{−t/τ} sin(2πft + φ) + c, recovered by the
// spectrum and by the damped-sine fit. The power line of such a signal is a Lorentzian of FWHM 1/(πτ)
// (Fourier transform of a one-sided exponential; e.g. Bracewell, The Fourier Transform and Its Applications).
import { describe, expect, it } from 'vitest'
import { analyseOscillation } from '@shared/analysis/oscillation'
import { gaussianNoise } from './random'

const F_GHZ = 7.7 // a Brillouin shift of the demo chalcogenide chip
const TAU_NS = 3
const A = 0.8
const PHI = 0.4
const OFFSET = 0.1

function record(durationNs: number, dtNs: number, sigma: number, seed = 7) {
  const noise = gaussianNoise(seed)
  const n = Math.round(durationNs / dtNs) + 1
  const t = Array.from({ length: n }, (_, i) => 2 + i * dtNs)
  const y = t.map((ti) => A * Math.exp(-(ti - 2) / TAU_NS) * Math.sin(2 * Math.PI * F_GHZ * (ti - 2) + PHI) + OFFSET + sigma * noise())
  return { t, y }
}

describe('oscillation analysis of a closed-form damped sinusoid', () => {
  it('recovers f, τ and A by the damped-sine fit within 3σ of its own uncertainties (noise σ = 0.01, 1.25 % of A)', () => {
    const { t, y } = record(40, 0.01, 0.01)

    const r = analyseOscillation(t, y)

    const fit = r.fit!
    expect(Math.abs(fit.frequencyGHz - F_GHZ)).toBeLessThan(3 * fit.frequencyUncertaintyGHz!)
    expect(Math.abs(fit.decayNs! - TAU_NS)).toBeLessThan(3 * fit.decayUncertaintyNs!)
    expect(Math.abs(fit.amplitude - A)).toBeLessThan(3 * fit.amplitudeUncertainty!)
    // And absolutely: 0.05 % in frequency, 2 % in decay time and amplitude.
    expect(fit.frequencyGHz).toBeCloseTo(F_GHZ, 2)
    expect(Math.abs(fit.decayNs! / TAU_NS - 1)).toBeLessThan(0.02)
    expect(Math.abs(fit.amplitude / A - 1)).toBeLessThan(0.02)
    expect(fit.rmsResidual).toBeGreaterThan(0.008)
    expect(fit.rmsResidual).toBeLessThan(0.012)
    // White noise: the noise level near f is the average one (within the scatter of a 61-frequency average).
    expect(fit.noiseColourFactor).toBeGreaterThan(0.7)
    expect(fit.noiseColourFactor).toBeLessThan(1.4)
  })

  it('recovers f, τ and A from the spectrum within 3σ of its bootstrap uncertainties', () => {
    const { t, y } = record(40, 0.01, 0.01)

    const s = analyseOscillation(t, y).spectral!

    expect(s.bootstrapReplicates).toBeGreaterThanOrEqual(50)
    expect(Math.abs(s.frequencyGHz - F_GHZ)).toBeLessThan(3 * s.frequencyUncertaintyGHz!)
    expect(Math.abs(s.decayNs! - TAU_NS)).toBeLessThan(3 * s.decayUncertaintyNs!)
    expect(Math.abs(s.amplitude - A)).toBeLessThan(3 * s.amplitudeUncertainty!)
    // Least squares is the maximum-likelihood estimate for white Gaussian noise and reaches the Cramér–Rao
    // bound (common practice); the spectrum weighs the noise of the whole 40 ns record equally although the
    // ripple has died after ~10 ns, so it is less precise, but not by orders of magnitude.
    const fit = analyseOscillation(t, y).fit!
    expect(s.frequencyUncertaintyGHz! / fit.frequencyUncertaintyGHz!).toBeGreaterThan(0.8)
    expect(s.frequencyUncertaintyGHz! / fit.frequencyUncertaintyGHz!).toBeLessThan(30)
    expect(Math.abs(s.decayNs! / TAU_NS - 1)).toBeLessThan(0.1)
  })

  it('reads the decay of a record shorter than τ from the exact finite-record line shape', () => {
    // τ = 3 ns in a 2 ns record: the line is barely wider than the record's own; the finite-record form
    // |1 − q^N|²/|1 − q|² still separates the two, and the fit sees the decay over the record.
    const { t, y } = record(2, 0.005, 0.002)

    const r = analyseOscillation(t, y)

    expect(r.fit!.frequencyGHz).toBeCloseTo(F_GHZ, 2)
    expect(Math.abs(r.fit!.decayNs! - TAU_NS)).toBeLessThan(3 * r.fit!.decayUncertaintyNs!)
    if (r.spectral!.decayNs !== null) expect(Math.abs(r.spectral!.decayNs - TAU_NS)).toBeLessThan(3 * r.spectral!.decayUncertaintyNs!)
    else expect(r.notes.join(' ')).toMatch(/no wider than the record/)
  })

  it('removes a slow pulse envelope by default; with removal off the pulse itself is the largest line', () => {
    const { t, y } = record(40, 0.01, 0.005)
    const withPulse = y.map((v, i) => v + 5 * Math.exp(-(((t[i] - 20) / 6) ** 2)))

    const plain = analyseOscillation(t, withPulse, { envelope: 'none', minFrequencyGHz: 0.01 })
    const auto = analyseOscillation(t, withPulse, { minFrequencyGHz: 0.01 })

    // Without removal the 10 ns pulse dominates the spectrum (below 1 GHz).
    expect(plain.spectrum.frequencyGHz[plain.spectrum.magnitude.indexOf(Math.max(...plain.spectrum.magnitude))]).toBeLessThan(1)
    // FWHM of exp(−(t/6)²) is 12√ln2 = 9.99 ns; the ripple on top moves the half-maximum points a little.
    expect(Math.abs(auto.envelope!.pulse!.fwhmNs / (12 * Math.sqrt(Math.LN2)) - 1)).toBeLessThan(0.1)
    expect(Math.abs(auto.spectral!.frequencyGHz - F_GHZ)).toBeLessThan(2 * auto.spectral!.frequencyUncertaintyGHz!)
    expect(Math.abs(auto.fit!.frequencyGHz - F_GHZ)).toBeLessThan(2 * auto.fit!.frequencyUncertaintyGHz!)
  })

  it('says so instead of giving figures when no ripple stands out of the noise', () => {
    const noise = gaussianNoise(3)
    const t = Array.from({ length: 2000 }, (_, i) => i * 0.01)
    const y = t.map(() => 0.3 + 0.01 * noise())

    const r = analyseOscillation(t, y)

    expect(r.fit).toBeNull()
    expect(r.spectral).toBeNull()
    expect(r.notes.join(' ')).toMatch(/No ripple stands out of the noise/)
  })
})
