import { describe, expect, it } from 'vitest'
import type { SweepAnalysis } from '@shared/analysis/sweep-fits'
import { fitCurve, hiddenOnLogY, withLogAxes } from './fit-overlay'

const lifetime: SweepAnalysis = {
  kind: 'lifetime',
  metricKey: 'retrievalEfficiency',
  offsetNs: 1,
  anchor: 'write',
  nominalEnergyLifetimeNs: 4.68,
  result: { ok: true, fit: { rate: 0.2, rateSigma: 0.001, amplitude: 0.1, amplitudeSigma: 0.001, lifetime: 5, lifetimeSigma: 0.02, points: 5, rmsResidual: 0 } },
}

describe('fitCurve', () => {
  it('draws η₀·exp(−Γ(x − offset)) across the axis: η₀ at the write time, η₀/e one lifetime later', () => {
    const c = fitCurve(lifetime, 1, 6)
    expect(c[0]).toEqual([1, 0.1])
    expect(c[c.length - 1][0]).toBe(6)
    expect(c[c.length - 1][1]).toBeCloseTo(0.1 / Math.E, 12)
  })

  it('draws the gain line in the axis unit, only over the points it was fitted to', () => {
    const gain: SweepAnalysis = {
      kind: 'gainSlope',
      metricKey: 'peakStokesGainDb',
      wattsPerAxisUnit: 0.5,
      nominalSlopeDbPerW: null,
      result: { ok: true, fit: { slope: 100, slopeSigma: 1, intercept: -1, interceptSigma: 0.1, points: 4, maxPowerUsedW: 0.2, saturatedFromW: 0.3 } },
    }
    // Axis in units of 0.5 W: 0.2 W is 0.4 on the axis; the line there is −1 + 100·0.2 = 19 dB.
    const c = fitCurve(gain, 0.1, 1)
    expect(c[0]).toEqual([0.1, -1 + 100 * 0.05])
    expect(c[c.length - 1][0]).toBeCloseTo(0.4, 12)
    expect(c[c.length - 1][1]).toBeCloseTo(19, 10)
    // Sampled along the way, so it bends correctly on a log axis.
    expect(c.length).toBeGreaterThan(50)
  })
})

describe('withLogAxes', () => {
  it('leaves values at or below zero out of a log y-axis and keeps each point’s index for clicks', () => {
    const option = { xAxis: { type: 'value' }, yAxis: [{ type: 'value' }], series: [{ name: 'η', data: [[1, 0.1, 0], [2, 0, 1], [3, -1, 2]] }] }
    const log = withLogAxes(option, true, true)
    expect(log.xAxis.type).toBe('log')
    expect(log.yAxis[0].type).toBe('log')
    expect(log.series[0].data).toEqual([[1, 0.1, 0], [2, null, 1], [3, null, 2]])
    expect(hiddenOnLogY(option)).toBe(2)
    expect(withLogAxes({ ...option, xAxis: { type: 'log' } }, false, false).xAxis.type).toBe('value')
  })
})
