// Optional terms of the docs/model.md, options checked against closed forms.
import { describe, expect, it } from 'vitest'
import { simulateSync } from '../../solver/index'
import { chipConfig, gaussian, last } from './chip-fixtures'

describe('Kerr option', () => {
  it('gives a lone CW pump the self-phase γ·P·L (γ = n₂ω/(c A_eff)) within 1e-9', () => {
    // Self-phase modulation of a CW wave: φ = γ P L_eff, L_eff = L without loss (Agrawal ch. 4). The step turns the
    // pump once by the tangent-corrected Cayley factor, exact to O(θ⁵) per step (measured 1.7e-11; two half-step
    // Cayley factors gave 9.5e-7).
    const n2 = 1e-17, P = 0.5
    const r = simulateSync(chipConfig({ windowNs: 2, waveguide: { kerrN2M2PerW: n2 }, options: { kerr: true }, channels: [{ pump: { backgroundPowerW: P } }] }))
    const out = r.channels[0].pumpOut
    const n = last(out)
    const gamma = (n2 * 2 * Math.PI * 299_792_458) / (1550e-9 * 299_792_458 * 1e-12)
    expect(Math.abs(Math.atan2(out[2 * n + 1], out[2 * n]) / (gamma * P * 0.05) - 1)).toBeLessThan(1e-9)
  })

  it('applies cross-phase with the factor 2 to a weak Stokes under a CW pump', () => {
    const n2 = 1e-17, P = 0.5
    const run = (kerr: boolean) =>
      simulateSync(chipConfig({ windowNs: 2, waveguide: { kerrN2M2PerW: n2, gainCoefficientMPerW: 1e-16 }, options: { kerr }, channels: [{ pump: { backgroundPowerW: P }, stokes: { backgroundPowerW: 1e-6 } }] }))
    const s = run(true).channels[0].stokesOut
    const n = last(s)
    const gammaS = (n2 * 2 * Math.PI * (299_792_458 / 1550e-9 - 7.7e9)) / (299_792_458 * 1e-12)
    expect(Math.abs(Math.atan2(s[2 * n + 1], s[2 * n]) / (2 * gammaS * P * 0.05) - 1)).toBeLessThan(2e-3)
  })
})

describe('acoustic advection option', () => {
  it('moves a stored grating along +z at v_A (centroid of |b|²) within 2 %', () => {
    const vA = 20_000
    const centroid = (windowNs: number) => {
      const r = simulateSync(
        chipConfig({
          windowNs,
          waveguide: { acousticVelocityMPerS: vA },
          options: { acousticAdvection: true },
          channels: [{ pump: { pulses: [gaussian(0.01, 1, 0.1, 'data')] }, stokes: { pulses: [gaussian(10, 1, 0.1, 'write')] } }],
        }),
      )
      const b = r.finalAcoustic[0]
      let w = 0, s = 0
      for (let j = 0; j < b.length / 2; j++) {
        const p = b[2 * j] ** 2 + b[2 * j + 1] ** 2
        w += p
        s += p * r.zM[j]
      }
      return s / w
    }
    const shift = centroid(21.5) - centroid(1.5)
    expect(Math.abs(shift / (vA * 20e-9) - 1)).toBeLessThan(0.02)
  })

  it('is off by default: the grating stays in place', () => {
    const r = (w: number) => simulateSync(chipConfig({ windowNs: w, channels: [{ pump: { pulses: [gaussian(0.01, 1, 0.1)] }, stokes: { pulses: [gaussian(10, 1, 0.1)] } }] })).finalAcoustic[0]
    const a = r(2.5), b = r(5)
    // Same shape, only decayed uniformly.
    const ratio = (b[100] ** 2 + b[101] ** 2) / (a[100] ** 2 + a[101] ** 2)
    const ratio2 = (b[60] ** 2 + b[61] ** 2) / (a[60] ** 2 + a[61] ** 2)
    expect(Math.abs(ratio / ratio2 - 1)).toBeLessThan(1e-9)
  })
})
