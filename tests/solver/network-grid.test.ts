// Step rules of multi-wave runs (shared/physics/network-grid-rules.ts): the main resonance's rules (docs/numerics.md,
// common practice) applied to every resonance and to the light of every wave.
import { describe, expect, it } from 'vitest'
import { chooseGrid } from '@shared/physics/grid-step'
import { chipConfig } from './chip-fixtures'
import { cw } from './network-fixtures'

describe('multi-wave step rules', () => {
  const base = { windowNs: 20, channels: [{ pump: cw(0.5), stokes: cw(1e-3) }] }

  it('a forward resonance ten times stronger than the backward one makes the gain rule ten times stricter (with all inputs counted)', () => {
    const plain = chooseGrid(chipConfig(base))
    const strong = chooseGrid(chipConfig({ ...base, waveguide: { forwardResonances: [{ frequencyMHz: 1000, linewidthMHz: 34, gainCoefficientMPerW: 3e-9 }] } }))
    expect(plain.binding.rule).toMatch(/^G_B·P_max/)
    expect(strong.binding.field).toBe('waveguide.forwardResonances.0.gainCoefficientMPerW')
    // P_max = 0.5 W (pump) for the plain rule, P_all = 0.501 W (all inputs) for the multi-wave one.
    expect(strong.binding.targetDtS / plain.binding.targetDtS).toBeCloseTo((0.1 * 0.5) / 0.501, 9)
  })

  it('a mismatched anti-Stokes gets ten cells per period of e^{iΔk z}', () => {
    const g = chooseGrid(chipConfig({ ...base, waveguide: { forwardResonances: [{ frequencyMHz: 1000, linewidthMHz: 34, gainCoefficientMPerW: 1e-12, antiStokesMismatchPerM: 5000 }] } }))
    expect(g.binding.field).toBe('waveguide.forwardResonances.0.antiStokesMismatchPerM')
    expect(5000 * g.dzM).toBeLessThanOrEqual((2 * Math.PI) / 10 + 1e-12)
  })
})
