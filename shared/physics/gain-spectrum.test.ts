import { describe, expect, it } from 'vitest'
import { cwStokesGainDb, gainCoefficientAt, gainDrive, gainLines, smallSignalExponent } from './gain-spectrum'
import { gainScanPlan } from './gain-scan'
import { Waveguide } from './waveguide'
import { axisValues } from '../api/sweeps'

// The test "chip" of docs/validation.md (V6): G_B = η_pol·g_B/A_eff = 6.9e-10/2.3e-12 = 300 /(W m), L = 5 cm,
// Δν_B = 34 MHz; with P = 50 mW, G_B·P·L = 0.75.
const chip = Waveguide.parse({
  lengthM: 0.05,
  groupIndex: 2.44,
  effectiveAreaUm2: 2.3,
  gainCoefficientMPerW: 6.9e-10,
  brillouinShiftGHz: 7.7,
  linewidthMHz: 34,
})

describe('small-signal gain spectrum', () => {
  // Lorentzian gain g_B(Γ_B/2)²/(Δ² + (Γ_B/2)²), Agrawal, Nonlinear Fiber Optics, ch. 9; the values are those of
  // validation case V6 (docs/validation.md): ln gain 0.75, 0.375, 0.15 at Δ = 0, Γ_B/2, Γ_B.
  it('gives ln gain 0.75, 0.375 and 0.15 at detunings 0, half a FWHM and one FWHM', () => {
    expect(smallSignalExponent(chip, 0.05, 0)).toBeCloseTo(0.75, 12)
    expect(smallSignalExponent(chip, 0.05, 17)).toBeCloseTo(0.375, 12)
    expect(smallSignalExponent(chip, 0.05, -34)).toBeCloseTo(0.15, 12)
  })

  it('sums the Lorentzians of further resonances, each at its own shift', () => {
    // Hand computation: second line 60 MHz above the main one, 20 MHz wide, half the peak gain coefficient.
    // At δ = 60 MHz: main 17²/(60² + 17²) = 289/3889, second 1; at δ = 30 MHz: main 289/1189, second 10²/(30² + 10²) = 0.1.
    const w = Waveguide.parse({ ...chip, additionalResonances: [{ shiftGHz: 7.76, linewidthMHz: 20, gainCoefficientMPerW: 3.45e-10 }] })
    expect(gainLines(w).map((l) => l.centreMHz)).toEqual([0, expect.closeTo(60, 9)])
    expect(gainCoefficientAt(gainLines(w), 60) / 6.9e-10).toBeCloseTo(289 / 3889 + 0.5, 9)
    expect(gainCoefficientAt(gainLines(w), 30) / 6.9e-10).toBeCloseTo(289 / 1189 + 0.5 * 0.1, 9)
    expect(smallSignalExponent(w, 0.05, 30)).toBeCloseTo(0.75 * (289 / 1189 + 0.05), 9)
  })

  it('subtracts the loss and uses L_eff for the net gain in dB', () => {
    // Validation case V3's loss, 0.3 dB/cm: αL = 1.5 dB of power; L_eff = (1 − e^{−αL})/α (Agrawal ch. 9).
    const lossy = Waveguide.parse({ ...chip, lossDbPerM: 30 })
    const alpha = 30 / (10 / Math.LN10)
    const lEff = (1 - Math.exp(-alpha * 0.05)) / alpha
    expect(cwStokesGainDb(lossy, 0.05, 0)).toBeCloseTo((10 / Math.LN10) * 300 * 0.05 * lEff - 1.5, 9)
    expect(cwStokesGainDb(chip, 0.05, 0)).toBeCloseTo((10 / Math.LN10) * 0.75, 9)
  })

  it('calls a run CW only when pump and Stokes are both unpulsed', () => {
    const ch = { pump: { pulses: [], backgroundPowerW: 0.05 }, stokes: { pulses: [], backgroundPowerW: 1e-6 } }
    expect(gainDrive({ channels: [ch] } as never)).toEqual({ kind: 'cw', pumpPowerW: 0.05 })
    const pulse = { shape: 'gaussian', peakPowerW: 2, centreNs: 5, fwhmNs: 1, phaseRad: 0, frequencyOffsetMHz: 0 }
    expect(gainDrive({ channels: [{ ...ch, pump: { pulses: [pulse], backgroundPowerW: 0.01 } }] } as never)).toEqual({ kind: 'pulsed', peakPumpPowerW: 2.01 })
  })
})

describe('gain-spectrum scan axis', () => {
  it('spans ±3 linewidths around a single resonance with 41 points', () => {
    const p = gainScanPlan(chip)
    expect([p.startMHz, p.stopMHz, p.count]).toEqual([-102, 102, 41])
    expect(axisValues(p.axis.values)[20]).toBeCloseTo(0, 9)
  })

  it('spans from the lowest line − 3 linewidths to the highest + 3 and resolves the narrowest line', () => {
    const w = Waveguide.parse({ ...chip, additionalResonances: [{ shiftGHz: 7.9, linewidthMHz: 20, gainCoefficientMPerW: 3e-10 }] })
    const p = gainScanPlan(w)
    expect(p.startMHz).toBe(-102)
    expect(p.stopMHz).toBeCloseTo(260, 6)
    // 362 MHz at a third of 20 MHz is 55 steps, 56 points, made odd: 57, finer than the 41 of one line.
    expect(p.count).toBe(57)
    expect(p.stepMHz).toBeLessThanOrEqual(20 / 3)
  })

  it('caps the points of a very wide scan at the axis limit', () => {
    const w = Waveguide.parse({ ...chip, additionalResonances: [{ shiftGHz: 9.7, linewidthMHz: 10, gainCoefficientMPerW: 3e-10 }] })
    expect(gainScanPlan(w).count).toBe(63)
  })
})
