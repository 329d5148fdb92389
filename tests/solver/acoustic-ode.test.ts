// Cross-check of the acoustic steps against a general-purpose adaptive ODE solver from npm
// (ode45-cash-karp: Cash & Karp 1990 embedded RK4(5)) on a driven, damped case.
import ode45 from 'ode45-cash-karp'
import { describe, expect, it } from 'vitest'
import { higherOrderPropagator, higherOrderStep, sveaPropagator, sveaStep } from '../../solver/steppers/acoustic-propagator'

// Time in ns to keep the reference solver's step sizes O(1). Γ_B = 2π·34 MHz, Δ = 2π·20 MHz, ν_B = 2 GHz.
const GAMMA = 2 * Math.PI * 0.034
const DELTA = 2 * Math.PI * 0.02
const OMEGA_B = 2 * Math.PI * 2
const OMEGA = OMEGA_B + DELTA
/** Complex Gaussian drive S(t) with a chirp, so both quadratures are exercised. */
const drive = (t: number): [number, number] => {
  const a = Math.exp(-((t - 1.5) ** 2) / (2 * 0.25 ** 2))
  return [a * Math.cos(0.8 * t), a * Math.sin(0.8 * t)]
}
const T_END = 4

function reference(higherOrder: boolean): [number, number] {
  // SVEA: b' = −(Γ/2 − iΔ)b + S. Higher order: b'' = −(Γ − 2iΩ)b' − (Ω_B² − Ω² − iΩΓ)b − 2iΩ S.
  const y0 = new Float64Array(higherOrder ? 4 : 2)
  const f = (dy: number[] | Float64Array, y: number[] | Float64Array, t: number) => {
    const [sr, si] = drive(t)
    if (!higherOrder) {
      dy[0] = -0.5 * GAMMA * y[0] - DELTA * y[1] + sr
      dy[1] = -0.5 * GAMMA * y[1] + DELTA * y[0] + si
      return
    }
    const [br, bi, wr, wi] = [y[0], y[1], y[2], y[3]]
    const c1r = GAMMA, c1i = -2 * OMEGA
    const c0r = OMEGA_B ** 2 - OMEGA ** 2, c0i = -OMEGA * GAMMA
    dy[0] = wr
    dy[1] = wi
    dy[2] = -(c1r * wr - c1i * wi) - (c0r * br - c0i * bi) + 2 * OMEGA * si
    dy[3] = -(c1r * wi + c1i * wr) - (c0r * bi + c0i * br) - 2 * OMEGA * sr
  }
  const integ = ode45(y0, f, 0, 1e-3, { tol: 1e-12, dtMaxMag: 0.01, verbose: false })
  integ.steps(Infinity, T_END)
  return [integ.y[0], integ.y[1]]
}

function ours(higherOrder: boolean, n: number): [number, number] {
  const h = T_END / n
  let b: [number, number] = [0, 0]
  let w: [number, number] = [0, 0]
  const pS = sveaPropagator(GAMMA, DELTA, h)
  const pH = higherOrderPropagator(GAMMA, OMEGA_B, OMEGA, h)
  for (let k = 0; k < n; k++) {
    const s0 = drive(k * h), s1 = drive((k + 1) * h)
    if (higherOrder) [b, w] = higherOrderStep(pH, b, w, s0, s1)
    else b = sveaStep(pS, b, s0, s1)
  }
  return b
}

describe('acoustic step vs ode45-cash-karp', () => {
  it.each([
    ['SVEA integrating factor', false, 400],
    ['higher-order ETD', true, 4000],
  ])('%s agrees with the adaptive reference and converges at second order', (_l, ho, n) => {
    const ref = reference(ho as boolean)
    const err = (steps: number) => {
      const b = ours(ho as boolean, steps)
      return Math.hypot(b[0] - ref[0], b[1] - ref[1]) / Math.hypot(ref[0], ref[1])
    }
    const e1 = err(n as number)
    const e2 = err(2 * (n as number))
    expect(e1).toBeLessThan(1e-3)
    expect(e1 / e2).toBeGreaterThan(3.5)
    expect(e1 / e2).toBeLessThan(4.5)
  })

  it('the higher-order free solution decays at the SVEA rate Γ_B/2 in amplitude', () => {
    // Free acoustic decay (Agrawal ch. 9): with no drive, |b| falls as e^{−Γ_B t/2}; the fast partner is absent
    // when started on the slow eigenvector (∂t b = λ_slow b).
    const h = 0.01
    const p = higherOrderPropagator(GAMMA, OMEGA_B, OMEGA, h)
    const slow: [number, number] = [-0.5 * GAMMA, OMEGA - Math.sqrt(OMEGA_B ** 2 - 0.25 * GAMMA ** 2)]
    let b: [number, number] = [1, 0]
    let w: [number, number] = [slow[0], slow[1]]
    for (let k = 0; k < 1000; k++) [b, w] = higherOrderStep(p, b, w, [0, 0], [0, 0])
    expect(Math.hypot(b[0], b[1])).toBeCloseTo(Math.exp(-0.5 * GAMMA * 10), 10)
  })
})
