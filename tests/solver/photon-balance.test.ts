// V5 of the physics brief §6: photon-number balance (Manley & Rowe 1956) for colliding pulses.
import { describe, expect, it } from 'vitest'
import { simulateSync } from '../../solver/index'
import { chipConfig, gaussian } from './chip-fixtures'

function collide(frequencyRatioOverride?: number) {
  const r = simulateSync(
    chipConfig({
      windowNs: 12,
      options: { frequencyRatioOverride },
      channels: [{ pump: { pulses: [gaussian(2, 1.5, 0.3)] }, stokes: { pulses: [gaussian(0.05, 1.5, 0.3)] } }],
    }),
  )
  expect(r.status).toBe('finished')
  return r.manifest.figures!.channels[0]
}

describe('photon-number balance', () => {
  it('V5: with the physical ω_p/ω_s the Manley–Rowe residual is ≤ 1e-6 and the Stokes energy gain ≈ 1.82', () => {
    const f = collide()
    expect(f.manleyRoweResidual!).toBeLessThan(1e-6)
    // "≈ 1.82" in the brief (V5); taken as ±1 %.
    expect(f.energyJ.stokesOut / f.energyJ.stokesIn).toBeGreaterThan(1.82 * 0.99)
    expect(f.energyJ.stokesOut / f.energyJ.stokesIn).toBeLessThan(1.82 * 1.01)
  })

  it('V5: with ω_p/ω_s forced to 1.5 the pump loses 1.5× the Stokes gain in energy, to 1e-6', () => {
    const f = collide(1.5)
    const e = f.energyJ
    expect(f.manleyRoweResidual!).toBeLessThan(1e-6)
    expect((e.pumpIn - e.pumpOut) / (e.stokesOut - e.stokesIn)).toBeCloseTo(1.5, 4)
  })
})
