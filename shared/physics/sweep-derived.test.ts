// Derived sweep axes and the window a sweep point needs, against closed forms.
import { describe, expect, it } from 'vitest'
import { buildSweepPoints } from './sweep-points'
import { criticalPowerOf, energyPerPeakNs, storageDelayNs } from './sweep-derived'
import { applySweepValue, readSweepValue } from './sweep-fields'
import { neededWindowNs } from './sweep-window'
import { SimulationConfig, type SimulationConfigInput } from './simulation-config'
import { erfc } from './pulse-truncation'
import { pulseFwhmNs, transitNs } from './pulse-roles'

const gaussian = (peakPowerW: number, centreNs: number, fwhmNs: number, label?: string) => ({ shape: 'gaussian' as const, peakPowerW, centreNs, fwhmNs, phaseRad: 0, frequencyOffsetMHz: 0, label })

/** A lossless 5 cm chalcogenide-like rib (invented values) storing a data pulse. */
function storageConfig(readNs = 4, windowNs = 8): SimulationConfig {
  const input: SimulationConfigInput = {
    waveguide: { lengthM: 0.05, groupIndex: 2.44, effectiveAreaUm2: 2.3, gainCoefficientMPerW: 3.1e-9, brillouinShiftGHz: 7.7, linewidthMHz: 34 },
    windowNs,
    channels: [{ pump: { pulses: [gaussian(1e-5, 1, 0.2, 'data')] }, stokes: { pulses: [gaussian(10, 1, 0.2, 'write'), gaussian(10, readNs, 0.2, 'read')] } }],
  }
  return SimulationConfig.parse(input)
}

describe('derived sweep axes', () => {
  it('pulse energy at fixed width: ∫P dt/P_peak of a Gaussian is F·√(π/(4 ln 2)), of a sech² 2T₀, and an order-1 super-Gaussian agrees numerically', () => {
    // Source: Gaussian integral ∫e^{−a t²} dt = √(π/a) with a = 4 ln2/F² (common practice); ∫sech²(t/T₀) dt = 2T₀.
    const F = 0.7
    expect(energyPerPeakNs(gaussian(1, 5, F))).toBeCloseTo(F * Math.sqrt(Math.PI / (4 * Math.LN2)), 14)
    expect(energyPerPeakNs({ ...gaussian(1, 5, F), shape: 'sech2' as const })).toBeCloseTo((2 * F) / (2 * Math.log(1 + Math.SQRT2)), 14)
    const sg = energyPerPeakNs({ ...gaussian(1, 5, F), shape: 'superGaussian' as const, order: 1 })
    expect(Math.abs(sg / energyPerPeakNs(gaussian(1, 5, F)) - 1)).toBeLessThan(1e-9)
    // A flat-topped pulse with a rise much shorter than its width carries ≈ its width (within the edges' share).
    const rect = energyPerPeakNs({ ...gaussian(1, 5, 2), shape: 'rectangular' as const, riseNs: 0.002 })
    expect(Math.abs(rect / 2 - 1)).toBeLessThan(1e-3)
    // Sampled: trapezoid rule over the samples, scaled by the largest.
    expect(energyPerPeakNs({ shape: 'sampled', peakPowerW: 1, centreNs: 5, phaseRad: 0, frequencyOffsetMHz: 0, sampleIntervalNs: 0.1, powerShape: [0, 2, 2, 0] })).toBeCloseTo(0.2, 14)
  })

  it('sweeping the energy sets the peak power so that the launched energy is the value, and reads it back', () => {
    const c = storageConfig()
    const set = applySweepValue(c, 'pulseEnergyNJ', 3, 'write')
    const write = set.channels[0].stokes.pulses[0]
    expect(write.peakPowerW * energyPerPeakNs(write)).toBeCloseTo(3, 12)
    expect(readSweepValue(set, 'pulseEnergyNJ', 'write')).toBeCloseTo(3, 12)
    expect(set.channels[0].stokes.pulses[1].peakPowerW).toBe(10) // the read pulse is not tied
  })

  it('CW pump in units of the critical power: P = x·21 A_eff/(η g_B L_eff) (Smith 1972, Appl. Opt. 11, 2489)', () => {
    const c = SimulationConfig.parse({
      waveguide: { lengthM: 20_000, groupIndex: 1.468, effectiveAreaUm2: 80, gainCoefficientMPerW: 5e-11, polarisationFactor: 2 / 3, lossDbPerM: 0.2e-3, brillouinShiftGHz: 10.8, linewidthMHz: 30 },
      windowNs: 1000,
      channels: [{ pump: { backgroundPowerW: 0.001 } }],
    })
    const alpha = 0.2e-3 / (10 / Math.LN10)
    const lEff = -Math.expm1(-alpha * 20_000) / alpha
    const pCr = (21 * 80e-12) / ((2 / 3) * 5e-11 * lEff)
    expect(criticalPowerOf(c)).toBeCloseTo(pCr, 15)
    const set = applySweepValue(c, 'pumpPowerCritical', 0.5, undefined)
    expect(set.channels[0].pump.backgroundPowerW).toBeCloseTo(0.5 * pCr, 15)
    expect(readSweepValue(set, 'pumpPowerCritical')).toBeCloseTo(0.5, 12)
  })

  it('write–read delay moves the read pulse only', () => {
    const c = storageConfig()
    expect(storageDelayNs(c)).toBe(3)
    const set = applySweepValue(c, 'storageDelayNs', 6.5)
    expect(set.channels[0].stokes.pulses.map((p) => p.centreNs)).toEqual([1, 7.5])
    expect(set.channels[0].pump.pulses[0].centreNs).toBe(1)
  })
})

describe('the window a sweep point needs', () => {
  it('a Gaussian at the end gets the window where its energy after the end is 10⁻³: c + erfc⁻¹(2·10⁻³)·F/(2√ln2), rounded up', () => {
    // Source: the fraction of a Gaussian pulse's energy beyond c + a is ½ erfc(2√(ln2)·a/F) (common practice).
    // Not parsed: the pulse is cut at 10 ns, which the configuration itself refuses; the window rule fixes it.
    const base = storageConfig()
    const c: SimulationConfig = { ...base, windowNs: 10, channels: [{ ...base.channels[0], pump: { pulses: [gaussian(1, 9.5, 1)], backgroundPowerW: 0 }, stokes: { pulses: [], backgroundPowerW: 0 } }] }
    const need = neededWindowNs(c)
    const k = 2 * Math.sqrt(Math.LN2)
    // The rounded window holds the pulse; 1 % less would not.
    expect(0.5 * erfc(k * (need - 9.5))).toBeLessThanOrEqual(1e-3)
    expect(0.5 * erfc(k * (0.99 * need - 9.5))).toBeGreaterThan(1e-3)
  })

  it('a storage run needs its echo window, the expected arrival + 2 echo widths', () => {
    const c = storageConfig(6, 6.5)
    const t = transitNs(c.waveguide)
    const arrival = 6 + t - 0 // read centre + transit − (write − data)
    const width = Math.sqrt(3 * 0.2 ** 2)
    expect(neededWindowNs(c)).toBeGreaterThanOrEqual(arrival + 2 * width)
    expect(neededWindowNs(c)).toBeLessThan((arrival + 2 * width) * 1.01)
    expect(neededWindowNs(storageConfig(2, 20))).toBe(20) // long enough already
  })

  it('a delay sweep with tied widths lengthens only the points that need it, and says from what', () => {
    const base = storageConfig(3, 5)
    const built = buildSweepPoints({
      baseConfig: base,
      axes: [
        { field: 'storageDelayNs', values: { kind: 'list', values: [1, 2, 8] } },
        { field: 'pulseFwhmNs', pulseLabel: 'data', tiedLabels: ['write'], values: { kind: 'list', values: [0.2, 0.3] } },
      ],
    })
    if (!built.ok) throw new Error(JSON.stringify(built.issues))
    const last = built.points[built.points.length - 1]
    expect(last.values).toEqual([8, 0.3])
    expect(last.windowExtendedFromNs).toBe(5)
    expect(last.config.windowNs).toBeGreaterThan(9)
    expect(pulseFwhmNs(last.config.channels[0].pump.pulses[0])).toBe(0.3)
    expect(pulseFwhmNs(last.config.channels[0].stokes.pulses[0])).toBe(0.3)
    expect(pulseFwhmNs(last.config.channels[0].stokes.pulses[1])).toBe(0.2)
    expect(built.points[0].windowExtendedFromNs).toBeUndefined()
    expect(built.points[0].config.windowNs).toBe(5)

    const kept = buildSweepPoints({ baseConfig: base, extendWindow: false, axes: [{ field: 'storageDelayNs', values: { kind: 'list', values: [1, 8] } }] })
    expect(kept.ok).toBe(false)
    if (!kept.ok) expect(kept.issues[0].message).toMatch(/^Point 2 \(Write–read delay \(ns\) = 8\) is not a valid run/)
  })

  it('refuses a tied label the base configuration does not have, naming it', () => {
    const built = buildSweepPoints({ baseConfig: storageConfig(), axes: [{ field: 'pulseFwhmNs', pulseLabel: 'data', tiedLabels: ['wirte'], values: { kind: 'list', values: [0.2] } }] })
    expect(built.ok).toBe(false)
    if (!built.ok) expect(built.issues[0]).toMatchObject({ path: 'axes.0.tiedLabels.0', message: expect.stringMatching(/no pulse labelled "wirte"/) })
  })
})
