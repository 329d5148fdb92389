/*
 * Damped sine fitted together with the envelope curve:
 *   y(t) = Σ_k c_k B_k(t) + e^{−γt} (a cos 2πft + b sin 2πft) + noise,   τ = 1/γ,  A = √(a² + b²),
 * with B_k the envelope's B-splines (envelope-basis.ts). For fixed (f, γ) the model is linear in (c, a, b),
 * so those are solved exactly (envelope-projection.ts) and only (f, γ) are iterated (variable projection;
 * Golub & Pereyra, SIAM J. Numer. Anal. 10, 413 (1973)) by ml-levenberg-marquardt.
 * Uncertainty: covariance = s²_f (JᵀJ)⁻¹ over all K + 4 parameters (Press et al., Numerical Recipes, §15.5),
 * so the trade-off between envelope and ripple is carried. For correlated (coloured) noise the variance of
 * a sinusoid's least-squares parameters is set by the noise spectral density at the sinusoid's frequency,
 * not by the total noise power (Stoica, Jakobsson & Li, IEEE Trans. Signal Process. 45, 2048 (1997), from
 * memory): s²_f is therefore the residuals' periodogram over 2M + 1 frequencies around f, divided by what
 * the fit leaves of a tone there (localNoiseVariance below). For white noise s²_f ≈ SSR/(N − p).
 * Starts: the few strongest spectral lines; the lowest SSR wins. A fit that ends at a parameter limit, or
 * whose ripple does not lower the SSR beyond what a tone fitted to noise would (Fisher's test), is refused.
 */
import { levenbergMarquardt } from 'ml-levenberg-marquardt'
import { normalMatrix } from '../least-squares'
import type { SplineBasis } from './envelope-basis'
import { basisT, dampedPhasor, dot, envelopeAlone, gram, invertScaled, makeProjector, matVec } from './envelope-projection'
import { dtft } from './spectral-line'

/** Half-width in independent frequencies of the band that sets the noise level at f (M above). */
const NOISE_BAND_HALF = 30
const LM_ITERATIONS = 25
/** From the original optimum a resampled trace's optimum is a few Gauss–Newton steps away. */
const REFIT_ITERATIONS = 3

export interface JointFit {
  frequencyGHz: number
  gamma: number
  a: number
  b: number
  /** Covariance of (a, b, γ, f). */
  cov: number[][]
  /** Diagonal of the hat matrix J(JᵀJ)⁻¹Jᵀ: how much of each sample's noise the fit absorbs. */
  leverage: Float64Array
  envelope: Float64Array
  /** Trace minus envelope. */
  ripple: Float64Array
  /** The fitted damped sine alone. */
  sine: Float64Array
  rmsResidual: number
  noiseColourFactor: number
  iterations: number
}

/** Sparse Jacobian row i: the basis entries then the 4 ripple columns; returns vᵀ M v for the (K+4) matrix M. */
function rowQuadratic(M: number[][], basis: SplineBasis, i: number, rip: number[]): number {
  const K = basis.count
  const idx: number[] = []
  const val: number[] = []
  for (let k = basis.slots * i; k < basis.slots * (i + 1); k++) (idx.push(basis.index[k]), val.push(basis.value[k]))
  for (let r = 0; r < 4; r++) (idx.push(K + r), val.push(rip[r]))
  let q = 0
  for (let p = 0; p < idx.length; p++) for (let r = 0; r < idx.length; r++) q += val[p] * M[idx[p]][idx[r]] * val[r]
  return q
}

/**
 * Noise variance seen at frequency f: Σ_j |R(ν_j)|² / Σ_j (N − h(ν_j)) over ν_j = f + j/T, j = −M … M,
 * where h(ν) = c̃ᵀ(JᵀJ)⁻¹c̃ + s̃ᵀ(JᵀJ)⁻¹s̃ (c̃ = Jᵀcos 2πνt, s̃ = Jᵀsin 2πνt) is the share of a tone at ν that
 * the fit itself absorbs; without it the envelope curve's absorption of noise would understate σ.
 */
function localNoiseVariance(res: Float64Array, t: Float64Array, f: number, basis: SplineBasis, cols: Float64Array[], inv: number[][]): number {
  const n = res.length
  const dt = t[1] - t[0]
  const T = n * dt
  const nyq = 1 / (2 * dt)
  let num = 0
  let den = 0
  for (let j = -NOISE_BAND_HALF; j <= NOISE_BAND_HALF; j++) {
    // Reflect at 0 and Nyquist so the band keeps 2M + 1 frequencies.
    let nu = Math.abs(f + j / T)
    if (nu > nyq) nu = 2 * nyq - nu
    const [re, im] = dtft(res, dt, nu)
    num += re * re + im * im
    const [c, s] = dampedPhasor(t, nu, 0)
    const vc = [...basisT(basis, c), ...cols.map((col) => dot(col, c))]
    const vs = [...basisT(basis, s), ...cols.map((col) => dot(col, s))]
    den += n - dot(vc, matVec(inv, vc)) - dot(vs, matVec(inv, vs))
  }
  return num / Math.max(1, den)
}

/** Fisher's test for a periodic component (Fisher, Proc. R. Soc. A 125, 54 (1929)): a tone fitted to noise alone
 *  lowers the SSR by ~σ²χ²₂, and the largest of N/2 such tones exceeds 2σ²(ln(N/2) + ln(1/α)) with probability α. */
const FALSE_ALARM = 1e-3

export interface FitStart {
  frequencyGHz: number
  gamma: number
}

export type FitFailure = 'no-ripple' | 'at-limit' | 'singular'

interface LeastSquaresEnd {
  p: number[]
  err: number
  iterations: number
}
type Projector = ReturnType<typeof makeProjector>

/** Levenberg–Marquardt over (f, γ) with (c, a, b) solved for each; null when it leaves the finite numbers. */
function minimise(project: Projector, y: Float64Array, st: FitStart, limits: { min: number[]; max: number[] }, iterations: number): LeastSquaresEnd | null {
  const n = y.length
  const idx = Float64Array.from({ length: n }, (_, i) => i)
  const zero = new Float64Array(n)
  // The library asks for y(x) sample by sample: solve once per parameter set and index the result.
  let key = ''
  let cached: Float64Array = zero
  const model = (p: number[]) => {
    const k = `${p[0]},${p[1]}`
    if (k !== key) {
      const s = project(y, p[0], p[1])
      if (s) {
        cached = new Float64Array(n)
        for (let i = 0; i < n; i++) cached[i] = s.envelope[i] + s.a * s.s1[i] + s.b * s.s2[i]
      } else cached = zero
      key = k
    }
    const out = cached
    return (x: number) => out[x]
  }
  const T = 0.5 / limits.min[0]
  const result = levenbergMarquardt({ x: idx, y }, model, {
    initialValues: [st.frequencyGHz, Math.max(0, st.gamma)],
    minValues: limits.min,
    maxValues: limits.max,
    gradientDifference: [1e-7 * st.frequencyGHz, 1e-7 * Math.max(st.gamma, 1 / T)],
    centralDifference: false,
    damping: 1e-3,
    maxIterations: iterations,
    errorTolerance: 0,
  })
  return result.parameterValues.every(Number.isFinite) ? { p: result.parameterValues, err: result.parameterError, iterations: result.iterations } : null
}

/**
 * The envelope of a resampled trace, from the same joint fit restarted at the original (f, γ): so that the
 * trade-off between envelope and ripple shape is resampled too, not frozen at the original fit.
 */
export function refitEnvelope(project: Projector, y: Float64Array, start: FitStart, T: number, dt: number): Float64Array | null {
  const end = minimise(project, y, start, { min: [0.5 / T, -1 / T], max: [1 / (2 * dt), 1 / (2 * dt)] }, REFIT_ITERATIONS)
  return end ? (project(y, end.p[0], end.p[1])?.envelope ?? null) : null
}

export function fitDampedSine(t: Float64Array, y: Float64Array, basis: SplineBasis, starts: FitStart[]): JointFit | FitFailure {
  const n = t.length
  const dt = t[1] - t[0]
  const T = t[n - 1]
  const project = makeProjector(t, basis)
  const limits = { min: [0.5 / T, -1 / T], max: [1 / (2 * dt), 1 / (2 * dt)] }
  let best: LeastSquaresEnd | null = null
  for (const st of starts) {
    const end = minimise(project, y, st, limits, LM_ITERATIONS)
    if (end && (!best || end.err < best.err)) best = end
  }
  if (!best) return 'singular'
  const [f, gamma] = best.p
  // A parameter held at its limit is not a least-squares minimum: its covariance would mean nothing.
  if (f <= limits.min[0] * 1.01 || f >= limits.max[0] * 0.99 || gamma <= limits.min[1] * 0.99 || gamma >= limits.max[1] * 0.99) return 'at-limit'
  const s = project(y, f, gamma)
  if (!s || !Number.isFinite(f) || !Number.isFinite(gamma)) return 'singular'
  const { a, b, s1, s2, envelope } = s
  const res = new Float64Array(n)
  const ripple = new Float64Array(n)
  const sine = new Float64Array(n)
  let ssr = 0
  for (let i = 0; i < n; i++) {
    ripple[i] = y[i] - envelope[i]
    sine[i] = a * s1[i] + b * s2[i]
    res[i] = ripple[i] - sine[i]
    ssr += res[i] ** 2
  }
  const p = basis.count + 4
  // Jacobian columns of (a, b, γ, f); the envelope block comes from the basis.
  const ca = s1
  const cb = s2
  const cg = s1.map((v, i) => -t[i] * (a * v + b * s2[i]))
  const cf = s1.map((v, i) => 2 * Math.PI * t[i] * (b * v - a * s2[i]))
  const ripCols = [ca, cb, cg, cf]
  const bt = ripCols.map((col) => basisT(basis, col))
  const tail = normalMatrix(ripCols)
  const full = [...gram(basis, n).map((row, k) => [...row, ...bt.map((v) => v[k])]), ...bt.map((v, r) => [...v, ...tail[r]])]
  const inv = invertScaled(full)
  if (!inv) return 'singular'
  const white = ssr / Math.max(1, n - p)
  const alone = envelopeAlone(t, basis, y)
  const ssrAlone = alone ? y.reduce((acc, v, i) => acc + (v - alone[i]) ** 2, 0) : Infinity
  if ((ssrAlone - ssr) / white < 2 * (Math.log(n / 2) + Math.log(1 / FALSE_ALARM))) return 'no-ripple'
  const local = localNoiseVariance(res, t, f, basis, ripCols, inv)
  const cov = inv.slice(basis.count).map((row) => row.slice(basis.count).map((v) => v * local))
  const leverage = res.map((_, i) => rowQuadratic(inv, basis, i, [ca[i], cb[i], cg[i], cf[i]]))
  return {
    frequencyGHz: f,
    gamma,
    a,
    b,
    cov,
    envelope,
    ripple,
    sine,
    rmsResidual: Math.sqrt(ssr / n),
    noiseColourFactor: local / white,
    leverage,
    iterations: best.iterations,
  }
}
