/*
 * Closed forms the solver tests and benchmarks compare with.
 *
 * Exact lossless CW depletion (Tang 1966, J. Appl. Phys. 37, 2945; Damzen et al. 2003 §3.1): with r = ω_p/ω_s
 * and b₀ = P_s(0)/P₀, C = P₀(1 − r b₀) = P_p − rP_s is constant along z and
 *   P_s(z) = b₀C e^{−G_B C z}/(1 − r b₀ e^{−G_B C z}).
 * b₀ ∈ (0, 1/r) is solved by bisection from P_s(L) = P_L (P_s(L) is monotonic in b₀ there); then P_p(L) = C + rP_L.
 */
export interface DepletedCw {
  /** Stokes output P_s(0) (W). */
  stokesOutW: number
  /** Pump output P_p(L) (W). */
  pumpOutW: number
}

export function exactDepletion(p0W: number, pLW: number, gainPerWM: number, lengthM: number, r: number): DepletedCw {
  const psAtL = (b0: number) => {
    const c = p0W * (1 - r * b0)
    const e = Math.exp(-gainPerWM * c * lengthM)
    return (b0 * c * e) / (1 - r * b0 * e)
  }
  let lo = 0
  let hi = 1 / r
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi)
    if (psAtL(mid) < pLW) lo = mid
    else hi = mid
  }
  const b0 = 0.5 * (lo + hi)
  return { stokesOutW: b0 * p0W, pumpOutW: p0W * (1 - r * b0) + r * pLW }
}

/**
 * Slow-light centroid delay (s) of a Gaussian Stokes pulse (amplitude e^{−t²/2T²}) through the small-signal
 * Brillouin transfer function H(δ) = exp{(G₀/2)/[1 − 2iδ/Γ_B]} at zero detuning (Agrawal, Nonlinear Fiber Optics,
 * ch. 9; slow light: Okawachi et al., PRL 94, 153902 (2005)): the group delay −dφ/dδ = (G₀/Γ_B)(1 − x²)/(1 + x²)²,
 * x = 2δ/Γ_B, averaged over the output spectrum |E(δ)|²|H|² with |E|² ∝ e^{−δ²T²}; Simpson's rule on a grid fine
 * enough for 1e-9.
 */
export function slowLightDelayS(g0: number, gammaBPerS: number, rmsWidthS: number): number {
  const T = rmsWidthS
  const N = 200_000, span = 12 / T + 50 * gammaBPerS, h = (2 * span) / N
  let num = 0, den = 0
  for (let i = 0; i <= N; i++) {
    const d = -span + i * h, x = (2 * d) / gammaBPerS
    const w = (i === 0 || i === N ? 1 : i % 2 ? 4 : 2) * Math.exp(-d * d * T * T + g0 / (1 + x * x))
    num += (w * (g0 / gammaBPerS) * (1 - x * x)) / (1 + x * x) ** 2
    den += w
  }
  return num / den
}
