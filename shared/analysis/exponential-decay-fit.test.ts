import { describe, expect, it } from 'vitest'
import { fitExponentialDecay } from './exponential-decay-fit'

// A deterministic pseudo-random sequence (a linear congruential generator, Numerical Recipes constants), so the
// noisy case is the same on every run.
function lcg(seed: number) {
  let s = seed >>> 0
  return () => ((s = (1664525 * s + 1013904223) >>> 0) / 2 ** 32)
}
/** Standard normal deviates by the Box–Muller transform (common practice). */
function gaussian(rand: () => number) {
  return () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand())
}

describe('fitExponentialDecay', () => {
  it('recovers Γ of an exact exponential to 1e-9 with a zero error', () => {
    // Γ = 2π·34 MHz in 1/ns, the rate of a 34 MHz Brillouin line (energy decay at Γ_B; docs/model.md conventions).
    const gamma = 2 * Math.PI * 0.034
    const tau = [1, 1.5, 2, 2.5, 3, 3.5, 4, 4.5, 5]
    const r = fitExponentialDecay(tau, tau.map((t) => 0.094 * Math.exp(-gamma * t)))
    expect(r.ok).toBe(true)
    if (!r.ok) return
    expect(Math.abs(r.fit.rate - gamma) / gamma).toBeLessThan(1e-9)
    expect(Math.abs(r.fit.amplitude - 0.094) / 0.094).toBeLessThan(1e-9)
    expect(Math.abs(r.fit.lifetime - 1 / gamma) * gamma).toBeLessThan(1e-9)
    expect(r.fit.rateSigma).toBeLessThan(1e-9 * gamma)
    expect(r.fit.points).toBe(9)
  })

  it('gives a 1σ on Γ that covers the true rate about as often as a normal error should', () => {
    // Additive Gaussian noise of known σ: the covariance s²(JᵀJ)⁻¹ estimate (Press et al., Numerical Recipes,
    // §15.5) should hold the true Γ within 1σ in about 68 % of trials; 200 trials give 68 % ± 3.3 %.
    const gamma = 0.25
    const tau = Array.from({ length: 12 }, (_, i) => 0.5 + i * 0.5)
    const normal = gaussian(lcg(7))
    let within = 0
    let sumPull = 0
    const trials = 200
    for (let k = 0; k < trials; k++) {
      const r = fitExponentialDecay(tau, tau.map((t) => Math.exp(-gamma * t) + 0.01 * normal()))
      if (!r.ok || r.fit.rateSigma === null) throw new Error('fit failed')
      const pull = (r.fit.rate - gamma) / r.fit.rateSigma
      if (Math.abs(pull) <= 1) within++
      sumPull += pull * pull
    }
    expect(within / trials).toBeGreaterThan(0.58)
    expect(within / trials).toBeLessThan(0.78)
    // The pulls' variance is near 1 when the errors are right (it would be far from 1 if σ were off by 2×).
    expect(sumPull / trials).toBeGreaterThan(0.6)
    expect(sumPull / trials).toBeLessThan(1.6)
  })

  it('propagates the rate error to the lifetime as σ_Γ/Γ²', () => {
    const tau = [0, 1, 2, 3, 4]
    const r = fitExponentialDecay(tau, [1, 0.61, 0.37, 0.22, 0.14])
    if (!r.ok) throw new Error(r.reason)
    expect(r.fit.lifetimeSigma).toBeCloseTo(r.fit.rateSigma! / r.fit.rate ** 2, 12)
  })

  it('says why it cannot fit fewer than three positive points', () => {
    const r = fitExponentialDecay([1, 2, 3], [0.5, 0, 0.1])
    expect(r).toEqual({ ok: false, reason: 'needs at least 3 points with a value above 0 (has 2)' })
  })
})
