import { describe, expect, it } from 'vitest'
import { Waveguide } from './waveguide'
import { WAVEGUIDE_PRESETS, findWaveguidePreset } from './waveguide-presets'
import { brillouinShiftHz, deriveQuantities } from './derived-quantities'

describe('built-in waveguide presets', () => {
  it.each(WAVEGUIDE_PRESETS.map((p) => [p.id, p] as const))('%s parses with the shared Waveguide schema', (_id, preset) => {
    const parsed = Waveguide.safeParse(preset.waveguide)

    expect(parsed.success, JSON.stringify(parsed.error?.issues)).toBe(true)
    expect(preset.source).toMatch(/\d{4}/) // names a dated publication
  })

  it.each(WAVEGUIDE_PRESETS.map((p) => [p.id, p] as const))('%s has ν_B and G_B in its platform range', (_id, preset) => {
    const wg = Waveguide.parse(preset.waveguide)
    const d = deriveQuantities({ waveguide: wg })
    const [nuLo, nuHi] = preset.expected.brillouinShiftGHz
    const [gLo, gHi] = preset.expected.gainParameterPerWM

    expect(wg.brillouinShiftGHz).toBeGreaterThanOrEqual(nuLo)
    expect(wg.brillouinShiftGHz).toBeLessThanOrEqual(nuHi)
    // The Bragg condition ν_B = 2 n v_A/λ (Agrawal ch. 9) must agree with the stated shift to 1 %.
    if (d.brillouinShiftFromIndexGHz !== undefined) {
      expect(Math.abs(d.brillouinShiftFromIndexGHz / wg.brillouinShiftGHz - 1)).toBeLessThan(0.01)
    }
    expect(d.gainParameterPerWM).toBeGreaterThanOrEqual(gLo)
    expect(d.gainParameterPerWM).toBeLessThanOrEqual(gHi)
  })

  it('gives the validation chip of docs/validation.md: n_g = 2.44, L = 5 cm, G_B = 300 /(W m), ν_B = 7.7 GHz, Δν_B = 34 MHz', () => {
    const chip = Waveguide.parse(findWaveguidePreset('as2s3-rib-chip')!.waveguide)

    expect(chip.groupIndex).toBe(2.44)
    expect(chip.lengthM).toBe(0.05)
    expect((chip.polarisationFactor * chip.gainCoefficientMPerW) / (chip.effectiveAreaUm2 * 1e-12)).toBeCloseTo(300, 6)
    expect(chip.brillouinShiftGHz).toBe(7.7)
    expect(chip.linewidthMHz).toBe(34)
  })

  it('puts bulk-silica values of Agrawal ch. 9 (n = 1.45, v_A = 5960 m/s) inside the standard-fibre shift range', () => {
    // Agrawal, Nonlinear Fiber Optics ch. 9: ν_B ≈ 11.1 GHz at 1.55 µm for bulk silica; measured fibre shifts sit just below.
    const nuGHz = brillouinShiftHz(1.45, 5960, 1550e-9) / 1e9
    const [lo, hi] = findWaveguidePreset('standard-smf')!.expected.brillouinShiftGHz

    expect(nuGHz).toBeCloseTo(11.151, 2)
    expect(nuGHz).toBeGreaterThan(lo)
    expect(nuGHz).toBeLessThan(hi)
  })

  it('has unique ids', () => {
    const ids = WAVEGUIDE_PRESETS.map((p) => p.id)
    expect(new Set(ids).size).toBe(ids.length)
  })
})
