// Least-squares fit of an exponential decay to points (τᵢ, yᵢ):
//
//     y(τ) = A·exp(−Γτ)
//
// Start: the straight line ln y = ln A − Γτ through the positive points (exact for an exact exponential).
// Then Gauss–Newton on the unweighted residuals rᵢ = yᵢ − A·exp(−Γτᵢ), with step halving whenever the sum
// of squares would grow (a plain damped Gauss–Newton; e.g. Press et al., Numerical Recipes, §15.5).
// One-sigma errors from the covariance s²(JᵀJ)⁻¹, s² = SSR/(N − 2) (least-squares.ts). Derived lifetimes carry
// first-order propagated errors: σ(1/Γ) = σ_Γ/Γ² (common practice).
import { parameterSigmas } from './least-squares'

export interface ExponentialDecayFit {
  /** Decay rate Γ in the inverse unit of τ. */
  rate: number
  rateSigma: number | null
  amplitude: number
  amplitudeSigma: number | null
  /** 1/Γ, in the unit of τ. */
  lifetime: number
  lifetimeSigma: number | null
  points: number
  /** Root-mean-square residual, in the unit of y. */
  rmsResidual: number
}

export type ExponentialDecayResult = { ok: true; fit: ExponentialDecayFit } | { ok: false; reason: string }

const MAX_ITERATIONS = 100
/** Relative change of the sum of squares below which the iteration has converged. */
const SSR_TOLERANCE = 1e-15

function ssrOf(t: number[], y: number[], a: number, g: number): number {
  let s = 0
  for (let i = 0; i < t.length; i++) s += (y[i] - a * Math.exp(-g * t[i])) ** 2
  return s
}

/** Fits y = A·exp(−Γτ); needs three points with y > 0 (two parameters and one degree of freedom for the error). */
export function fitExponentialDecay(tau: readonly number[], values: readonly number[]): ExponentialDecayResult {
  const t: number[] = []
  const y: number[] = []
  tau.forEach((x, i) => {
    const v = values[i]
    if (Number.isFinite(x) && Number.isFinite(v) && v > 0) {
      t.push(x)
      y.push(v)
    }
  })
  if (t.length < 3) return { ok: false, reason: `needs at least 3 points with a value above 0 (has ${t.length})` }
  if (Math.max(...t) - Math.min(...t) <= 0) return { ok: false, reason: 'needs points at more than one delay' }

  // Log-linear start: least squares of ln y on τ.
  const n = t.length
  const tm = t.reduce((s, x) => s + x, 0) / n
  const ly = y.map(Math.log)
  const lm = ly.reduce((s, x) => s + x, 0) / n
  let sxx = 0
  let sxy = 0
  for (let i = 0; i < n; i++) {
    sxx += (t[i] - tm) ** 2
    sxy += (t[i] - tm) * (ly[i] - lm)
  }
  let g = -sxy / sxx
  let a = Math.exp(lm + g * tm)
  let ssr = ssrOf(t, y, a, g)

  for (let it = 0; it < MAX_ITERATIONS && ssr > 0; it++) {
    // Normal equations of the linearised model for the step (dA, dΓ).
    let jaa = 0, jag = 0, jgg = 0, ra = 0, rg = 0
    for (let i = 0; i < n; i++) {
      const e = Math.exp(-g * t[i])
      const da = e
      const dg = -a * t[i] * e
      const r = y[i] - a * e
      jaa += da * da
      jag += da * dg
      jgg += dg * dg
      ra += da * r
      rg += dg * r
    }
    const det = jaa * jgg - jag * jag
    if (!(Math.abs(det) > 0)) break
    let stepA = (jgg * ra - jag * rg) / det
    let stepG = (jaa * rg - jag * ra) / det
    let next = ssrOf(t, y, a + stepA, g + stepG)
    for (let h = 0; h < 30 && !(next <= ssr); h++) {
      stepA /= 2
      stepG /= 2
      next = ssrOf(t, y, a + stepA, g + stepG)
    }
    if (!(next <= ssr)) break
    const done = ssr - next <= SSR_TOLERANCE * ssr
    a += stepA
    g += stepG
    ssr = next
    if (done) break
  }

  const colA = t.map((x) => Math.exp(-g * x))
  const colG = t.map((x, i) => -a * x * colA[i])
  const [amplitudeSigma, rateSigma] = parameterSigmas([colA, colG], ssr, n)
  const lifetimeSigma = rateSigma === null || g === 0 ? null : rateSigma / (g * g)
  return {
    ok: true,
    fit: { rate: g, rateSigma, amplitude: a, amplitudeSigma, lifetime: 1 / g, lifetimeSigma, points: n, rmsResidual: Math.sqrt(ssr / n) },
  }
}
