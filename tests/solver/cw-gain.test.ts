// CW validation cases V3, V4, V6 of the docs/validation.md (chip waveguide, runs ≥ 150 ns).
import { describe, expect, it } from 'vitest'
import { simulateSync } from '../../solver/index'
import { chipConfig, last, powerAt } from './chip-fixtures'
import { exactDepletion } from './closed-forms'

function cwRun(pumpW: number, stokesW: number, extra: Parameters<typeof chipConfig>[0] = {}) {
  const r = simulateSync(chipConfig({ windowNs: 150, channels: [{ pump: { backgroundPowerW: pumpW }, stokes: { backgroundPowerW: stokesW } }], ...extra }))
  expect(r.status).toBe('finished')
  const c = r.channels[0]
  const n = last(c.stokesOut)
  return { r, stokesOut: powerAt(c.stokesOut, n), pumpOut: powerAt(c.pumpOut, n) }
}

describe('CW Brillouin gain', () => {
  it('V3: undepleted gain with loss matches P_s(0)/P_s(L) = exp(G_B P₀ L_eff − αL) = 1.33482 within 0.2 %', () => {
    // Source: undepleted-pump formula, Agrawal, Nonlinear Fiber Optics, ch. 9 (docs/model.md, equations, V3).
    const alpha = 30 / (10 / Math.LN10) // 0.3 dB/cm in 1/m
    const lEff = -Math.expm1(-alpha * 0.05) / alpha
    const expected = Math.exp(300 * 0.05 * lEff - alpha * 0.05)
    expect(expected).toBeCloseTo(1.33482, 4)
    const { stokesOut } = cwRun(0.05, 1e-6, { waveguide: { lossDbPerM: 30 } })
    expect(Math.abs(stokesOut / 1e-6 / expected - 1)).toBeLessThan(0.002)
  })

  it('V4: lossless pump depletion matches the exact solution P_s(0) = 0.182889 W, P_p(L) = 0.318111 W within 0.1 %', () => {
    // Source: exact lossless CW solution (Tang 1966; Damzen et al. 2003 §3.1), docs/model.md, equations.
    const G = 300, L = 0.05, P0 = 0.5, PL = 1e-3
    const exact = (r: number) => {
      const e = exactDepletion(P0, PL, G, L, r)
      return { ps0: e.stokesOutW, ppL: e.pumpOutW }
    }
    // The reference figures of V4 are the closed form with ω_p/ω_s taken as 1.
    const brief = exact(1)
    expect(brief.ps0).toBeCloseTo(0.182889, 6)
    expect(brief.ppL).toBeCloseTo(0.318111, 6)
    const { r, stokesOut, pumpOut } = cwRun(P0, PL)
    // Against those figures at their tolerance, and tighter against the closed form with the run's own ω_p/ω_s.
    expect(Math.abs(stokesOut / 0.182889 - 1)).toBeLessThan(1e-3)
    expect(Math.abs(pumpOut / 0.318111 - 1)).toBeLessThan(1e-3)
    const own = exact(1 / (1 - (7.7e9 * 1550e-9) / 299_792_458)) // ω_p/ω_s with ν_B = 7.7 GHz
    expect(Math.abs(stokesOut / own.ps0 - 1)).toBeLessThan(2e-4)
    expect(Math.abs(pumpOut / own.ppL - 1)).toBeLessThan(2e-4)
    expect(r.manifest.figures!.channels[0].manleyRoweResidual!).toBeLessThan(1e-9)
  })

  it.each([
    [0, 0.75],
    [17, 0.375],
    [34, 0.15],
  ])('V6: detuning %s MHz gives ln gain %s (Lorentzian) within 0.5 %', (detuningMHz, lnGain) => {
    // Source: Lorentzian gain G_B(Γ_B/2)²/(Δ² + (Γ_B/2)²), Agrawal ch. 9; Δ = 0, Γ_B/2, Γ_B with Δν_B = 34 MHz.
    const { stokesOut } = cwRun(0.05, 1e-6, { detuningMHz })
    expect(Math.abs(Math.log(stokesOut / 1e-6) / lnGain - 1)).toBeLessThan(0.005)
  })
})
