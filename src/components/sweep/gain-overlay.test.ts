import { describe, expect, it } from 'vitest'
import { axisValues, type SweepDetail } from '@shared/api/sweeps'
import { SimulationConfig, type SimulationConfigInput } from '@shared/physics/simulation-config'
import { metricColumns } from '@shared/analysis/sweep-metrics'
import { withSettledWindows } from '@shared/physics/gain-scan'
import { CLOSED_FORM_NAME, EFFECTIVE_GAIN_NAME, gainOverlay, withGainOverlay } from './gain-overlay'
import { lineOption } from './sweep-chart-options'

// The test "chip" of docs/validation.md: G_B = 300 /(W m), L = 5 cm, Δν_B = 34 MHz, lossless; 50 mW gives
// ln gain 0.75 at line centre (case V6; Lorentzian, Agrawal, Nonlinear Fiber Optics, ch. 9).
const chipConfig = (pump: SimulationConfigInput['channels'][number]['pump']): SimulationConfig =>
  SimulationConfig.parse({
    waveguide: { lengthM: 0.05, groupIndex: 2.44, effectiveAreaUm2: 2.3, gainCoefficientMPerW: 6.9e-10, brillouinShiftGHz: 7.7, linewidthMHz: 34 },
    channels: [{ pump, stokes: { pulses: [], backgroundPowerW: 1e-6 } }],
    windowNs: 20,
  })

function sweepOf(config: SimulationConfig, field: 'detuningMHz' | 'pumpPowerW' = 'detuningMHz'): SweepDetail {
  const axis = { field, values: { kind: 'linear' as const, start: -102, stop: 102, count: 41 } }
  const xs = axisValues(axis.values)
  const metrics = metricColumns(config)
  return {
    axes: [axis],
    axisValues: [xs],
    baseConfig: config,
    metrics,
    points: xs.map((x, index) => ({ index, values: [x], metrics: { peakStokesGainDb: 1, settledStokesGainDb: 1 } })),
    title: 'scan',
    id: '00000000-0000-4000-8000-000000000000',
  } as unknown as SweepDetail
}

describe('gain-spectrum overlay', () => {
  it('draws the CW closed form through 4.343·0.75 dB at line centre and half of it half a FWHM away', () => {
    const o = gainOverlay(sweepOf(withSettledWindows(chipConfig({ pulses: [], backgroundPowerW: 0.05 }))))!
    expect(o.kind).toBe('cw')
    const at = (x: number) => o.curve.find((p) => Math.abs(p[0] - x) < 1e-9)![1]
    const dbPerNeper = 10 / Math.LN10
    expect(at(0)).toBeCloseTo(dbPerNeper * 0.75, 9)
    // The axis ends are samples of the curve: 3 FWHM away the Lorentzian is 17²/(102² + 17²) = 1/37 of its peak.
    expect(at(-102)).toBeCloseTo(dbPerNeper * 0.75 * (17 ** 2 / (102 ** 2 + 17 ** 2)), 9)
    expect(o.curve).toHaveLength(401)
  })

  it('adds a solid closed-form line on the gain axis of a CW scan read over the settled tail', () => {
    const s = sweepOf(withSettledWindows(chipConfig({ pulses: [], backgroundPowerW: 0.05 })))
    expect(gainOverlay(s)!.metricKey).toBe('settledStokesGainDb')
    const cols = s.metrics.filter((m) => m.key === 'settledStokesGainDb')
    const opt = withGainOverlay(lineOption(s, cols, 'png'), s, cols)
    expect(opt.series.map((x) => x.name)).toEqual(['Stokes gain, settled (dB)', CLOSED_FORM_NAME.cw])
    expect((opt.series[1].lineStyle as { type: string }).type).toBe('solid')
    // Points unjoined, so the curve shows between them.
    expect(opt.series[0].lineStyle).toEqual({ opacity: 0 })
  })

  it('draws the closed form dashed, as a reference, over the peak gain of a CW scan without the tail windows', () => {
    const s = sweepOf(chipConfig({ pulses: [], backgroundPowerW: 0.05 }))
    const cols = s.metrics.filter((m) => m.key === 'peakStokesGainDb')
    const opt = withGainOverlay(lineOption(s, cols, 'png'), s, cols)
    expect(opt.series.map((x) => x.name)).toEqual(['Peak Stokes gain (dB)', CLOSED_FORM_NAME.cwPeak])
    expect((opt.series[1].lineStyle as { type: string }).type).toBe('dashed')
  })

  it('calls a pulsed scan the effective gain and draws the CW curve dashed, at the peak pump power', () => {
    const pulse = { shape: 'gaussian' as const, peakPowerW: 0.05, centreNs: 10, fwhmNs: 2 }
    const s = sweepOf(chipConfig({ pulses: [pulse], backgroundPowerW: 0 }))
    const cols = s.metrics.filter((m) => m.key === 'peakStokesGainDb')
    const opt = withGainOverlay(lineOption(s, cols, 'png'), s, cols)
    expect(opt.series.map((x) => x.name)).toEqual([EFFECTIVE_GAIN_NAME, CLOSED_FORM_NAME.pulsed])
    expect((opt.series[1].lineStyle as { type: string }).type).toBe('dashed')
    expect(gainOverlay(s)!.pumpPowerW).toBe(0.05)
  })

  it('leaves other sweeps and charts without the gain alone', () => {
    const s = sweepOf(chipConfig({ pulses: [], backgroundPowerW: 0.05 }), 'pumpPowerW')
    expect(gainOverlay(s)).toBeNull()
    const scan = sweepOf(chipConfig({ pulses: [], backgroundPowerW: 0.05 }))
    const other = scan.metrics.filter((m) => m.key === 'reflectivity')
    expect(withGainOverlay(lineOption(scan, other, 'png'), scan, other).series).toHaveLength(1)
  })

  it('draws no closed form for a waveguide whose response changes along z', () => {
    const warm = chipConfig({ pulses: [], backgroundPowerW: 0.05 })
    warm.waveguide.profile = { segments: [{ startM: 0.01, endM: 0.02, shiftOffsetMHz: 0, temperatureOffsetK: 20, strainMicro: 0 }] }
    expect(gainOverlay(sweepOf(withSettledWindows(warm)))).toBeNull()
  })
})
