// The solver's normal generator (solver/steppers/ziggurat-normal.ts: the ziggurat of Marsaglia & Tsang 2000
// on xoshiro128**) against the standard normal distribution, and its reproducibility from the seed.
import { describe, expect, it } from 'vitest'
import { ZigguratNormal } from '../../solver/steppers/ziggurat-normal'

/** Normal CDF Φ(x) = ½ erfc(−x/√2), erfc by Abramowitz & Stegun 7.1.26 (|error| ≤ 1.5e-7, far below the KS bound). */
function normalCdf(x: number): number {
  const z = Math.abs(x) / Math.SQRT2
  const t = 1 / (1 + 0.3275911 * z)
  const erfc = t * (0.254829592 + t * (-0.284496736 + t * (1.421413741 + t * (-1.453152027 + t * 1.061405429)))) * Math.exp(-z * z)
  return x >= 0 ? 1 - 0.5 * erfc : 0.5 * erfc
}

/** Kolmogorov–Smirnov statistic D = sup |F_n(x) − Φ(x)| of a sample (sorted in place). */
function ksStatistic(x: Float64Array): number {
  x.sort()
  const n = x.length
  let d = 0
  for (let i = 0; i < n; i++) {
    const f = normalCdf(x[i])
    d = Math.max(d, (i + 1) / n - f, f - i / n)
  }
  return d
}

function draws(seed: number, n: number, scale = 1): Float64Array {
  const g = new ZigguratNormal(seed)
  const x = new Float64Array(n)
  for (let i = 0; i < n; i++) x[i] = scale * g.normal()
  return x
}

const N = 1_000_000
/** KS critical value at the 5 % level for large n: 1.36/√n (Massey 1951, J. Am. Stat. Assoc. 46, 68, table 1). */
const KS_5PC = 1.36 / Math.sqrt(N)

describe('ziggurat normal generator', () => {
  it('passes the Kolmogorov–Smirnov test at 5 % over 10⁶ draws, for two seeds', () => {
    for (const seed of [1, 20261203]) expect(ksStatistic(draws(seed, N))).toBeLessThan(KS_5PC)
  })

  it('the same KS check rejects a normal of standard deviation 1.01 (it has the power to see a 1 % error)', () => {
    // sup |Φ(x/1.01) − Φ(x)| ≈ 0.01·φ(1) = 0.0024 (at x = 1), well above 1.36/√n = 0.00136.
    expect(ksStatistic(draws(1, N, 1.01))).toBeGreaterThan(KS_5PC)
  })

  it('mean 0, variance 1 and fourth moment 3 within 5 standard errors of their estimators over 10⁶ draws', () => {
    // Moments of the standard normal: E x² = 1, E x⁴ = 3, E x⁸ = 105 (common practice). Standard errors of the
    // sample means: √(1/n) for x, √(2/n) for x², √(96/n) for x⁴.
    const x = draws(7, N)
    let m1 = 0, m2 = 0, m4 = 0
    for (const v of x) {
      m1 += v
      m2 += v * v
      m4 += v ** 4
    }
    m1 /= N
    m2 /= N
    m4 /= N
    expect(Math.abs(m1)).toBeLessThan(5 * Math.sqrt(1 / N))
    expect(Math.abs(m2 - 1)).toBeLessThan(5 * Math.sqrt(2 / N))
    expect(Math.abs(m4 - 3)).toBeLessThan(5 * Math.sqrt(96 / N))
  })

  it('tail frequencies beyond 3σ and 4σ match the normal tail within 5 Poisson standard deviations (10⁷ draws)', () => {
    // P(|x| > 3) = 2.69980e-3, P(|x| > 4) = 6.33425e-5 (Abramowitz & Stegun, table 26.1). Both lie beyond
    // r = 3.4426 or across the ziggurat's widest layers, so they test the tail and wedge paths.
    const n = 10_000_000
    const g = new ZigguratNormal(3)
    let beyond3 = 0, beyond4 = 0, above = 0
    for (let i = 0; i < n; i++) {
      const x = g.normal()
      const a = Math.abs(x)
      if (a > 3) beyond3++
      if (a > 4) beyond4++
      if (x > 4) above++
    }
    for (const [count, p] of [[beyond3, 2.6998e-3], [beyond4, 6.33425e-5]]) expect(Math.abs(count - n * p)).toBeLessThan(5 * Math.sqrt(n * p))
    // Both signs in the tail: the upper half of the 4σ tail holds half of it.
    expect(Math.abs(above - (n * 6.33425e-5) / 2)).toBeLessThan(5 * Math.sqrt((n * 6.33425e-5) / 2))
  })

  it('is reproducible bit for bit from the seed, differs between seeds, and continues the stream after copyFrom', () => {
    const a = draws(42, 100_000)
    const b = draws(42, 100_000)
    expect(a.every((v, i) => Object.is(v, b[i]))).toBe(true)
    const c = draws(43, 100_000)
    expect(a.some((v, i) => v !== c[i])).toBe(true)
    const g = new ZigguratNormal(42)
    for (let i = 0; i < 500; i++) g.normal()
    const h = new ZigguratNormal(1)
    h.copyFrom(g)
    for (let i = 500; i < 1500; i++) expect(Object.is(h.normal(), a[i])).toBe(true)
  })

  it('the bulk fill gives the same numbers as single draws, across the slow path (about 1 draw in 36)', () => {
    const a = draws(9, 200_000)
    const g = new ZigguratNormal(9)
    const b = new Float64Array(200_000)
    // Uneven chunks, so chunk edges fall at arbitrary places in the stream.
    for (let k = 0, n = 1; k < b.length; k += n, n = (n * 7 + 3) % 1000 + 1) g.fill(b.subarray(k, Math.min(b.length, k + n)), Math.min(n, b.length - k))
    expect(a.every((v, i) => Object.is(v, b[i]))).toBe(true)
  })
})
