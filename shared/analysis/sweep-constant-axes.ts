// A two-axis sweep whose second (or first) axis takes a single value is a line, not a map: e.g. a write–read
// delay sweep with a one-value width axis that ties the data and write widths together. The chart, the fits
// and the overlays read the collapsed sweep; the constant axis is said in words beside them.
import { axisLabel, type SweepDetail } from '../api/sweeps'

export interface CollapsedSweep {
  sweep: SweepDetail
  /** "Pulse width [data = write] (ns) = 0.15" for each axis held at one value; empty when nothing collapsed. */
  constants: string[]
}

export function collapseConstantAxes(s: SweepDetail): CollapsedSweep {
  if (s.axes.length !== 2) return { sweep: s, constants: [] }
  const single = s.axisValues.map((v) => v.length === 1)
  if (single[0] === single[1]) return { sweep: s, constants: [] }
  const keep = single[0] ? 1 : 0
  const drop = 1 - keep
  const constants = [`${axisLabel(s.axes[drop])} = ${Number(s.axisValues[drop][0].toPrecision(6))}`]
  return {
    constants,
    sweep: {
      ...s,
      axes: [s.axes[keep]],
      axisValues: [s.axisValues[keep]],
      points: s.points.map((p) => ({ ...p, values: [p.values[keep]] })),
    },
  }
}
