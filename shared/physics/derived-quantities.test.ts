import { describe, expect, it } from 'vitest'
import { Waveguide } from './waveguide'
import { SimulationConfig, type SimulationConfigInput } from './simulation-config'
import {
  brillouinGainFromMaterial,
  brillouinShiftHz,
  criticalPowerW,
  deriveQuantities,
  effectiveLengthM,
  thermalOccupation,
} from './derived-quantities'
import { dbPerMToPerM } from './units'

const relErr = (a: number, b: number) => Math.abs(a - b) / Math.abs(b)

const silicaFibre = (over: Partial<Waveguide> = {}) =>
  Waveguide.parse({
    name: 'test fibre',
    lengthM: 20_000,
    groupIndex: 1.468,
    phaseIndex: 1.45,
    lossDbPerM: 0.2e-3,
    effectiveAreaUm2: 80,
    gainCoefficientMPerW: 5e-11,
    brillouinShiftGHz: 11.151,
    linewidthMHz: 15,
    acousticVelocityMPerS: 5960,
    ...over,
  })

const chipConfig = (over: Partial<SimulationConfigInput> = {}): SimulationConfig =>
  SimulationConfig.parse({
    waveguide: {
      lengthM: 0.05,
      groupIndex: 2.44,
      phaseIndex: 2.37,
      effectiveAreaUm2: 2.3,
      gainCoefficientMPerW: 6.9e-10,
      brillouinShiftGHz: 7.7,
      linewidthMHz: 34,
    },
    channels: [{ pump: { pulses: [], backgroundPowerW: 0.05 }, stokes: { pulses: [], backgroundPowerW: 1e-6 } }],
    windowNs: 150,
    ...over,
  })

describe('material and spectral quantities', () => {
  it('V1: ν_B = 2 n v_A/λ gives 11.151 GHz for silica at 1550 nm (Agrawal ch. 9)', () => {
    expect(relErr(brillouinShiftHz(1.45, 5960, 1550e-9), 11.151e9)).toBeLessThan(1e-4)
    const d = deriveQuantities({ waveguide: silicaFibre() })
    expect(relErr(d.brillouinShiftFromIndexGHz!, 11.151)).toBeLessThan(1e-4)
  })

  it('V2: g_B from material constants is 4.867e-11 m/W in both forms (Agrawal ch. 9)', () => {
    const g = brillouinGainFromMaterial(1.45, { photoelasticP12: 0.286, densityKgPerM3: 2210 }, 5960, 1550e-9, 15e6)
    expect(relErr(g.formIndexMPerW, 4.867e-11)).toBeLessThan(1e-3)
    expect(relErr(g.formElectrostrictiveMPerW, 4.867e-11)).toBeLessThan(1e-3)
    // The two forms are the same expression rearranged, so they agree to rounding.
    expect(relErr(g.formIndexMPerW, g.formElectrostrictiveMPerW)).toBeLessThan(1e-12)
  })

  it('reports both phonon lifetimes, energy 1/Γ_B and amplitude 2/Γ_B (docs/model.md, conventions)', () => {
    const d = deriveQuantities({ waveguide: silicaFibre({ linewidthMHz: 20 }) })
    // Γ_B = 2π·20 MHz → 1/Γ_B = 7.9577 ns (hand computed).
    expect(d.phononLifetimeEnergyNs).toBeCloseTo(7.9577, 3)
    expect(d.phononLifetimeAmplitudeNs).toBeCloseTo(2 * 7.9577, 3)
    const labels = d.rows.filter((r) => r.quantity.startsWith('phononLifetime')).map((r) => r.label)
    expect(labels).toEqual(['Phonon lifetime (energy, phonon number)', 'Phonon lifetime (amplitude)'])
  })

  it('infers the sound speed from the stated shift when none is given (Bragg condition, Agrawal ch. 9)', () => {
    const d = deriveQuantities({ waveguide: silicaFibre({ acousticVelocityMPerS: undefined }) })
    expect(relErr(d.acousticVelocityMPerS, 5960)).toBeLessThan(1e-4)
    expect(d.brillouinShiftFromIndexGHz).toBeUndefined()
    // Λ = λ/(2n) = 1550/2.9 nm.
    expect(d.acousticWavelengthNm).toBeCloseTo(534.48, 2)
  })

  it('n_th at 7.7 GHz and 300 K is 811.3 (Bose–Einstein; docs/validation.md V9)', () => {
    expect(relErr(thermalOccupation(7.7e9, 300), 811.3)).toBeLessThan(1e-3)
  })

  it('Kerr γ of standard fibre at 1550 nm is about 1.3 /(W km) (Agrawal ch. 2, from memory)', () => {
    const d = deriveQuantities({ waveguide: silicaFibre({ kerrN2M2PerW: 2.6e-20 }), pumpPowerW: 0.1 })
    expect(d.kerrGammaPerWM * 1000).toBeGreaterThan(1.25)
    expect(d.kerrGammaPerWM * 1000).toBeLessThan(1.4)
    expect(d.kerrPhaseRad).toBeCloseTo(d.kerrGammaPerWM * 0.1 * d.effectiveLengthM, 12)
  })
})

describe('gain and threshold', () => {
  it('V8: L_eff = 13,069.9 m and P_cr = 2.571 mW for 20 km at 0.2 dB/km (Smith 1972)', () => {
    const d = deriveQuantities({ waveguide: silicaFibre() })
    expect(relErr(d.effectiveLengthM, 13069.9)).toBeLessThan(1e-5)
    expect(relErr(d.criticalPowerW, 2.571e-3)).toBeLessThan(1e-3)
    expect(d.rows.find((r) => r.quantity === 'criticalPowerW')!.note).toMatch(/Rule of thumb \(Smith 1972\)/)
  })

  it('L_eff tends to L without loss and to 1/α for a long lossy guide (Agrawal ch. 9)', () => {
    expect(effectiveLengthM(0, 3)).toBe(3)
    expect(relErr(effectiveLengthM(1e-14, 3), 3)).toBeLessThan(1e-12)
    expect(relErr(effectiveLengthM(dbPerMToPerM(0.2e-3), 1e7), 1 / dbPerMToPerM(0.2e-3))).toBeLessThan(1e-9)
    expect(criticalPowerW(80e-12, 5e-11, 1000)).toBeCloseTo((21 * 80e-12) / (5e-11 * 1000), 15)
  })

  it('V3 inputs: G₀ − αL gives the undepleted chip gain ln 1.33482 (docs/validation.md V3, Agrawal ch. 9)', () => {
    // chip: G_B = 300 /(W m), L = 5 cm, α = 0.3 dB/cm, P₀ = 50 mW.
    const d = deriveQuantities({
      waveguide: Waveguide.parse({ lengthM: 0.05, groupIndex: 2.44, lossDbPerM: 30, effectiveAreaUm2: 1, gainCoefficientMPerW: 3e-10, brillouinShiftGHz: 7.7, linewidthMHz: 34 }),
      pumpPowerW: 0.05,
    })
    expect(relErr(Math.exp(d.smallSignalGainNepers - d.lossPerM * 0.05), 1.33482)).toBeLessThan(2e-3)
    expect(d.netGainDb).toBeCloseTo(10 * Math.log10(1.33482), 2)
  })

  it('transit time is n_g L/c (common practice)', () => {
    const d = deriveQuantities({ waveguide: silicaFibre({ lengthM: 1, groupIndex: 1.5 }) })
    expect(d.transitTimeNs).toBeCloseTo(1.5 / 0.299792458, 9)
  })

  it('takes the pump power for G₀ from the config: largest pulse peak plus background', () => {
    const cfg = chipConfig({
      channels: [{ pump: { pulses: [{ shape: 'gaussian', peakPowerW: 0.4, centreNs: 5, fwhmNs: 1 }], backgroundPowerW: 0.01 } }],
      windowNs: 20,
    })
    const d = deriveQuantities({ waveguide: cfg.waveguide, config: cfg })
    expect(d.pumpPowerW).toBeCloseTo(0.41, 12)
    expect(d.smallSignalGainNepers).toBeCloseTo((6.9e-10 / 2.3e-12) * 0.41 * 0.05, 9)
  })
})

describe('grid summary and warnings', () => {
  const codes = (d: ReturnType<typeof deriveQuantities>) => d.warnings.map((w) => w.code)

  it('counts steps across the shortest pulse and warns under 10', () => {
    const cfg = chipConfig({
      channels: [{ pump: { pulses: [{ shape: 'gaussian', peakPowerW: 0.1, centreNs: 5, fwhmNs: 0.05 }] } }],
      windowNs: 10,
    })
    const coarse = deriveQuantities({ waveguide: cfg.waveguide, config: cfg, grid: { dtS: 10e-12, dzM: 1.2e-3, nz: 41, nt: 1000 } })
    expect(coarse.grid!.cellsAcrossShortestPulse).toBeCloseTo(5, 9)
    expect(codes(coarse)).toContain('coarse-grid')
    const fine = deriveQuantities({ waveguide: cfg.waveguide, config: cfg, grid: { dtS: 2e-12, dzM: 2.4e-4, nz: 205, nt: 5000 } })
    expect(codes(fine)).not.toContain('coarse-grid')
  })

  it('warns when G₀ > 15 with noise off, and not once noise is on (shared/physics/derived-warnings.ts)', () => {
    const base = { channels: [{ pump: { pulses: [], backgroundPowerW: 1.2 } }] } // G₀ = 300·1.2·0.05 = 18
    const off = chipConfig(base)
    expect(codes(deriveQuantities({ waveguide: off.waveguide, config: off }))).toContain('gain-without-noise')
    const on = chipConfig({ ...base, options: { noise: { enabled: true } } })
    expect(codes(deriveQuantities({ waveguide: on.waveguide, config: on }))).not.toContain('gain-without-noise')
  })

  it('warns about pulses under 5 acoustic periods only in SVEA mode (shared/physics/derived-warnings.ts)', () => {
    const pulses = [{ shape: 'gaussian' as const, peakPowerW: 0.01, centreNs: 2, fwhmNs: 0.3 }] // 5/7.7 GHz = 649 ps
    const svea = chipConfig({ channels: [{ pump: { pulses } }], windowNs: 5 })
    expect(codes(deriveQuantities({ waveguide: svea.waveguide, config: svea }))).toContain('svea-short-pulse')
    const full = chipConfig({ channels: [{ pump: { pulses } }], windowNs: 5, options: { higherOrderAcoustic: true } })
    expect(codes(deriveQuantities({ waveguide: full.waveguide, config: full }))).not.toContain('svea-short-pulse')
  })

  it('warns when the guide is longer than L_D/10 of the shortest pulse', () => {
    // T = 100 ps/1.665 → L_D = T²/|β₂| = 3.6e-21/2e-26 = 180 km at 20 ps²/km; 20 km > 18 km.
    const cfg = SimulationConfig.parse({
      waveguide: silicaFibre(),
      channels: [{ pump: { pulses: [{ shape: 'gaussian', peakPowerW: 0.001, centreNs: 50, fwhmNs: 0.1 }] } }],
      windowNs: 200_000,
    })
    expect(codes(deriveQuantities({ waveguide: cfg.waveguide, config: cfg }))).toContain('dispersion-not-modelled')
    expect(codes(deriveQuantities({ waveguide: cfg.waveguide, config: cfg }, { dispersionPs2PerKm: 1 }))).not.toContain('dispersion-not-modelled')
  })

  it('gives fibre-fuse, Class 4 and back-reflection cautions for 1.5 W CW in a fibre', () => {
    const cfg = SimulationConfig.parse({
      waveguide: silicaFibre({ lengthM: 100, lossDbPerM: 0 }),
      channels: [{ pump: { pulses: [], backgroundPowerW: 1.5 }, stokes: { pulses: [], backgroundPowerW: 1e-3 } }],
      windowNs: 2000,
    })
    const d = deriveQuantities({ waveguide: cfg.waveguide, config: cfg })
    expect(codes(d)).toEqual(expect.arrayContaining(['fibre-fuse', 'laser-class-4', 'back-reflection']))
    expect(d.warnings.find((w) => w.code === 'fibre-fuse')!.message).toMatch(/laser safety officer/)
  })

  it('quiet chip case: no safety cautions at 50 mW', () => {
    const cfg = chipConfig()
    const got = codes(deriveQuantities({ waveguide: cfg.waveguide, config: cfg }))
    expect(got).not.toContain('fibre-fuse')
    expect(got).not.toContain('laser-class-4')
    expect(got).not.toContain('damage-intensity')
  })

  it('warns when a CW window is shorter than 20/Γ_B (docs/numerics.md)', () => {
    // Γ_B = 2π·34 MHz → 20/Γ_B = 93.6 ns.
    const short = chipConfig({ windowNs: 80 })
    expect(codes(deriveQuantities({ waveguide: short.waveguide, config: short }))).toContain('short-cw-window')
    const long = chipConfig({ windowNs: 100 })
    expect(codes(deriveQuantities({ waveguide: long.waveguide, config: long }))).not.toContain('short-cw-window')
  })

  it('every table row carries a finite value, a unit and a label', () => {
    const cfg = chipConfig()
    const d = deriveQuantities({ waveguide: cfg.waveguide, config: cfg, grid: { dtS: 5e-12, dzM: 6e-4, nz: 82, nt: 30000 } })
    expect(d.rows.length).toBeGreaterThan(20)
    for (const r of d.rows) {
      expect(Number.isFinite(r.value)).toBe(true)
      expect(r.unit.length).toBeGreaterThan(0)
      expect(r.label.length).toBeGreaterThan(0)
    }
  })
})

describe('grid from the shared step rules', () => {
  it('uses chooseGrid when a config is given without a grid: Δz = v_g Δt tiles L', () => {
    const cfg = chipConfig({ grid: { timeStepPs: 5 } })
    const d = deriveQuantities({ waveguide: cfg.waveguide, config: cfg })
    expect(d.grid!.nz * d.grid!.dzM).toBeCloseTo(0.05, 12)
    expect(d.grid!.dzM / d.grid!.dtS).toBeCloseTo(299_792_458 / 2.44, 3)
    expect(d.rows.map((r) => r.quantity)).toContain('spaceStepUm')
  })
})
