import { describe, expect, it } from 'vitest'
import { Waveguide } from './waveguide'
import { ForwardResonance } from './resonances'
import { FORWARD_RESONANCE_PRESETS, forwardResonanceFor } from './forward-resonance-presets'
import { findWaveguidePreset } from './waveguide-presets'

describe('typical forward resonances', () => {
  it.each(FORWARD_RESONANCE_PRESETS.map((p) => [p.id, p] as const))('%s names a dated publication and says where values are recalled', (_id, p) => {
    expect(p.source).toMatch(/\b(19|20)\d\d\b/)
    expect(p.source).toMatch(/check against the paper|order of magnitude/)
  })

  it('puts the fibre resonance at a few hundred MHz with a few MHz linewidth (Shelby, Levenson & Bayer 1985) and the chip one at several GHz (Kittlaus et al. 2016)', () => {
    const [fibre, chip] = ['smf-radial', 'silicon-suspended'].map((id) => FORWARD_RESONANCE_PRESETS.find((p) => p.id === id)!)
    expect(fibre.frequencyMHz).toBeGreaterThanOrEqual(100)
    expect(fibre.frequencyMHz).toBeLessThan(1000)
    expect(fibre.linewidthMHz).toBeLessThan(10)
    expect(chip.frequencyMHz).toBeGreaterThan(1000)
    expect(chip.frequencyMHz).toBeLessThan(20_000)
  })

  it.each(FORWARD_RESONANCE_PRESETS.map((p) => [p.id, p] as const))('%s keeps its gain parameter G_F = η g_F/A_eff on a guide of any area and polarisation factor', (_id, p) => {
    for (const w of [Waveguide.parse(findWaveguidePreset('standard-smf')!.waveguide), Waveguide.parse({ ...findWaveguidePreset('as2s3-rib-chip')!.waveguide, polarisationFactor: 0.5 })]) {
      const r = ForwardResonance.parse(forwardResonanceFor(p, w))
      const g = (w.polarisationFactor * r.gainCoefficientMPerW) / (w.effectiveAreaUm2 * 1e-12)
      // Rounded to 3 significant digits in g_F.
      expect(Math.abs(g / p.gainParameterPerWM - 1)).toBeLessThan(5e-3)
    }
  })
})
