import { describe, expect, it } from 'vitest'
import { Waveguide } from '@shared/physics/waveguide'
import { GaussianPulse } from '@shared/physics/pulse'
import { GridSettings } from '@shared/physics/simulation-config'
import { fieldText } from './field-meta'
import { samplePortPower } from './input-preview'
import { describeIssuePath } from './issue-labels'
import { formatNumber } from './format'

describe('fieldText reads label and unit from the shared schema descriptions', () => {
  it.each([
    [Waveguide.shape.lengthM.description, 'Interaction length L', 'm'],
    [Waveguide.shape.gainCoefficientMPerW.description, 'Peak Brillouin gain coefficient g_B', 'm/W'],
    [Waveguide.shape.phaseIndex.description, 'Phase (effective) index n', undefined],
    [Waveguide.shape.polarisationFactor.description, 'Polarisation factor η_pol (1 = aligned, 2/3 = scrambled)', undefined],
    [GaussianPulse.shape.phaseRad.description, 'Carrier phase', 'rad'],
    [GridSettings.shape.timeStepPs.description, 'Time step Δt', 'ps'],
  ])('%s', (description, label, unit) => {
    const t = fieldText(description)
    expect(t.label).toBe(label)
    expect(t.unit).toBe(unit)
    expect(t.hint).toBe(description)
  })
})

describe('samplePortPower', () => {
  it('puts half the peak power at t₀ ± FWHM/2 of a Gaussian (definition of the power FWHM)', () => {
    // 2001 samples over 4 ns: a 0.002 ns step lands exactly on 1.9 and 2.1 ns.
    const pts = samplePortPower({ pulses: [{ shape: 'gaussian', peakPowerW: 2, centreNs: 2, fwhmNs: 0.2 }], backgroundPowerW: 0 }, 4, 2000)
    const at = (t: number) => pts.find(([x]) => Math.abs(x - t) < 1e-9)![1]
    expect(at(2)).toBeCloseTo(2, 12)
    expect(at(1.9)).toBeCloseTo(1, 9)
    expect(at(2.1)).toBeCloseTo(1, 9)
  })

  it('adds the background coherently: |√P_bg + √P|² at the peak', () => {
    const pts = samplePortPower({ pulses: [{ shape: 'gaussian', peakPowerW: 1, centreNs: 1, fwhmNs: 0.2 }], backgroundPowerW: 0.01 }, 2, 200)
    expect(pts[100][1]).toBeCloseTo((1 + 0.1) ** 2, 12)
    expect(pts[0][1]).toBeCloseTo(0.01, 6)
  })

  it('leaves out a pulse that does not parse yet', () => {
    const pts = samplePortPower({ pulses: [{ shape: 'gaussian', peakPowerW: -1, centreNs: 1, fwhmNs: 0.2 }], backgroundPowerW: 0 }, 2, 10)
    expect(pts.every(([, p]) => p === 0)).toBe(true)
  })
})

describe('describeIssuePath and formatNumber', () => {
  it('names a pulse field in words', () => {
    expect(describeIssuePath(['channels', 0, 'stokes', 'pulses', 1, 'centreNs'], 1)).toBe('Stokes pulse 2, centre time')
    expect(describeIssuePath(['channels', 1, 'offsetGHz'], 2)).toBe('Channel 2, carrier offset')
    expect(describeIssuePath(['grid', 'timeStepPs'], 1)).toBe('Time step')
  })

  it('writes large and small numbers with a power of ten', () => {
    expect(formatNumber(5e-11)).toBe('5 × 10⁻¹¹')
    expect(formatNumber(2.136e8)).toBe('2.136 × 10⁸')
    expect(formatNumber(0.002571)).toBe('0.002571')
    expect(formatNumber(300)).toBe('300')
  })
})

describe('formatNumber above 10⁴', () => {
  it('uses a power of ten rather than e-notation', () => {
    expect(formatNumber(126_600)).toBe('1.266 × 10⁵')
    expect(formatNumber(4897)).toBe('4897')
  })
})
