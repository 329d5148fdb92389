// Time-of-flight resolution against the pump pulse's shape at τ = 10 ns, about one phonon amplitude lifetime
// 1/(πΔν_B) = 10.6 ns in silica (Δν_B = 30 MHz): a short fibre of 12 resolutions with a 5 MHz shift step half way,
// scanned over the detunings the one-click sensing scan plans for it (gain-scan.ts). The trade's figure is
// δz = v_g·τ/2 for a pump pulse of duration τ (Horiguchi & Tateda 1989, J. Lightwave Technol. 7, 1170; common
// practice), measured as the 10–90 % width of the fitted shift across the step. The solver is checked against the
// undepleted small-signal integral (tof-step-reference.ts), and that against the closed forms of a long pulse.
import { describe, expect, it } from 'vitest'
import { assembleSensingMap } from '@shared/analysis/sensing-map'
import { sensingFigures } from '@shared/analysis/sensing-figures'
import { gainScanPlan } from '@shared/physics/gain-scan'
import { Pulse } from '@shared/physics/pulse'
import { pulseDurationNs } from '@shared/physics/pulse-duration'
import { FIBRE, runScan, scanTiming, sensingConfig, VG_M_PER_NS, type ScanSetup } from './sensing-fixtures'
import { referenceStepWidthM } from './tof-step-reference'

/** Quantile of the standard normal distribution at 0.9 (tables): a Gaussian footprint's 10–90 % is 2·1.2816σ. */
const Z90 = 1.2816

function measure(tauNs: number, riseNs?: number) {
  const dz = (VG_M_PER_NS * tauNs) / 2
  const setup: ScanSetup = { lengthM: 12 * dz, pumpFwhmNs: tauNs, pumpPowerW: 0.2 / dz, probePowerW: 1e-4, segments: [{ startM: 6 * dz, endM: 12 * dz, shiftOffsetMHz: 5 }], riseNs }
  const config = sensingConfig(setup, 0)
  const plan = gainScanPlan(config.waveguide)
  const detuningsMHz = Array.from({ length: plan.count }, (_, i) => plan.startMHz + i * plan.stepMHz)
  const { points, dtNs } = runScan(setup, detuningsMHz)
  const pulse = config.channels[0].pump.pulses[0]
  const assemble = (relativeNoiseRms: number) => assembleSensingMap(points, { dtNs, groupIndex: FIBRE.groupIndex, lengthM: setup.lengthM, linewidthMHz: FIBRE.linewidthMHz, pumpCentreNs: scanTiming(setup).pumpCentreNs, pumpFwhmNs: tauNs, relativeNoiseRms, noiseSeed: 7 })
  const map = assemble(0)
  const figures = (m: typeof map, stepMap?: typeof map) => sensingFigures(m, config.waveguide.profile!.segments, FIBRE.groupIndex, pulseDurationNs(pulse), FIBRE.linewidthMHz, stepMap)
  const fig = figures(map)
  const reference = referenceStepWidthM({ pulse, groupIndex: FIBRE.groupIndex, linewidthMHz: FIBRE.linewidthMHz, stepMHz: 5, detuningsMHz })
  // With 0.1 % detector noise: the step read on the noisy map itself, and on the noise-free one as the service does.
  const noisy = assemble(1e-3)
  return { fig, reference, dz, noisyOwn: figures(noisy), noisyClean: figures(noisy, map) }
}

describe('time-of-flight resolution against the pulse shape', () => {
  it('the reference integral reaches the closed forms of a pulse long against the phonon lifetime', () => {
    // Γ_A·τ ≈ 94: the local gain follows the pump power, so the fitted shift across a small step is the
    // power-weighted mean: a linear ramp over v_g·τ/2 for a rectangle (10–90 % = 0.8 of it) and the normal
    // distribution's cumulative for a Gaussian (10–90 % = 2·1.2816σ = 1.0884·FWHM, in space ×v_g/2).
    const lw = 300
    const detuningsMHz = Array.from({ length: 41 }, (_, i) => -3 * lw + (6 * lw * i) / 40)
    const width = (pulse: Pulse) => referenceStepWidthM({ pulse, groupIndex: FIBRE.groupIndex, linewidthMHz: lw, stepMHz: lw / 6, detuningsMHz }) / ((VG_M_PER_NS * 100) / 2)
    expect(Math.abs(width(Pulse.parse({ shape: 'rectangular', peakPowerW: 1, centreNs: 0, fwhmNs: 100, riseNs: 1 })) / 0.8 - 1)).toBeLessThan(0.03)
    expect(Math.abs(width(Pulse.parse({ shape: 'gaussian', peakPowerW: 1, centreNs: 0, fwhmNs: 100 })) / ((2 * Z90) / (2 * Math.sqrt(2 * Math.LN2))) - 1)).toBeLessThan(0.03)
  })

  it('10 ns rectangular pulse (edges τ/5): the solver matches the integral; it resolves about 0.6 of v_g·τ/2', () => {
    const { fig, reference, dz, noisyOwn, noisyClean } = measure(10, 2)
    // A rectangular pulse's duration is its width: the nominal figure is the trade's v_g·τ/2 itself.
    expect(fig.nominalResolutionM).toBeCloseTo(dz, 9)
    expect(Math.abs(fig.measuredResolutionM! / reference - 1)).toBeLessThan(0.05)
    // Below the long-pulse ramp's 0.8 (the phonon builds up while the pulse passes, so the fitted shift weighs
    // the pulse's trailing part) and so more than 10 % from v_g·τ/2: the sensing view says so beside both figures.
    expect(fig.measuredResolutionM! / fig.nominalResolutionM).toBeLessThan(0.8)
    expect(fig.measuredResolutionM! / fig.nominalResolutionM).toBeGreaterThan(0.4)
    // Detector noise of 0.1 % puts the fit's 1σ (≈ 0.8 MHz) above the step's 10 % level (0.5 MHz): read on the
    // noisy map the width measures the noise; read on the noise-free map it stays the pulse's.
    expect(Math.abs((noisyOwn.measuredResolutionM ?? Infinity) / fig.measuredResolutionM! - 1)).toBeGreaterThan(0.1)
    expect(noisyClean.measuredResolutionM).toBe(fig.measuredResolutionM)
  })

  it('10 ns Gaussian pulse: the solver matches the integral, about 10 % wider than v_g·τ/2 with τ its equivalent duration', () => {
    const { fig, reference, dz } = measure(10)
    // τ of a Gaussian: ∫P dt/P_peak = √(π/(4 ln 2))·FWHM (the Gaussian integral).
    expect(fig.nominalResolutionM).toBeCloseTo(dz * Math.sqrt(Math.PI / (4 * Math.LN2)), 6)
    expect(Math.abs(fig.measuredResolutionM! / reference - 1)).toBeLessThan(0.05)
    expect(Math.abs(fig.measuredResolutionM! / fig.nominalResolutionM - 1)).toBeLessThan(0.15)
  })

  it('a 20 ns Gaussian pulse (two phonon lifetimes) resolves v_g·τ/2 within 10 %', () => {
    const { fig, reference } = measure(20)
    expect(Math.abs(fig.measuredResolutionM! / reference - 1)).toBeLessThan(0.05)
    expect(Math.abs(fig.measuredResolutionM! / fig.nominalResolutionM - 1)).toBeLessThan(0.1)
  })
})
