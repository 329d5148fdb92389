/*
 * The ripple's line in the spectrum of the trace after envelope removal, r_k (k = 0 … N−1, step Δt):
 *   X(ν) = Σ_k r_k e^{−i2πνkΔt}   (discrete-time Fourier transform, no window).
 * Frequency: the largest |X| above the lowest analysed frequency, found on a ×2 zero-padded FFT (fft.js)
 * and refined by a golden-section search on |X(ν)|² evaluated directly (no interpolation error).
 * Decay time: for r_k = (A/2i) z^k + c.c. with z = e^{(−γ + i2πf)Δt}, near ν = f
 *   |X(f + δ)|² ∝ |1 − q^N|² / |1 − q|²,   q = e^{(−γ − i2πδ)Δt},
 * a Lorentzian of FWHM γ/π = 1/(πτ) for a long record, widened by the record length for a short one. The
 * measured full width at half maximum W is inverted through this exact finite-record form (bisection on γ);
 * when W is no larger than the width of an undamped tone (≈ 0.886/T) the decay is not resolved.
 * Amplitude: A = 2|X(f)| |1 − e^{−γΔt}| / |1 − e^{−γNΔt}| (→ 2|X(f)|/N without decay).
 * The image line at −f, noise and what the envelope removal left behind bias these estimates; the
 * bootstrap (spectral-bootstrap.ts) measures that bias and the spread.
 */
import FFT from 'fft.js'
import type { RippleEstimate } from './oscillation-types'

const GOLDEN_STEPS = 30
const BISECTION_STEPS = 40
const SPECTRUM_POINTS = 800

export type LineEstimate = RippleEstimate & { gamma: number | null }

/** X(ν) of r with time step dtNs at ν (GHz), by a rotating phasor. Returns [Re, Im]. */
export function dtft(r: ArrayLike<number>, dtNs: number, nu: number): [number, number] {
  const c = Math.cos(2 * Math.PI * nu * dtNs)
  const s = -Math.sin(2 * Math.PI * nu * dtNs)
  let zr = 1
  let zi = 0
  let re = 0
  let im = 0
  for (let k = 0; k < r.length; k++) {
    re += r[k] * zr
    im += r[k] * zi
    const t = zr * c - zi * s
    zi = zr * s + zi * c
    zr = t
    // Renormalise now and then: the phasor's length drifts by rounding.
    if ((k & 1023) === 1023) {
      const m = Math.hypot(zr, zi)
      zr /= m
      zi /= m
    }
  }
  return [re, im]
}

const power = (r: ArrayLike<number>, dt: number, nu: number) => {
  const [re, im] = dtft(r, dt, nu)
  return re * re + im * im
}

function nextPow2(n: number): number {
  let p = 2
  while (p < n) p *= 2
  return p
}

/** One-sided |FFT|² of r zero-padded ×2. */
export function paddedPower(r: ArrayLike<number>, dtNs: number): { power: Float64Array; dfGHz: number } {
  const size = nextPow2(2 * r.length)
  const input = new Float64Array(size)
  for (let i = 0; i < r.length; i++) input[i] = r[i]
  const fft = new FFT(size)
  const out = fft.createComplexArray()
  fft.realTransform(out, input)
  const p = new Float64Array(size / 2 + 1)
  for (let k = 0; k <= size / 2; k++) p[k] = out[2 * k] ** 2 + out[2 * k + 1] ** 2
  return { power: p, dfGHz: 1 / (size * dtNs) }
}

/** Peak-preserving decimation of |X|/N for drawing. */
export function spectrumForDrawing(p: Float64Array, df: number, n: number): { frequencyGHz: number[]; magnitude: number[] } {
  const step = Math.max(1, Math.ceil(p.length / SPECTRUM_POINTS))
  const out = { frequencyGHz: [] as number[], magnitude: [] as number[] }
  for (let k = 0; k < p.length; k += step) {
    let best = k
    for (let j = k; j < Math.min(p.length, k + step); j++) if (p[j] > p[best]) best = j
    out.frequencyGHz.push(best * df)
    out.magnitude.push(Math.sqrt(p[best]) / n)
  }
  return out
}

/** Model |X(f+δ)|² up to a constant, for decay rate γ (1/ns). */
function lineShape(gamma: number, delta: number, n: number, dt: number): number {
  const eN = Math.exp(-gamma * n * dt)
  const e1 = Math.exp(-gamma * dt)
  const num = 1 - 2 * eN * Math.cos(2 * Math.PI * delta * n * dt) + eN * eN
  const den = 1 - 2 * e1 * Math.cos(2 * Math.PI * delta * dt) + e1 * e1
  return den > 0 ? num / den : n * n
}

/** Full width at half maximum of the model line: first half-power crossing, by stepping then bisection. */
function modelWidth(gamma: number, n: number, dt: number): number {
  const peak = lineShape(gamma, 0, n, dt)
  const step = Math.min(1 / (40 * n * dt), gamma / (2 * Math.PI * 20) || Infinity)
  let lo = 0
  let hi = step
  while (lineShape(gamma, hi, n, dt) > peak / 2 && hi < 1 / (2 * dt)) ((lo = hi), (hi += step))
  for (let i = 0; i < BISECTION_STEPS; i++) {
    const mid = 0.5 * (lo + hi)
    if (lineShape(gamma, mid, n, dt) > peak / 2) lo = mid
    else hi = mid
  }
  return lo + hi
}

/** γ whose finite-record line has full width W; null when W is not wider than an undamped tone's line. */
export function gammaFromWidth(widthGHz: number, n: number, dt: number): number | null {
  if (!(widthGHz > modelWidth(0, n, dt) * 1.001)) return null
  let lo = 0
  let hi = Math.PI * widthGHz
  while (modelWidth(hi, n, dt) < widthGHz && hi < 1 / dt) ((lo = hi), (hi *= 2))
  for (let i = 0; i < BISECTION_STEPS; i++) {
    const mid = 0.5 * (lo + hi)
    if (modelWidth(mid, n, dt) < widthGHz) lo = mid
    else hi = mid
  }
  return 0.5 * (lo + hi)
}

/** Half-power crossing on one side of the peak of the measured spectrum; null when the line never falls to half. */
function halfPowerEdge(r: ArrayLike<number>, dt: number, nu0: number, peak: number, dir: 1 | -1): number | null {
  const T = r.length * dt
  const nyq = 1 / (2 * dt)
  let inside = nu0
  let step = 1 / (8 * T)
  let outside = nu0 + dir * step
  while (power(r, dt, outside) > peak / 2) {
    inside = outside
    step *= 1.5
    outside = inside + dir * step
    if (outside <= 0 || outside >= nyq) return null
  }
  for (let i = 0; i < 24; i++) {
    const mid = 0.5 * (inside + outside)
    if (power(r, dt, mid) > peak / 2) inside = mid
    else outside = mid
  }
  return 0.5 * (inside + outside)
}

/** Bins of the `count` largest local maxima of the coarse spectrum above minF, largest first. */
export function peakBins(coarse: { power: Float64Array; dfGHz: number }, minF: number, count: number): number[] {
  const p = coarse.power
  const peaks: number[] = []
  for (let k = Math.max(1, Math.ceil(minF / coarse.dfGHz)); k < p.length - 1; k++) if (p[k] > 0 && p[k] >= p[k - 1] && p[k] >= p[k + 1]) peaks.push(k)
  return peaks.sort((a, b) => p[b] - p[a]).slice(0, count)
}

/** Frequency, decay and amplitude of the strongest line above minF (GHz), or of the line at coarse bin `bin`. */
export function spectralLine(r: ArrayLike<number>, dtNs: number, minF: number, coarse = paddedPower(r, dtNs), bin?: number): LineEstimate | null {
  const n = r.length
  const { dfGHz: df } = coarse
  const kPeak = bin ?? peakBins(coarse, minF, 1)[0]
  if (kPeak === undefined) return null
  // Golden-section search for the maximum of |X(ν)|² within one coarse bin either side.
  const g = (Math.sqrt(5) - 1) / 2
  let a = (kPeak - 1) * df
  let b = (kPeak + 1) * df
  let x1 = b - g * (b - a)
  let x2 = a + g * (b - a)
  let p1 = power(r, dtNs, x1)
  let p2 = power(r, dtNs, x2)
  for (let i = 0; i < GOLDEN_STEPS; i++) {
    if (p1 > p2) ((b = x2), (x2 = x1), (p2 = p1), (x1 = b - g * (b - a)), (p1 = power(r, dtNs, x1)))
    else ((a = x1), (x1 = x2), (p1 = p2), (x2 = a + g * (b - a)), (p2 = power(r, dtNs, x2)))
  }
  const f = 0.5 * (a + b)
  const peak = power(r, dtNs, f)
  const lo = halfPowerEdge(r, dtNs, f, peak, -1)
  const hi = halfPowerEdge(r, dtNs, f, peak, 1)
  // A broad line at low frequency can reach 0 Hz before half power: the line is symmetric, use the other side.
  const width = lo !== null && hi !== null ? hi - lo : hi !== null ? 2 * (hi - f) : lo !== null ? 2 * (f - lo) : null
  const gamma = width !== null ? gammaFromWidth(width, n, dtNs) : null
  const gm = gamma ?? 0
  const gain = gm > 0 ? (1 - Math.exp(-gm * dtNs)) / (1 - Math.exp(-gm * n * dtNs)) : 1 / n
  return {
    frequencyGHz: f,
    frequencyUncertaintyGHz: null,
    decayNs: gamma ? 1 / gamma : null,
    decayUncertaintyNs: null,
    amplitude: 2 * Math.sqrt(peak) * gain,
    amplitudeUncertainty: null,
    gamma,
  }
}
