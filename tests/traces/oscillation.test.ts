// Frequency and decay of a closed-form damped sinusoid y = A e^{−t/τ} sin(2πft + φ) + c, recovered by the
// spectrum and by the damped-sine fit. The power line of such a signal is a Lorentzian of FWHM 1/(πτ)
// (Fourier transform of a one-sided exponential; e.g. Bracewell, The Fourier Transform and Its Applications).
import { describe, expect, it } from 'vitest'
import { analyseOscillation } from '@shared/oscillation'
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
  it('recovers f and τ by the damped-sine fit within 4σ of its own uncertainties (noise σ = 0.01, 1.25 % of A)', () => {
    const { t, y } = record(40, 0.01, 0.01)

    const r = analyseOscillation(t, y)

    const fit = r.fit!
    expect(Math.abs(fit.frequencyGHz - F_GHZ)).toBeLessThan(4 * fit.frequencyUncertaintyGHz!)
    expect(Math.abs(fit.decayNs - TAU_NS)).toBeLessThan(4 * fit.decayUncertaintyNs!)
    // And absolutely: 0.05 % in frequency, 2 % in decay time.
    expect(fit.frequencyGHz).toBeCloseTo(F_GHZ, 2)
    expect(Math.abs(fit.decayNs / TAU_NS - 1)).toBeLessThan(0.02)
    expect(Math.abs(fit.amplitude / A - 1)).toBeLessThan(0.02)
    expect(fit.rmsResidual).toBeGreaterThan(0.008)
    expect(fit.rmsResidual).toBeLessThan(0.012)
  })

  it('recovers f to within the record resolution and τ to 10 % from the spectrum alone', () => {
    const { t, y } = record(40, 0.01, 0.01)

    const s = analyseOscillation(t, y).spectral!

    // Record length T = 4001 samples × 10 ps.
    expect(s.frequencyUncertaintyGHz).toBeCloseTo(1 / (2 * 40.01), 9)
    expect(Math.abs(s.frequencyGHz - F_GHZ)).toBeLessThan(s.frequencyUncertaintyGHz)
    expect(Math.abs(s.decayNs! / TAU_NS - 1)).toBeLessThan(0.1)
  })

  it('reports an unresolved decay when the line is as narrow as the record allows', () => {
    // τ = 3 ns in a 2 ns record: the line width is set by the record, not the decay.
    const { t, y } = record(2, 0.005, 0)

    const r = analyseOscillation(t, y)

    expect(r.spectral!.decayNs).toBeNull()
    expect(r.notes.join(' ')).toMatch(/no wider than the record resolution/)
    // The fit still sees the decay over the record.
    expect(r.fit!.frequencyGHz).toBeCloseTo(F_GHZ, 3)
    expect(Math.abs(r.fit!.decayNs / TAU_NS - 1)).toBeLessThan(0.01)
  })

  it('removes a slow envelope with the moving average before looking for the oscillation', () => {
    const { t, y } = record(40, 0.01, 0.005)
    const withPulse = y.map((v, i) => v + 5 * Math.exp(-(((t[i] - 20) / 6) ** 2)))

    const plain = analyseOscillation(t, withPulse, { minFrequencyGHz: 0.01 })
    const smoothed = analyseOscillation(t, withPulse, { smoothNs: 0.5, minFrequencyGHz: 0.01 })

    // Without smoothing the pulse itself is the largest "line"; with it the 7.7 GHz tone is found.
    expect(plain.spectral!.frequencyGHz).toBeLessThan(1)
    expect(Math.abs(smoothed.spectral!.frequencyGHz - F_GHZ)).toBeLessThan(0.02)
  })
})
