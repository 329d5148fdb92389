// The energy in a window that cuts through a pulse, against the closed form for a Gaussian:
// P(t) = P₀·exp(−4 ln2 (t − t_c)²/F²)  ⇒  ∫_a^b P dt = P₀·(F/(2√ln2))·(√π/2)·[erf(u_b) − erf(u_a)], u = 2√ln2 (t − t_c)/F.
import { describe, expect, it } from 'vitest'
import { windowEnergies } from '../../solver/observers/window-energies'
import { energyJ, windowEnergyJ, windowIndices } from '../../solver/observers/trace-measures'
import { chipConfig } from './chip-fixtures'

/** erf by the all-positive series erf x = (2/√π) e^{−x²} Σ 2ⁿ x^{2n+1}/(1·3·…·(2n+1)) (Abramowitz & Stegun 7.1.6). */
function erf(x: number): number {
  let term = x, sum = x
  for (let n = 1; n < 200 && Math.abs(term) > 1e-17 * Math.abs(sum); n++) {
    term *= (2 * x * x) / (2 * n + 1)
    sum += term
  }
  return (2 / Math.sqrt(Math.PI)) * Math.exp(-x * x) * sum
}

const P0 = 0.02, TC_S = 5e-9, F_S = 2e-9, K = 2 * Math.sqrt(Math.LN2)
const exactJ = (aS: number, bS: number) => ((P0 * F_S) / K) * (Math.sqrt(Math.PI) / 2) * (erf((K * (bS - TC_S)) / F_S) - erf((K * (aS - TC_S)) / F_S))

/** The Gaussian as a port trace (interleaved complex √W, real field) sampled at t_n = n·Δt over 0–10 ns. */
function trace(dtS: number): Float64Array {
  const N = Math.round(10e-9 / dtS) + 1
  const a = new Float64Array(2 * N)
  for (let n = 0; n < N; n++) a[2 * n] = Math.sqrt(P0 * Math.exp(-(((K * (n * dtS - TC_S)) / F_S) ** 2)))
  return a
}

describe('energy in a window that cuts through light', () => {
  it('checks the erf series against tabulated values (Abramowitz & Stegun table 7.1)', () => {
    expect(erf(0.5)).toBeCloseTo(0.5204998778, 9)
    expect(erf(1)).toBeCloseTo(0.8427007929, 9)
    expect(erf(2)).toBeCloseTo(0.9953222650, 9)
  })

  it('is second order in the step: halving Δt quarters the error, where counting the end samples in full only halves it', () => {
    // Window edges off the grid and on the pulse's flanks, where the power is ~half its peak.
    const aS = 4.137e-9, bS = 6.291e-9
    const exact = exactJ(aS, bS)
    const steps = [40e-12, 20e-12, 10e-12]
    const trapezoid = steps.map((dt) => Math.abs(windowEnergyJ(trace(dt), dt, aS, bS) / exact - 1))
    const fullEnds = steps.map((dt) => {
      const [n0, n1] = windowIndices(aS * 1e9, bS * 1e9, dt)
      return Math.abs(energyJ(trace(dt), dt, n0, n1) / exact - 1)
    })
    expect(trapezoid[2]).toBeLessThan(1e-5)
    for (let i = 0; i < 2; i++) {
      expect(trapezoid[i] / trapezoid[i + 1]).toBeGreaterThan(3)
      expect(trapezoid[i] / trapezoid[i + 1]).toBeLessThan(5)
    }
    expect(fullEnds[2]).toBeGreaterThan(100 * trapezoid[2])
  })

  it('is what an energy window of a run reports, per channel and in total', () => {
    const dt = 20e-12
    const t = trace(dt)
    const config = chipConfig({ energyWindows: [{ label: 'rising edge', port: 'stokesOut', startNs: 3.05, endNs: 5.01 }] })
    const zero = new Float64Array(t.length)
    const [w] = windowEnergies(config, [{ pumpIn: zero, stokesIn: zero, pumpOut: zero, stokesOut: t }], dt)
    const exact = exactJ(3.05e-9, 5.01e-9)
    expect(Math.abs(w.energyJ! / exact - 1)).toBeLessThan(2e-4)
    expect(w.energyJPerChannel).toEqual([w.energyJ])
  })
})
