import { describe, expect, it } from 'vitest'
import { applyDetectorResponse, firstOrderResponse, firstOrderTauNs, gaussianResponse, gaussianSigmaNs } from './detector-response'

const grid = (t0: number, stepNs: number, n: number) => Float64Array.from({ length: n }, (_, i) => t0 + i * stepNs)
const maxAbsDiff = (a: ArrayLike<number>, b: ArrayLike<number>) => Array.from(a).reduce((m, v, i) => Math.max(m, Math.abs(v - b[i])), 0)

/** Steady-state amplitude of the output of a unit sine at f, read from the middle third of the record. */
function sineGain(respond: (s: { timeNs: Float64Array; values: Float64Array }) => Float64Array, fGHz: number, stepNs: number, n: number) {
  const t = grid(0, stepNs, n)
  const y = respond({ timeNs: t, values: Float64Array.from(t, (x) => Math.sin(2 * Math.PI * fGHz * x)) })
  return Math.max(...Array.from(y.subarray(Math.floor(n / 3), Math.floor((2 * n) / 3))).map(Math.abs))
}

describe('first-order (single-pole) detector response', () => {
  it('turns a unit step into 1 − e^{−t/τ} at every sample', () => {
    // Step response of y' = (x − y)/τ (Oppenheim & Willsky, Signals and Systems, 2nd ed., §6.5.1).
    const tau = firstOrderTauNs(2)
    const t = grid(0, 0.013, 400)
    const y = firstOrderResponse({ timeNs: t, values: new Float64Array(t.length).fill(1) }, tau)
    expect(maxAbsDiff(y, Array.from(t, (x) => 1 - Math.exp(-x / tau)))).toBeLessThan(1e-12)
  })

  it('turns a ramp into t − τ(1 − e^{−t/τ}) on an uneven grid', () => {
    // The ramp response is the integral of the step response (same source); exact for a linear input.
    const tau = 0.2
    const t = Float64Array.from({ length: 300 }, (_, i) => 0.002 * i * i)
    const y = firstOrderResponse({ timeNs: t, values: t }, tau)
    expect(maxAbsDiff(y, Array.from(t, (x) => x - tau * (1 - Math.exp(-x / tau))))).toBeLessThan(1e-11)
  })

  it('passes a sine at its bandwidth with amplitude 1/√2 (−3 dB in power)', () => {
    // |H(f)|² = 1/(1 + (2πfτ)²) = 1/2 at f = 1/(2πτ) (same source).
    const f = 1.5
    const g = sineGain((s) => firstOrderResponse(s, firstOrderTauNs(f)), f, 0.002, 6000)
    expect(Math.abs(g - Math.SQRT1_2)).toBeLessThan(2e-4)
  })

  it('has the 10–90 % rise time 0.35/f₃ of a single pole', () => {
    // t_r = τ ln 9 = ln 9/(2π f₃) ≈ 0.350/f₃ (common practice for a first-order system's rise time).
    const f = 1
    const t = grid(0, 0.0005, 4000)
    const y = firstOrderResponse({ timeNs: t, values: new Float64Array(t.length).fill(1) }, firstOrderTauNs(f))
    const cross = (level: number) => t[y.findIndex((v) => v >= level)]
    expect(Math.abs(cross(0.9) - cross(0.1) - 0.35 / f)).toBeLessThan(0.002)
  })
})

describe('Gaussian detector response', () => {
  it('turns a Gaussian of σ₁ into a Gaussian of √(σ₁² + σ²) with its area kept', () => {
    // Variances of convolved densities add; the peak falls as σ₁/√(σ₁² + σ²) (common practice).
    const s1 = 0.3
    const s2 = gaussianSigmaNs(1.2)
    const t = grid(-5, 0.01, 1001)
    const y = gaussianResponse({ timeNs: t, values: Float64Array.from(t, (x) => Math.exp(-(x * x) / (2 * s1 * s1))) }, s2)
    const s = Math.hypot(s1, s2)
    expect(maxAbsDiff(y, Array.from(t, (x) => (s1 / s) * Math.exp(-(x * x) / (2 * s * s))))).toBeLessThan(1e-9)
  })

  it('gives the same Gaussian on an uneven grid, within the linear interpolation error', () => {
    const s1 = 0.3
    const s2 = 0.2
    const t = Float64Array.from({ length: 801 }, (_, i) => -4 + 8 * (i / 800) ** 1.2)
    const y = gaussianResponse({ timeNs: t, values: Float64Array.from(t, (x) => Math.exp(-(x * x) / (2 * s1 * s1))) }, s2)
    const s = Math.hypot(s1, s2)
    expect(maxAbsDiff(y, Array.from(t, (x) => (s1 / s) * Math.exp(-(x * x) / (2 * s * s))))).toBeLessThan(2e-4)
  })

  it('passes a sine at its bandwidth with amplitude 1/√2, so σ = √(ln 2)/(2π f₃) ≈ 0.1325/f₃', () => {
    // H(f) = exp(−2π²σ²f²) for the unit-area Gaussian (its Fourier transform; common practice).
    expect(gaussianSigmaNs(1)).toBeCloseTo(0.1325, 4)
    const f = 2
    const g = sineGain((s) => gaussianResponse(s, gaussianSigmaNs(f)), f, 0.002, 6000)
    expect(Math.abs(g - Math.SQRT1_2)).toBeLessThan(2e-4)
  })
})

describe('applyDetectorResponse', () => {
  it('leaves the model alone for none or a bandwidth that is not positive', () => {
    const s = { timeNs: grid(0, 0.1, 10), values: grid(1, 1, 10) }
    expect(applyDetectorResponse(s, { kind: 'none', bandwidthGHz: 1 })).toBe(s)
    expect(applyDetectorResponse(s, { kind: 'gaussian', bandwidthGHz: 0 })).toBe(s)
  })

  it('keeps the energy of a pulse that ends well inside the record', () => {
    // A detector that passes DC has H(0) = 1: the time integral is unchanged (common practice).
    const t = grid(0, 0.005, 2000)
    const values = Float64Array.from(t, (x) => Math.exp(-(((x - 3) / 0.1) ** 2)))
    const area = (v: ArrayLike<number>) => Array.from(v).reduce((p, q) => p + q, 0) * 0.005
    for (const kind of ['firstOrder', 'gaussian'] as const) {
      const out = applyDetectorResponse({ timeNs: t, values }, { kind, bandwidthGHz: 0.8 })
      expect(Math.abs(area(out.values) - area(values)) / area(values)).toBeLessThan(1e-6)
    }
  })
})
