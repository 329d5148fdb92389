/*
 * Least-squares fit of one Lorentzian line on a quadratic baseline,
 *
 *   y(ν) = A / (1 + ((ν − ν₀)/w)²) + c₀ + c₁u + c₂u²,   u = (ν − ν_mid)/ν_half,
 *
 * w the half width at half maximum, u the detuning scaled to [−1, 1] over the scanned range so the baseline's
 * coefficients are of the size of y. Levenberg–Marquardt (Marquardt 1963) with the Jacobian in closed form,
 * 1σ from s²(JᵀJ)⁻¹ with s² = SSR/(n − 6) (least-squares.ts). The baseline carries what is broad against the
 * scan: in a correlation read-out, the gain the rest of the guide adds with its swept beat (correlation-map.ts).
 */
import { invert, normalMatrix, parameterSigmas } from './least-squares'

export interface BaselineLorentzianFit {
  amplitude: number
  centre: number
  halfWidth: number
  centreSigma: number | null
  /** Root-mean-square residual (units of y). */
  rmsResidual: number
}

const PARAMS = 6

function model(nu: ArrayLike<number>, p: number[], mid: number, half: number) {
  const [a, c, w, b0, b1, b2] = p
  const n = nu.length
  const y = new Float64Array(n)
  const cols = Array.from({ length: PARAMS }, () => new Float64Array(n))
  for (let i = 0; i < n; i++) {
    const x = (nu[i] - c) / w
    const d = 1 / (1 + x * x)
    const u = (nu[i] - mid) / half
    y[i] = a * d + b0 + b1 * u + b2 * u * u
    cols[0][i] = d
    cols[1][i] = (2 * a * x * d * d) / w
    cols[2][i] = (2 * a * x * x * d * d) / w
    cols[3][i] = 1
    cols[4][i] = u
    cols[5][i] = u * u
  }
  return { y, cols }
}

function ssrOf(y: ArrayLike<number>, f: ArrayLike<number>): number {
  let s = 0
  for (let i = 0; i < y.length; i++) s += (y[i] - f[i]) ** 2
  return s
}

/** Fit on detunings sorted ascending; `halfWidthGuess` seeds w. Null with fewer than eight points. */
export function fitLorentzianOnBaseline(nu: ArrayLike<number>, y: ArrayLike<number>, halfWidthGuess: number): BaselineLorentzianFit | null {
  const n = nu.length
  if (n < 8) return null
  const mid = (nu[0] + nu[n - 1]) / 2
  const half = (nu[n - 1] - nu[0]) / 2
  if (!(half > 0)) return null
  // Start: the straight line through the two ends as baseline, the line at the highest point above it.
  const lineAt = (i: number) => y[0] + ((y[n - 1] - y[0]) * (nu[i] - nu[0])) / (2 * half)
  let k = 0
  for (let i = 1; i < n; i++) if (y[i] - lineAt(i) > y[k] - lineAt(k)) k = i
  let p = [y[k] - lineAt(k), nu[k], Math.abs(halfWidthGuess), (y[0] + y[n - 1]) / 2, (y[n - 1] - y[0]) / 2, 0]
  let cur = model(nu, p, mid, half)
  let ssr = ssrOf(y, cur.y)
  let lambda = 1e-3
  for (let it = 0; it < 200; it++) {
    const a = normalMatrix(cur.cols)
    const g = cur.cols.map((col) => {
      let s = 0
      for (let i = 0; i < n; i++) s += col[i] * (y[i] - cur.y[i])
      return s
    })
    let improved = false
    while (lambda < 1e12) {
      const inv = invert(a.map((row, i) => row.map((v, j) => (i === j ? v * (1 + lambda) : v))))
      if (!inv) break
      const step = inv.map((row) => row.reduce((s, v, j) => s + v * g[j], 0))
      const trial = p.map((v, j) => v + step[j])
      trial[2] = Math.abs(trial[2])
      const next = model(nu, trial, mid, half)
      const s = ssrOf(y, next.y)
      if (Number.isFinite(s) && s <= ssr) {
        const done = ssr - s <= 1e-12 * Math.max(ssr, 1e-300)
        p = trial
        cur = next
        ssr = s
        lambda = Math.max(lambda / 10, 1e-12)
        improved = !done
        break
      }
      lambda *= 10
    }
    if (!improved) break
  }
  const sig = parameterSigmas(cur.cols, ssr, n)
  return { amplitude: p[0], centre: p[1], halfWidth: p[2], centreSigma: sig[1], rmsResidual: Math.sqrt(ssr / n) }
}
