import { describe, expect, it } from 'vitest'
import { SimulationConfig, type SimulationConfigInput } from './simulation-config'
import { criticalPowerW, deriveQuantities } from './derived-quantities'

const relErr = (a: number, b: number) => Math.abs(a - b) / Math.abs(b)

// A lossless 20 km fibre with A_eff = 50 µm² and g_B = 5e-11 m/W: the textbook case whose threshold is
// P_cr ≈ 21 A_eff/(g_B L_eff) ≈ 1 mW (Agrawal, Nonlinear Fiber Optics, ch. 9; value from memory).
const fibre = {
  name: 'fibre',
  lengthM: 20_000,
  groupIndex: 1.468,
  effectiveAreaUm2: 50,
  gainCoefficientMPerW: 5e-11,
  brillouinShiftGHz: 10.8,
  linewidthMHz: 30,
  lossDbPerM: 0,
}

const config = (over: Partial<SimulationConfigInput> = {}, waveguide: Record<string, unknown> = {}) =>
  SimulationConfig.parse({
    waveguide: { ...fibre, ...waveguide },
    channels: [{ pump: { pulses: [], backgroundPowerW: 0.01 }, stokes: { pulses: [], backgroundPowerW: 1e-9 } }],
    windowNs: 500,
    ...over,
  })

const derive = (c: SimulationConfig) => deriveQuantities({ waveguide: c.waveguide, config: c })
const row = (c: SimulationConfig, q: string) => derive(c).rows.find((r) => r.quantity === q)

describe('further backward and forward resonances', () => {
  it('a further resonance equal to the main one has the main one’s G_B, κ and G₀ (Agrawal ch. 9; same closed forms)', () => {
    const c = config({}, { additionalResonances: [{ shiftGHz: 10.8, linewidthMHz: 30, gainCoefficientMPerW: 5e-11 }] })
    const d = derive(c)
    const r = d.resonanceFigures.resonances[0]
    expect(relErr(r.gainParameterPerWM, d.gainParameterPerWM)).toBeLessThan(1e-12)
    expect(relErr(r.couplingKappa, d.couplingKappa)).toBeLessThan(1e-12)
    expect(relErr(r.smallSignalGainNepers, d.smallSignalGainNepers)).toBeLessThan(1e-12)
  })

  it('gives G = η g/A_eff, κ = ½√(G·2πΔν) and G P L_eff for a chip forward resonance (hand computed)', () => {
    // g_F = 2e-10 m/W, A_eff = 2.3 µm², η = 1 → G_F = 86.9565 1/(W m); Γ = 2π·40 MHz = 2.51327e8 /s →
    // κ = ½√(86.9565 × 2.51327e8) = 73 916.6; G₀ = 86.9565 × 0.05 W × 0.05 m = 0.217391.
    const c = config(
      { channels: [{ pump: { pulses: [], backgroundPowerW: 0.05 } }], windowNs: 200 },
      { lengthM: 0.05, effectiveAreaUm2: 2.3, forwardResonances: [{ frequencyMHz: 6000, linewidthMHz: 40, gainCoefficientMPerW: 2e-10 }] },
    )
    const r = derive(c).resonanceFigures.resonances[0]
    expect(r.kind).toBe('forward')
    expect(relErr(r.gainParameterPerWM, 86.9565)).toBeLessThan(1e-5)
    expect(relErr(r.couplingKappa, 73_916.6)).toBeLessThan(1e-5)
    expect(relErr(r.smallSignalGainNepers, 0.217391)).toBeLessThan(1e-5)
    expect(row(c, 'forwardResonance1SmallSignalGain')?.label).toBe('Forward resonance 1: small-signal gain exponent')
  })

  it('halves G with the polarisation factor 0.5 of a fibre with scrambled polarisation (Agrawal ch. 9)', () => {
    const extra = { additionalResonances: [{ shiftGHz: 11, linewidthMHz: 30, gainCoefficientMPerW: 5e-11 }] }
    const a = derive(config({}, extra)).resonanceFigures.resonances[0]
    const b = derive(config({}, { ...extra, polarisationFactor: 0.5 })).resonanceFigures.resonances[0]
    expect(b.gainParameterPerWM / a.gainParameterPerWM).toBeCloseTo(0.5, 12)
  })
})

describe('Stokes cascade thresholds (Smith 1972, Appl. Opt. 11, 2489)', () => {
  const cascade = (seedPowerW: number, pumpW = 0.01, noise = false) =>
    config({ channels: [{ pump: { pulses: [], backgroundPowerW: pumpW } }], options: { cascade: { stokesOrders: 3, seedPowerW }, noise: { enabled: noise } } })

  it('puts the 1st order near 1 mW for the textbook fibre, equal to the critical-power row at η = 1', () => {
    const d = derive(cascade(1e-9))
    const first = d.resonanceFigures.cascade!.firstOrderThresholdW
    expect(first).toBeCloseTo(1.05e-3, 6)
    expect(relErr(first, criticalPowerW(50e-12, 5e-11, 20_000))).toBeLessThan(1e-12)
  })

  it('puts the 2nd order where the 1st Stokes itself reaches the same criterion: about twice the 1st (order of magnitude)', () => {
    const c = derive(cascade(1e-9)).resonanceFigures.cascade!
    expect(c.secondOrderStokesThresholdW).toBe(c.firstOrderThresholdW)
    // P_th,1 (1 + ν_p/ν_S1): ν_p = 193.41 THz at 1550 nm, ν_S1 = ν_p − 10.8 GHz → factor 2.0000558.
    expect(c.secondOrderPumpThresholdW / c.firstOrderThresholdW).toBeCloseTo(2.0000558, 6)
  })

  it('warns that unseeded higher orders without thermal noise stay dark, and only then', () => {
    const codes = (c: SimulationConfig) => derive(c).warnings.map((w) => w.code)
    expect(codes(cascade(0))).toContain('cascade-dark')
    expect(codes(cascade(1e-9))).not.toContain('cascade-dark')
    expect(codes(cascade(0, 0.01, true))).not.toContain('cascade-dark')
    expect(codes(config())).not.toContain('cascade-dark')
  })

  it('notes a pump below the 2nd-order estimate, not one above it', () => {
    const codes = (c: SimulationConfig) => derive(c).warnings.map((w) => w.code)
    expect(codes(cascade(1e-9, 1e-3))).toContain('cascade-below-threshold')
    expect(codes(cascade(1e-9, 5e-3))).not.toContain('cascade-below-threshold')
  })
})

describe('co-propagating probe', () => {
  it('reports loss-only transmission −4.343 αL and an isolation of 4.343 G₀ (Agrawal ch. 9, undepleted)', () => {
    // 0.2 dB/km over 20 km: −4 dB. G₀ = (5e-11/50e-12) × 0.01 W × L_eff.
    const c = config(
      { channels: [{ pump: { pulses: [], backgroundPowerW: 0.01 }, stokes: { pulses: [], backgroundPowerW: 1e-9 }, coProbe: { pulses: [], backgroundPowerW: 1e-9 } }] },
      { lossDbPerM: 0.2e-3 },
    )
    const d = derive(c)
    expect(d.resonanceFigures.coProbe!.transmissionDb).toBeCloseTo(-4, 9)
    const alpha = (0.2e-3 * Math.LN10) / 10
    const g0 = 1 * 0.01 * (-Math.expm1(-alpha * 20_000) / alpha)
    expect(relErr(d.resonanceFigures.coProbe!.isolationDb, (10 / Math.LN10) * g0)).toBeLessThan(1e-9)
    expect(derive(config()).resonanceFigures.coProbe).toBeNull()
  })
})

describe('forward-resonance cautions', () => {
  const forward = (over: Record<string, unknown> = {}, channel: Record<string, unknown> = {}) =>
    config(
      { channels: [{ pump: { pulses: [], backgroundPowerW: 0.05 }, ...channel }], windowNs: 200 },
      { lengthM: 0.05, effectiveAreaUm2: 2.3, forwardResonances: [{ frequencyMHz: 6000, linewidthMHz: 40, gainCoefficientMPerW: 2e-10, ...over }] },
    )
  const codes = (c: SimulationConfig) => derive(c).warnings.map((w) => w.code)

  it('warns that a forward Stokes with nothing launched and no noise stays dark', () => {
    expect(codes(forward())).toContain('forward-dark')
    expect(codes(forward({}, { forwardInputs: [{ stokes: { pulses: [], backgroundPowerW: 1e-6 } }] }))).not.toContain('forward-dark')
    expect(codes(config({ ...forward(), options: { noise: { enabled: true } } }))).not.toContain('forward-dark')
  })

  it('notes Stokes–anti-Stokes coupling while |Δk| is below the gain rate G_F P (4.35 1/m here), not above it', () => {
    expect(codes(forward({ antiStokesMismatchPerM: 0 }))).toContain('forward-gain-suppression')
    expect(codes(forward({ antiStokesMismatchPerM: 100 }))).not.toContain('forward-gain-suppression')
    expect(codes(config({ ...forward(), options: { forwardAntiStokes: false } }))).not.toContain('forward-gain-suppression')
  })
})
