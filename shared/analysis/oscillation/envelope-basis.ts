/*
 * The envelope curve: a straight baseline plus, over the pulse, cubic B-splines (de Boor, A Practical Guide
 * to Splines, 1978) of spacing h = 1/(2 f_c), so it follows changes up to the cut-off f_c there. The ripple is fitted together with this curve
 * (damped-sine-fit.ts), so where the curve could also follow the ripple the fit's covariance says so.
 * Automatic cut-off: f_c = 4/FWHM of the pulse, i.e. eight knots per FWHM; a cubic spline with that
 * spacing follows a Gaussian pulse to ~1e-4 of its height (error ∝ h⁴ f'''' / 384, de Boor ch. XII).
 */
import type { EnvelopeMode, EnvelopeRemoval } from './oscillation-types'

/** Knots per pulse FWHM in automatic mode (see above). */
const KNOTS_PER_FWHM = 8
/** The dense knots extend this many FWHM beyond the half-maximum points (a Gaussian is 1e-7 of its peak there). */
const PULSE_MARGIN_FWHM = 2
/** A pulse must stand out of the baseline at least this many times more than the largest swing of the other sign. */
const PULSE_DOMINANCE = 2

/** Envelope basis on samples: sample i touches functions index[S·i … S·i+S−1] with values value[…] (S = slots). */
export interface SplineBasis {
  count: number
  slots: number
  index: Int32Array
  value: Float64Array
}

export interface EnvelopePlan {
  removal: EnvelopeRemoval
  basis: SplineBasis
}

function median(y: Float64Array): number {
  const s = Float64Array.from(y).sort()
  return s[Math.floor(s.length / 2)]
}

/** The largest excursion from the median, if it dominates the swings of the other sign: centre and FWHM. */
export function findPulse(y: Float64Array, dtNs: number): { centreNs: number; fwhmNs: number } | null {
  const n = y.length
  const base = median(y)
  // A 3-sample average keeps single noisy samples from setting the peak.
  const d = y.map((_, i) => (y[Math.max(0, i - 1)] + y[i] + y[Math.min(n - 1, i + 1)]) / 3 - base)
  let iPeak = 0
  for (let i = 1; i < n; i++) if (Math.abs(d[i]) > Math.abs(d[iPeak])) iPeak = i
  const sign = Math.sign(d[iPeak]) || 1
  const peak = sign * d[iPeak]
  let opposite = 0
  for (let i = 0; i < n; i++) opposite = Math.max(opposite, -sign * d[i])
  if (!(peak > PULSE_DOMINANCE * opposite)) return null
  let lo = iPeak
  while (lo > 0 && sign * d[lo - 1] >= peak / 2) lo--
  let hi = iPeak
  while (hi < n - 1 && sign * d[hi + 1] >= peak / 2) hi++
  const fwhmNs = Math.max(2, hi - lo + 1) * dtNs
  return { centreNs: ((lo + hi) / 2) * dtNs, fwhmNs }
}

/** Uniform cubic B-spline of unit knot spacing, support [0, 4). */
function cubicB(x: number): number {
  if (x <= 0 || x >= 4) return 0
  if (x < 1) return (x * x * x) / 6
  if (x < 2) return (-3 * x ** 3 + 12 * x * x - 12 * x + 4) / 6
  if (x < 3) return (3 * x ** 3 - 24 * x * x + 60 * x - 44) / 6
  return (4 - x) ** 3 / 6
}

/**
 * Linear baseline (1, t/T) over the record plus, over [from, to], cubic B-splines of spacing h whose support
 * lies inside [from, to], so they vanish with two continuous derivatives at its edges: away from the pulse
 * only the straight baseline is removed, and nothing there can take up the ripple.
 */
export function envelopeBasis(t: Float64Array, dense: { from: number; to: number; h: number } | null): SplineBasis {
  const n = t.length
  const T = t[n - 1] || 1
  const m = dense ? Math.max(0, Math.floor((dense.to - dense.from) / dense.h) - 3) : 0
  const slots = dense && m > 0 ? 6 : 2
  const index = new Int32Array(slots * n)
  const value = new Float64Array(slots * n)
  for (let i = 0; i < n; i++) {
    index[slots * i] = 0
    value[slots * i] = 1
    index[slots * i + 1] = 1
    value[slots * i + 1] = t[i] / T
    if (slots === 2 || !dense) continue
    // Functions k = 0 … m−1 start at from + k·h; at most four cover a sample.
    const u = (t[i] - dense.from) / dense.h
    const k0 = Math.min(m - 1, Math.max(0, Math.floor(u) - 3))
    for (let j = 0; j < 4; j++) {
      const k = Math.min(m - 1, k0 + j)
      index[slots * i + 2 + j] = 2 + k
      value[slots * i + 2 + j] = k === k0 + j ? cubicB(u - k) : 0
    }
  }
  return { count: 2 + (slots === 6 ? m : 0), slots, index, value }
}

/** A basis of one constant function (envelope 'none': only the offset is removed). */
function constantBasis(n: number): SplineBasis {
  return { count: 1, slots: 1, index: new Int32Array(n), value: new Float64Array(n).fill(1) }
}

export function planEnvelope(y: Float64Array, dtNs: number, mode: EnvelopeMode, cutoffGHz?: number): EnvelopePlan {
  const n = y.length
  const T = (n - 1) * dtNs
  if (mode === 'none') {
    return { removal: { mode, pulse: null, cutoffGHz: null, baselineCutoffGHz: 0, coefficients: 1 }, basis: constantBasis(n) }
  }
  const t = Float64Array.from({ length: n }, (_, i) => i * dtNs)
  const found = findPulse(y, dtNs)
  const baselineCutoffGHz = 1 / (2 * T)
  // At least two samples per knot interval keep the least-squares spline determined.
  const fc = Math.min(1 / (4 * dtNs), mode === 'cutoff' && cutoffGHz && cutoffGHz > 0 ? cutoffGHz : found ? KNOTS_PER_FWHM / (2 * found.fwhmNs) : 0)
  if (!found || !(fc > 0)) {
    const basis = envelopeBasis(t, null)
    return { removal: { mode, pulse: null, cutoffGHz: null, baselineCutoffGHz, coefficients: basis.count }, basis }
  }
  const fromNs = Math.max(0, found.centreNs - (0.5 + PULSE_MARGIN_FWHM) * found.fwhmNs)
  const toNs = Math.min(T, found.centreNs + (0.5 + PULSE_MARGIN_FWHM) * found.fwhmNs)
  const basis = envelopeBasis(t, { from: fromNs, to: toNs, h: 1 / (2 * fc) })
  return {
    removal: { mode, pulse: { ...found, fromNs, toNs }, cutoffGHz: fc, baselineCutoffGHz, coefficients: basis.count },
    basis,
  }
}
