// The step-mean coefficients of the acoustic field (solver/steppers/step-mean.ts and the higher-order ones in
// acoustic-propagator.ts) against independent quadratures: φ_k(z) = ∫₀¹ e^{(1−s)z} s^{k−1}/(k−1)! ds (common
// practice for exponential integrators; Hochbruck & Ostermann, Acta Numerica 19, 209 (2010)), and the mean of b
// of the second-order acoustic equation from a fine classical Runge–Kutta integration (common practice).
import { describe, expect, it } from 'vitest'
import { sveaStepMean } from '../../solver/steppers/step-mean'
import { higherOrderPropagator } from '../../solver/steppers/acoustic-propagator'

/** φ_k(z) by Simpson's rule on 4000 intervals. */
function phiSimpson(zr: number, zi: number, k: number): [number, number] {
  const n = 4000
  let re = 0, im = 0
  for (let i = 0; i <= n; i++) {
    const s = i / n
    const w = (i === 0 || i === n ? 1 : i % 2 ? 4 : 2) / (3 * n)
    const g = s ** (k - 1) / (k === 3 ? 2 : 1)
    const m = Math.exp((1 - s) * zr) * g * w
    re += m * Math.cos((1 - s) * zi)
    im += m * Math.sin((1 - s) * zi)
  }
  return [re, im]
}

describe('step-mean coefficients', () => {
  // Γh/2 and Δh: small (series), moderate, a detuning near the grid rules' limit (square roots before the log).
  it.each([[1e-4, 0], [0.02, 0.01], [0.004, -0.3], [0.3, 0.4], [0.05, 2.5], [0.01, -3.1]])('z = (−%s, %s): φ₁, Δt·φ₂, Δt·φ₃ to 1e-12', (a, d) => {
    const h = 2
    const e = Math.exp(-a)
    const m = sveaStepMean(e * Math.cos(d), e * Math.sin(d), h)
    const [p1, p2, p3] = [1, 2, 3].map((k) => phiSimpson(-a, d, k))
    expect(Math.hypot(m.m0r - p1[0], m.m0i - p1[1])).toBeLessThan(1e-12)
    expect(Math.hypot(m.m1r - h * p2[0], m.m1i - h * p2[1])).toBeLessThan(1e-12)
    expect(Math.hypot(m.m2r - h * p3[0], m.m2i - h * p3[1])).toBeLessThan(1e-12)
  })

  it('higher order: b̄ = meanB·b + meanW·∂t b + meanG0·g₀ + meanG1·(g₁ − g₀) is the mean of b with the source linear over the step', () => {
    // A 1 GHz resonance with a wide line and a step of 20 ps: both eigenvalues far from 0, the fast one ≈ 2iΩ.
    const gamma = 2 * Math.PI * 50e6, omegaB = 2 * Math.PI * 1e9, omega = omegaB + 2 * Math.PI * 20e6, h = 20e-12
    const p = higherOrderPropagator(gamma, omegaB, omega, h)
    type C = [number, number]
    const mul = (x: C, y: C): C => [x[0] * y[0] - x[1] * y[1], x[0] * y[1] + x[1] * y[0]]
    const b0: C = [0.3, -0.2], w0: C = [1e9, 4e8], g0: C = [2e18, -1e18], g1: C = [-5e17, 3e18]
    // y' = M y + (0, g(t)), M = [[0, 1], [−c0, −c1]], g linear from g0 to g1; RK4 with the mean of b by Simpson.
    const c1: C = [gamma, -2 * omega], c0: C = [omegaB * omegaB - omega * omega, -omega * gamma]
    const f = (t: number, b: C, w: C): [C, C] => {
      const g: C = [g0[0] + ((g1[0] - g0[0]) * t) / h, g0[1] + ((g1[1] - g0[1]) * t) / h]
      const c0b = mul(c0, b), c1w = mul(c1, w)
      return [w, [-c0b[0] - c1w[0] + g[0], -c0b[1] - c1w[1] + g[1]]]
    }
    const n = 20000, dt = h / n
    let b = b0, w = w0
    let sr = 0, si = 0
    for (let i = 0; i <= n; i++) {
      const wt = (i === 0 || i === n ? 1 : i % 2 ? 4 : 2) / (3 * n)
      sr += wt * b[0]
      si += wt * b[1]
      if (i === n) break
      const t = i * dt
      const add = (x: C, y: C, s: number): C => [x[0] + s * y[0], x[1] + s * y[1]]
      const [k1b, k1w] = f(t, b, w)
      const [k2b, k2w] = f(t + dt / 2, add(b, k1b, dt / 2), add(w, k1w, dt / 2))
      const [k3b, k3w] = f(t + dt / 2, add(b, k2b, dt / 2), add(w, k2w, dt / 2))
      const [k4b, k4w] = f(t + dt, add(b, k3b, dt), add(w, k3w, dt))
      b = [b[0] + (dt / 6) * (k1b[0] + 2 * k2b[0] + 2 * k3b[0] + k4b[0]), b[1] + (dt / 6) * (k1b[1] + 2 * k2b[1] + 2 * k3b[1] + k4b[1])]
      w = [w[0] + (dt / 6) * (k1w[0] + 2 * k2w[0] + 2 * k3w[0] + k4w[0]), w[1] + (dt / 6) * (k1w[1] + 2 * k2w[1] + 2 * k3w[1] + k4w[1])]
    }
    const dg: C = [g1[0] - g0[0], g1[1] - g0[1]]
    const terms = [mul(p.meanB, b0), mul(p.meanW, w0), mul(p.meanG0, g0), mul(p.meanG1, dg)]
    const mr = terms.reduce((a, x) => a + x[0], 0), mi = terms.reduce((a, x) => a + x[1], 0)
    expect(Math.hypot(mr - sr, mi - si) / Math.hypot(sr, si)).toBeLessThan(1e-9)
  })
})
