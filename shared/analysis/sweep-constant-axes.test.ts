import { describe, expect, it } from 'vitest'
import type { SweepDetail } from '../api/sweeps'
import { collapseConstantAxes } from './sweep-constant-axes'

const point = (index: number, values: number[]) => ({ index, values, runId: '00000000-0000-4000-8000-000000000000', status: 'succeeded', progress: 1, attempt: 1, error: null, startedAt: null, finishedAt: null, metrics: {} })

describe('collapseConstantAxes', () => {
  it('turns a two-axis sweep with a one-value axis into a line over the other axis and names the constant', () => {
    const s = {
      axes: [
        { field: 'storageDelayNs', values: { kind: 'list', values: [1, 2, 3] } },
        { field: 'pulseFwhmNs', pulseLabel: 'data', tiedLabels: ['write'], values: { kind: 'list', values: [0.15] } },
      ],
      axisValues: [[1, 2, 3], [0.15]],
      points: [point(0, [1, 0.15]), point(1, [2, 0.15]), point(2, [3, 0.15])],
    } as unknown as SweepDetail
    const c = collapseConstantAxes(s)
    expect(c.constants).toEqual(['Pulse width [data = write] (ns) = 0.15'])
    expect(c.sweep.axes.map((a) => a.field)).toEqual(['storageDelayNs'])
    expect(c.sweep.axisValues).toEqual([[1, 2, 3]])
    expect(c.sweep.points.map((p) => p.values)).toEqual([[1], [2], [3]])
  })

  it('leaves true maps and one-axis sweeps alone', () => {
    const map = { axes: [{}, {}], axisValues: [[1, 2], [3, 4]], points: [] } as unknown as SweepDetail
    expect(collapseConstantAxes(map).sweep).toBe(map)
    const line = { axes: [{}], axisValues: [[1, 2]], points: [] } as unknown as SweepDetail
    expect(collapseConstantAxes(line).constants).toEqual([])
  })
})
