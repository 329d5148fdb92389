// The heatmap of a two-axis sweep labels its axes with the axis values, each to 4 significant digits.
import { describe, expect, it } from 'vitest'
import type { SweepDetail } from '@shared/api/sweeps'
import { heatmapOption } from './sweep-chart-options'

const sweep = {
  id: 'x',
  title: 'Two axes',
  axes: [
    { field: 'detuningMHz', values: { kind: 'list', values: [-60, 10.123456] } },
    { field: 'modulationDelayNs', values: { kind: 'list', values: [-34.28456, 0, 14.6912] } },
  ],
  axisValues: [
    [-60, 10.123456],
    [-34.28456, 0, 14.6912],
  ],
  points: Array.from({ length: 6 }, (_, i) => ({ index: i, values: [0, 0], metrics: { g: i } })),
  metrics: [{ key: 'g', label: 'Gain', unit: 'dB' }],
} as unknown as SweepDetail

describe('heatmapOption', () => {
  it('labels both axes with every value at 4 significant digits', () => {
    const o = heatmapOption(sweep, sweep.metrics[0], 'png')
    expect(o.xAxis.data).toEqual(['-34.28', '0', '14.69'])
    expect(o.yAxis.data).toEqual(['-60', '10.12'])
  })
})
