import { describe, expect, it } from 'vitest'
import FFT from 'fft.js'
import type { z } from 'zod'
import { sampleInput } from './pulse-envelope'
import { PortInput } from './pulse'
import { sourcePhaseWalk, walkStepNs } from './source-phase'
import { BroadbandSource } from './source-modulation'

/** J_n(x) from its power series Σ_k (−1)^k (x/2)^{2k+n} / (k!(n+k)!) (Abramowitz & Stegun 9.1.10). */
function besselJ(n: number, x: number): number {
  if (n < 0) return (n % 2 === 0 ? 1 : -1) * besselJ(-n, x)
  let term = Math.pow(x / 2, n)
  for (let j = 1; j <= n; j++) term /= j
  let sum = term
  for (let k = 1; k < 200; k++) {
    term *= -(x * x) / 4 / (k * (n + k))
    sum += term
    if (Math.abs(term) < 1e-18) break
  }
  return sum
}

/** Interleaved complex samples → their DFT Σ_k a_k e^{−2πi jk/N} / N (fft.js, a reference radix-4 FFT). */
function dft(trace: Float64Array, n: number): number[] {
  const fft = new FFT(n)
  const out = fft.createComplexArray()
  fft.transform(out, Array.from(trace.subarray(0, 2 * n)))
  return out.map((v) => v / n)
}

const cw = (extra: Partial<z.input<typeof PortInput>>): PortInput => PortInput.parse({ backgroundPowerW: 1, ...extra })

describe('frequency-modulated source', () => {
  it('series Bessel values agree with the handbook table (Abramowitz & Stegun table 9.1)', () => {
    // J0(1) = 0.7651976866, J1(1) = 0.4400505857, J0(2) = 0.2238907791, J1(2) = 0.5767248078 (A&S table 9.1)
    expect(besselJ(0, 1)).toBeCloseTo(0.7651976866, 9)
    expect(besselJ(1, 1)).toBeCloseTo(0.4400505857, 9)
    expect(besselJ(0, 2)).toBeCloseTo(0.2238907791, 9)
    expect(besselJ(1, 2)).toBeCloseTo(0.5767248078, 9)
  })

  // Jacobi–Anger: e^{iβ sin θ} = Σ_n J_n(β) e^{inθ} (A&S 9.1.41), so the n-th sideband carries J_n(β)² of the power.
  for (const [rateMHz, excursionMHz, delayNs] of [
    [10, 10, 0],
    [10, 24.048, 3],
    [25, 125, -7],
    [4, 30, 40],
  ]) {
    it(`has Bessel sideband powers J_n(β)² for f_m = ${rateMHz} MHz, Δf = ${excursionMHz} MHz (to 1e-6)`, () => {
      const n = 4096
      const periods = 4
      const dtS = (periods / (rateMHz * 1e6)) / n
      const trace = sampleInput(cw({ modulation: { rateMHz, excursionMHz, delayNs } }), n, dtS)
      const spec = dft(trace, n)
      const beta = excursionMHz / rateMHz
      let total = 0
      for (let h = -Math.ceil(beta + 12); h <= Math.ceil(beta + 12); h++) {
        const bin = (((h * periods) % n) + n) % n
        const power = spec[2 * bin] ** 2 + spec[2 * bin + 1] ** 2
        expect(Math.abs(power - besselJ(h, beta) ** 2)).toBeLessThan(1e-6)
        total += power
      }
      // Everything sits on the harmonics of f_m: the sidebands hold the whole (unit) power.
      expect(total).toBeCloseTo(1, 9)
    })
  }

  it('leaves the power of pulses and background unchanged (a pure phase factor)', () => {
    const base = { backgroundPowerW: 0.2, pulses: [{ shape: 'gaussian', peakPowerW: 1, centreNs: 5, fwhmNs: 1 }] }
    const plain = sampleInput(PortInput.parse(base), 500, 20e-12)
    const fm = sampleInput(PortInput.parse({ ...base, modulation: { rateMHz: 100, excursionMHz: 2000 } }), 500, 20e-12)
    for (let i = 0; i <= 500; i++) expect(fm[2 * i] ** 2 + fm[2 * i + 1] ** 2).toBeCloseTo(plain[2 * i] ** 2 + plain[2 * i + 1] ** 2, 12)
  })

  it('adds nothing when the port has no modulation (the field is bit for bit the old one)', () => {
    const p = PortInput.parse({ backgroundPowerW: 0.3, pulses: [{ shape: 'sech2', peakPowerW: 2, centreNs: 3, fwhmNs: 0.5, phaseRad: 0.4 }] })
    const t = sampleInput(p, 300, 10e-12)
    const q = sampleInput({ ...p, modulation: undefined, broadband: undefined }, 300, 10e-12)
    expect(Array.from(t)).toEqual(Array.from(q))
    expect(t[1]).not.toBe(0)
  })
})

/** Unwrapped phase of a constant-power field from the per-sample phase steps arg(A_{n+1} A_n*). */
function unwrappedPhase(trace: Float64Array): Float64Array {
  const n = trace.length / 2
  const phi = new Float64Array(n)
  for (let i = 1; i < n; i++) {
    const re = trace[2 * i] * trace[2 * i - 2] + trace[2 * i + 1] * trace[2 * i - 1]
    const im = trace[2 * i + 1] * trace[2 * i - 2] - trace[2 * i] * trace[2 * i - 1]
    phi[i] = phi[i - 1] + Math.atan2(im, re)
  }
  return phi
}

describe('broadband (random-phase) source', () => {
  const linewidthMHz = 10
  const dtNs = 0.5

  it('is the same field bit for bit for the same seed, another for another seed', () => {
    const a = sampleInput(cw({ broadband: { linewidthMHz, seed: 7 } }), 2000, dtNs * 1e-9)
    const b = sampleInput(cw({ broadband: { linewidthMHz, seed: 7 } }), 2000, dtNs * 1e-9)
    const c = sampleInput(cw({ broadband: { linewidthMHz, seed: 8 } }), 2000, dtNs * 1e-9)
    expect(Array.from(a)).toEqual(Array.from(b))
    expect(Array.from(a)).not.toEqual(Array.from(c))
  })

  it('is the same realisation on a grid twice as coarse (every other sample of the fine one)', () => {
    const fine = sampleInput(cw({ broadband: { linewidthMHz, seed: 3 } }), 2000, 0.25e-9)
    const coarse = sampleInput(cw({ broadband: { linewidthMHz, seed: 3 } }), 1000, 0.5e-9)
    for (let i = 0; i <= 1000; i++) {
      expect(coarse[2 * i]).toBeCloseTo(fine[4 * i], 12)
      expect(coarse[2 * i + 1]).toBeCloseTo(fine[4 * i + 1], 12)
    }
  })

  it('has phase-difference variance 2πΔν|τ| (Wiener phase noise, common practice) within 3 %', () => {
    const n = 400_000
    const lags = [2, 20, 100] // samples: τ = 1, 10, 50 ns
    const sums = lags.map(() => 0)
    const counts = lags.map(() => 0)
    for (const seed of [1, 2, 3]) {
      // Half of the record before s = 0: the backward walk must diffuse like the forward one.
      const phi = unwrappedPhase(sampleInput(cw({ broadband: { linewidthMHz, seed, delayNs: (n / 2) * dtNs } }), n, dtNs * 1e-9))
      lags.forEach((lag, li) => {
        // Overlapping lags: every start sample, the estimator with the least scatter for a given record.
        for (let i = 0; i + lag <= n; i++) {
          sums[li] += (phi[i + lag] - phi[i]) ** 2
          counts[li]++
        }
      })
    }
    lags.forEach((lag, li) => {
      const expected = 2 * Math.PI * linewidthMHz * 1e-3 * lag * dtNs
      expect(Math.abs(sums[li] / counts[li] / expected - 1)).toBeLessThan(0.03)
    })
  })

  it('has a Lorentzian power spectrum of FWHM Δν (common practice) within 3 %', () => {
    // Periodograms of 4096-sample segments averaged over 3 seeds × 256 segments (resolution 0.49 MHz).
    const seg = 4096
    const segments = 256
    const fft = new FFT(seg)
    const out = fft.createComplexArray()
    const avg = new Float64Array(seg)
    for (const seed of [11, 12, 13]) {
      const trace = sampleInput(cw({ broadband: { linewidthMHz, seed } }), seg * segments, dtNs * 1e-9)
      for (let s = 0; s < segments; s++) {
        fft.transform(out, Array.from(trace.subarray(2 * s * seg, 2 * (s + 1) * seg)))
        for (let k = 0; k < seg; k++) avg[k] += out[2 * k] ** 2 + out[2 * k + 1] ** 2
      }
    }
    const dfMHz = 1e3 / (seg * dtNs)
    // A Lorentzian S = S₀/(1 + (2f/Δν)²) makes 1/S linear in f²: a least-squares line over |f| ≤ Δν gives S₀ and Δν.
    let sx = 0, sy = 0, sxx = 0, sxy = 0, m = 0
    for (let k = -seg / 2; k < seg / 2; k++) {
      const f = k * dfMHz
      if (Math.abs(f) > linewidthMHz) continue
      const x = f * f
      const y = 1 / avg[(k + seg) % seg]
      sx += x, sy += y, sxx += x * x, sxy += x * y, m++
    }
    const slope = (m * sxy - sx * sy) / (m * sxx - sx * sx)
    const intercept = (sy - slope * sx) / m
    const fwhmMHz = 2 * Math.sqrt(intercept / slope)
    expect(Math.abs(fwhmMHz / linewidthMHz - 1)).toBeLessThan(0.03)
  })

  it('starts its walk at φ(0) = 0 and interpolates between walk nodes', () => {
    const b = BroadbandSource.parse({ linewidthMHz: 100, seed: 5 })
    const h = walkStepNs(b)
    const w = sourcePhaseWalk(b)
    expect(w.at(0)).toBe(0)
    const next = w.at(h)
    expect(w.at(h)).toBe(next)
    expect(sourcePhaseWalk(b).at(h / 4)).toBeCloseTo(next / 4, 14)
  })

  it('gives a port delayed by t_d the same phase t_d later: one source shared by two ports', () => {
    const pump = sampleInput(cw({ broadband: { linewidthMHz, seed: 21 } }), 4000, dtNs * 1e-9)
    const probe = sampleInput(cw({ broadband: { linewidthMHz, seed: 21, delayNs: 300 * dtNs } }), 4000, dtNs * 1e-9)
    for (let i = 300; i <= 4000; i++) {
      expect(probe[2 * i]).toBeCloseTo(pump[2 * (i - 300)], 10)
      expect(probe[2 * i + 1]).toBeCloseTo(pump[2 * (i - 300) + 1], 10)
    }
    // Before its delay has passed the probe reads the walk at s < 0, which is random too, not a constant phase.
    expect(Math.abs(probe[2 * 100 + 1])).toBeGreaterThan(1e-3)
  })

  it('has ⟨φ(s)²⟩ = 2πΔν|s| before s = 0 as well (Brownian bridge back to φ(0) = 0), within 10 % over 2000 seeds', () => {
    // The walk read from s = −10 ns: at s = −5 ns the variance is 2π · 10 MHz · 5 ns = 0.3142 rad².
    let sum = 0
    const seeds = 2000
    for (let seed = 1; seed <= seeds; seed++) {
      const w = sourcePhaseWalk(BroadbandSource.parse({ linewidthMHz, seed, delayNs: 10 }))
      sum += w.at(-5) ** 2
      expect(w.at(0)).toBe(0)
    }
    expect(Math.abs(sum / seeds / (2 * Math.PI * linewidthMHz * 1e-3 * 5) - 1)).toBeLessThan(0.1)
  })
})
