/*
 * Least-squares fit of one Lorentzian line, y(ν) = A / (1 + ((ν − ν₀)/w)²), w the half width at half
 * maximum, by Levenberg–Marquardt (Marquardt 1963) with the Jacobian in closed form:
 *
 *   ∂y/∂A = 1/(1 + x²),   ∂y/∂ν₀ = 2A x /(w (1 + x²)²),   ∂y/∂w = 2A x²/(w (1 + x²)²),   x = (ν − ν₀)/w
 *
 * 1σ of each parameter from the covariance s²(JᵀJ)⁻¹ with s² = SSR/(n − 3) (least-squares.ts).
 */
import { invert, normalMatrix, parameterSigmas } from './least-squares'

export interface LorentzianFit {
  amplitude: number
  centre: number
  halfWidth: number
  centreSigma: number | null
  amplitudeSigma: number | null
  /** Root-mean-square residual (units of y). */
  rmsResidual: number
}

function model(nu: ArrayLike<number>, p: number[]) {
  const [a, c, w] = p
  const y = new Float64Array(nu.length)
  const cols = [new Float64Array(nu.length), new Float64Array(nu.length), new Float64Array(nu.length)]
  for (let i = 0; i < nu.length; i++) {
    const x = (nu[i] - c) / w
    const d = 1 / (1 + x * x)
    y[i] = a * d
    cols[0][i] = d
    cols[1][i] = (2 * a * x * d * d) / w
    cols[2][i] = (2 * a * x * x * d * d) / w
  }
  return { y, cols }
}

const ssrOf = (y: ArrayLike<number>, f: ArrayLike<number>) => {
  let s = 0
  for (let i = 0; i < y.length; i++) s += (y[i] - f[i]) ** 2
  return s
}

/** Fit; `halfWidthGuess` seeds w. Null with fewer than four points or a flat spectrum. */
export function fitLorentzian(nu: ArrayLike<number>, y: ArrayLike<number>, halfWidthGuess: number): LorentzianFit | null {
  const n = nu.length
  if (n < 4) return null
  let k = 0
  for (let i = 1; i < n; i++) if (y[i] > y[k]) k = i
  if (!(y[k] > 0)) return null
  let p = [y[k], nu[k], Math.abs(halfWidthGuess)]
  let cur = model(nu, p)
  let ssr = ssrOf(y, cur.y)
  let lambda = 1e-3
  for (let it = 0; it < 100; it++) {
    const a = normalMatrix(cur.cols)
    const g = [0, 1, 2].map((j) => {
      let s = 0
      for (let i = 0; i < n; i++) s += cur.cols[j][i] * (y[i] - cur.y[i])
      return s
    })
    let improved = false
    while (lambda < 1e12) {
      const damped = a.map((row, i) => row.map((v, j) => (i === j ? v * (1 + lambda) : v)))
      const inv = invert(damped)
      if (!inv) break
      const step = inv.map((row) => row.reduce((s, v, j) => s + v * g[j], 0))
      const trial = [p[0] + step[0], p[1] + step[1], Math.abs(p[2] + step[2])]
      const next = model(nu, trial)
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
  return { amplitude: p[0], centre: p[1], halfWidth: p[2], amplitudeSigma: sig[0], centreSigma: sig[1], rmsResidual: Math.sqrt(ssr / n) }
}
