import { describe, expect, it } from 'vitest'
import { buildTraceOptions, decimate, powerUnit } from './trace-options'

type Series = { name: string; yAxisIndex: number; data: Array<[number, number | null]>; lineStyle: { type: string } }

describe('trace chart options', () => {
  // A three-sample envelope: A = 1, 2i, 0 (√W) → P = |A|² = 1, 4, 0 W; arg A = 0, π/2, undefined.
  const trace = { name: 'Pump out', timeNs: [0, 1, 2], field: [1, 0, 0, 2, 0, 0] }

  it('plots power |A|² on the left axis and phase arg A on the right, blank where there is no light', () => {
    const o = buildTraceOptions({ traces: [trace] })
    const series = o.series as Series[]
    expect(series.map((s) => s.name)).toEqual(['Pump out power', 'Pump out phase'])
    expect(series[0].yAxisIndex).toBe(0)
    expect(series[0].data).toEqual([
      [0, 1],
      [1, 4],
      [2, 0],
    ])
    expect(series[1].yAxisIndex).toBe(1)
    expect(series[1].data[0][1]).toBeCloseTo(0, 12)
    expect(series[1].data[1][1]).toBeCloseTo(Math.PI / 2, 12)
    expect(series[1].data[2][1]).toBeNull()
    expect(o.yAxis).toHaveLength(2)
    expect(o.yAxis[0].name).toBe('Power (W)')
    expect(o.yAxis[1].name).toBe('Phase (rad)')
    expect(o.xAxis.name).toBe('t (ns)')
  })

  it('zooms on the time axis and drops the phase axis when asked', () => {
    const o = buildTraceOptions({ traces: [trace, { ...trace, name: 'Stokes out', dashed: true }], showPhase: false })
    expect((o.series as Series[]).map((s) => s.name)).toEqual(['Pump out', 'Stokes out'])
    expect((o.series as Series[])[1].lineStyle.type).toBe('dashed')
    expect(o.yAxis).toHaveLength(1)
    expect(o.dataZoom.map((z) => [z.type, z.xAxisIndex])).toEqual([
      ['inside', 0],
      ['slider', 0],
    ])
  })

  it('scales power to mW and time to µs when the numbers call for it', () => {
    const a = Math.sqrt(2e-3) // 2 mW peak
    const o = buildTraceOptions({ traces: [{ name: 'x', timeNs: [0, 5000], field: [a, 0, 0, 0] }] })
    expect(o.yAxis[0].name).toBe('Power (mW)')
    expect(o.xAxis.name).toBe('t (µs)')
    const s = (o.series as Series[])[0]
    expect(s.data[0][0]).toBe(0)
    expect(s.data[1][0]).toBeCloseTo(5, 12)
    expect(s.data[0][1]).toBeCloseTo(2, 9)
    expect(powerUnit(0)).toEqual({ unit: 'W', factor: 1 })
  })

  it('thins long traces without losing a one-sample peak', () => {
    const n = 100_000
    const power = new Float64Array(n)
    power[77_777] = 1
    const idx = decimate(power, 1000)
    expect(idx.length).toBeLessThanOrEqual(1001)
    expect(idx).toContain(77_777)
    expect(idx[idx.length - 1]).toBe(n - 1)
    expect(decimate(new Float64Array(5), 1000)).toEqual([0, 1, 2, 3, 4])
  })
})

describe('trace chart options in dBm', () => {
  it('shows 10·log10(P / 1 mW), blank where there is no light', () => {
    // 10 W → 40 dBm, 1 mW → 0 dBm, 1 µW → −30 dBm (definition of the dBm).
    const field = [Math.sqrt(10), 0, Math.sqrt(1e-3), 0, Math.sqrt(1e-6), 0, 0, 0]
    const o = buildTraceOptions({ traces: [{ name: 'x', timeNs: [0, 1, 2, 3], field }], showPhase: false, powerScale: 'dBm' })
    const ys = (o.series as Series[])[0].data.map((d) => d[1])
    expect(ys[0]).toBeCloseTo(40, 9)
    expect(ys[1]).toBeCloseTo(0, 9)
    expect(ys[2]).toBeCloseTo(-30, 9)
    expect(ys[3]).toBeNull()
    expect(o.yAxis[0].name).toBe('Power (dBm)')
  })
})
