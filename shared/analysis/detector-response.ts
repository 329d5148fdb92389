/*
 * A photodetector's finite bandwidth applied to a model power trace P(t) before it is compared with a
 * measurement: P_det(t) = (h * P)(t), with an impulse response h of unit area (a detector that passes DC).
 * The bandwidth f₃ is the electrical −3 dB frequency, where the power of the detector's output signal at
 * f is half its low-frequency value: |H(f₃)|² = 1/2.
 *
 * First order (a single pole, an RC low-pass): h(t) = (1/τ) e^{−t/τ} for t ≥ 0, H(f) = 1/(1 + i2πfτ),
 *   |H|² = 1/(1 + (2πfτ)²) = 1/2  ⇒  τ = 1/(2π f₃).
 *   Its step response is 1 − e^{−t/τ}, its 10–90 % rise time τ ln 9 ≈ 0.35/f₃
 *   (Oppenheim & Willsky, Signals and Systems, 2nd ed., §6.5.1, first-order continuous-time systems).
 *   Computed exactly for the piecewise-linear interpolant of the samples, on any grid:
 *   y₊ = a y + (1 − a) x + (x₊ − x)(1 − τ(1 − a)/h), a = e^{−h/τ}, h the step (from y' = (x − y)/τ).
 *
 * Gaussian: h(t) = exp(−t²/2σ²)/(σ√(2π)), H(f) = exp(−2π²σ²f²) (the Gaussian's Fourier transform is a
 *   Gaussian; common practice), |H|² = exp(−4π²σ²f²) = 1/2  ⇒  σ = √(ln 2)/(2π f₃) ≈ 0.1325/f₃.
 *   A Gaussian of rms width σ₁ through it comes out Gaussian with σ₁² + σ² (variances of convolved
 *   densities add; common practice). Computed on a uniform grid (a non-uniform one is resampled at its
 *   median step) with the kernel sampled out to ±6σ and normalised to unit sum; a σ below half a step
 *   leaves the trace as it is (the detector is faster than the sampling resolves).
 *
 * The model is taken as zero before its first sample, as in trace-align.ts, so the detector starts at rest.
 */
import { medianStep, sampleAt, type Series } from './trace-align'

export type DetectorResponseKind = 'none' | 'firstOrder' | 'gaussian'

export interface DetectorResponse {
  kind: DetectorResponseKind
  bandwidthGHz: number
}

/** Time constant τ (ns) of a single pole with its −3 dB point at f₃ (GHz). */
export const firstOrderTauNs = (bandwidthGHz: number) => 1 / (2 * Math.PI * bandwidthGHz)

/** rms width σ (ns) of a Gaussian impulse response with its −3 dB point at f₃ (GHz). */
export const gaussianSigmaNs = (bandwidthGHz: number) => Math.sqrt(Math.LN2) / (2 * Math.PI * bandwidthGHz)

/** Kernel half-width in σ: the Gaussian beyond 6σ holds 2e-9 of its area. */
const GAUSS_HALF_WIDTH_SIGMAS = 6
/** Steps that differ from the median by more than this fraction make the grid count as non-uniform. */
const UNIFORM_TOLERANCE = 1e-6

export function firstOrderResponse(s: Series, tauNs: number): Float64Array {
  const t = s.timeNs
  const x = s.values
  const y = new Float64Array(x.length)
  // The input jumps from 0 to x[0] at the first sample: the output there is still 0.
  for (let n = 0; n + 1 < x.length; n++) {
    const h = t[n + 1] - t[n]
    if (!(h > 0)) {
      y[n + 1] = y[n]
      continue
    }
    const a = Math.exp(-h / tauNs)
    y[n + 1] = a * y[n] + (1 - a) * x[n] + (x[n + 1] - x[n]) * (1 - (tauNs * (1 - a)) / h)
  }
  return y
}

function isUniform(t: ArrayLike<number>, step: number): boolean {
  for (let i = 0; i + 1 < t.length; i++) if (Math.abs(t[i + 1] - t[i] - step) > UNIFORM_TOLERANCE * step) return false
  return true
}

function gaussianUniform(x: ArrayLike<number>, stepNs: number, sigmaNs: number): Float64Array {
  const half = Math.ceil((GAUSS_HALF_WIDTH_SIGMAS * sigmaNs) / stepNs)
  const w = Float64Array.from({ length: 2 * half + 1 }, (_, k) => Math.exp(-(((k - half) * stepNs) ** 2) / (2 * sigmaNs * sigmaNs)))
  const sum = w.reduce((p, q) => p + q, 0)
  for (let k = 0; k < w.length; k++) w[k] /= sum
  const n = x.length
  const y = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    let acc = 0
    const lo = Math.max(0, i - half)
    const hi = Math.min(n - 1, i + half)
    for (let j = lo; j <= hi; j++) acc += w[i - j + half] * x[j]
    y[i] = acc
  }
  return y
}

export function gaussianResponse(s: Series, sigmaNs: number): Float64Array {
  const t = s.timeNs
  if (t.length < 2) return Float64Array.from(s.values)
  const step = medianStep(t)
  if (sigmaNs < step / 2) return Float64Array.from(s.values)
  if (isUniform(t, step)) return gaussianUniform(s.values, step, sigmaNs)
  const t0 = t[0]
  const count = Math.floor((t[t.length - 1] - t0) / step) + 1
  const grid = Float64Array.from({ length: count }, (_, i) => t0 + i * step)
  const hint = { j: 0 }
  const onGrid = gaussianUniform(Float64Array.from(grid, (g) => sampleAt(s, g, hint)), step, sigmaNs)
  const back = { timeNs: grid, values: onGrid }
  const hint2 = { j: 0 }
  return Float64Array.from(t, (ti) => sampleAt(back, Math.min(ti, grid[count - 1]), hint2))
}

/** The model as the detector would record it; 'none' (or a bandwidth that is not positive) returns it unchanged. */
export function applyDetectorResponse(s: Series, r: DetectorResponse): Series {
  if (r.kind === 'none' || !(r.bandwidthGHz > 0)) return s
  const values = r.kind === 'firstOrder' ? firstOrderResponse(s, firstOrderTauNs(r.bandwidthGHz)) : gaussianResponse(s, gaussianSigmaNs(r.bandwidthGHz))
  return { timeNs: s.timeNs, values }
}
