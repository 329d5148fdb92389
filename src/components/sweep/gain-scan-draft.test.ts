import { describe, expect, it } from 'vitest'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { toAxis } from './axis-draft'
import { gainScanStart } from './gain-scan-draft'

const config = (extra: object, pump: object = { pulses: [], backgroundPowerW: 0.05 }) =>
  SimulationConfig.parse({
    waveguide: { lengthM: 0.05, groupIndex: 2.44, effectiveAreaUm2: 2.3, gainCoefficientMPerW: 6.9e-10, brillouinShiftGHz: 7.7, linewidthMHz: 34, ...extra },
    channels: [{ pump, stokes: { pulses: [], backgroundPowerW: 1e-6 } }],
    windowNs: 20,
  })

describe('gain-scan start of the sweep form', () => {
  it('turns the scan plan into a detuning axis of ±3 linewidths and says so', () => {
    const s = gainScanStart(config({}))
    expect(toAxis(s.draft)).toEqual({ field: 'detuningMHz', values: { kind: 'linear', start: -102, stop: 102, count: 41 } })
    expect(s.range).toBe('Detuning from -102 to 102 MHz in 41 points, 5.1 MHz apart: ±3 linewidths around the Brillouin resonance.')
    expect(s.chart).toMatch(/closed-form small-signal gain.*last 2 ns of each run/)
    expect(s.config.energyWindows.map((w) => [w.port, w.startNs, w.endNs])).toEqual([['stokesIn', 18, 20], ['stokesOut', 18, 20]])
    // 1/Γ_B = 1/(2π·34 MHz) = 4.68 ns: a 20 ns window is 4.3 lifetimes; 25 lifetimes are 117.03 ns, rounded up to 118.
    expect(s.settle).toMatch(/spans 4\.3 phonon lifetimes.*A window of 118 ns or more/)
    expect(gainScanStart(SimulationConfig.parse({ ...config({}), windowNs: 150 })).settle).toBeNull()
  })

  it('covers every backward resonance and calls a pulsed run’s curve the effective gain', () => {
    const pulse = { shape: 'gaussian', peakPowerW: 1, centreNs: 10, fwhmNs: 2 }
    const s = gainScanStart(config({ additionalResonances: [{ shiftGHz: 7.8, linewidthMHz: 34, gainCoefficientMPerW: 3e-10 }] }, { pulses: [pulse], backgroundPowerW: 0 }))
    expect(s.range).toMatch(/^Detuning from -102 to 202 MHz .*all 2 backward resonances/)
    expect(s.chart).toMatch(/effective gain .* dashed reference/)
    expect(s.config.energyWindows).toEqual([])
    // No profile: an amplifier, not a sensing fibre, so no rectangular pulse is offered.
    expect(s.pulseOffer).toBeNull()
  })

  it('widens the range to the local shift of a hot spot in the profile, and offers a rectangular pump for a time-of-flight scan', () => {
    // A 2 m section 35 K warmer on standard fibre: +35 MHz at about 1 MHz/K (common practice).
    const c = SimulationConfig.parse({
      waveguide: { lengthM: 100, groupIndex: 1.468, effectiveAreaUm2: 80, gainCoefficientMPerW: 5e-11, brillouinShiftGHz: 10.8, linewidthMHz: 30, profile: { segments: [{ startM: 80, endM: 82, temperatureOffsetK: 35 }] } },
      channels: [{ pump: { pulses: [{ shape: 'gaussian', peakPowerW: 0.5, centreNs: 600, fwhmNs: 10, label: 'pump' }] }, stokes: { backgroundPowerW: 1e-3 } }],
      windowNs: 1700,
    })
    const s = gainScanStart(c)
    // From the uniform line's −3 linewidths to the hot spot's +35 MHz + 3 linewidths; points ≤ a third of a linewidth apart.
    expect([s.plan.startMHz, s.plan.stopMHz]).toEqual([-90, 125])
    expect(s.plan.stepMHz).toBeLessThanOrEqual(10)
    expect(s.range).toContain("widened to the profile's local shift changes (0 to 35 MHz) ± 3 linewidths")
    expect(s.chart).toMatch(/sensing scan with the time-of-flight read-out.*spatial resolution \(nominal and measured\)/)
    // A Gaussian's duration ∫P dt/P_peak = √(π/(4 ln 2))·FWHM = 10.64 ns (the Gaussian integral).
    const offer = s.pulseOffer!
    expect(offer.text).toMatch(/rectangular pump pulses\. Use one of τ = 10\.64 ns .*Gaussian.*2\.13 ns edges/)
    const rect = SimulationConfig.parse(offer.config).channels[0].pump.pulses[0]
    expect(rect).toMatchObject({ shape: 'rectangular', fwhmNs: 10.64, riseNs: 2.13, peakPowerW: 0.5, centreNs: 600, label: 'pump' })
    expect(gainScanStart(SimulationConfig.parse(offer.config)).pulseOffer).toBeNull()
    // Without a profile the range stays at ±3 linewidths; a CW pump gets no offer.
    expect(gainScanStart(config({})).pulseOffer).toBeNull()
  })
})
