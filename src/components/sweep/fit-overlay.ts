// What the sweep's line chart adds for its analyses and axis scales: the fitted curves of
// shared/analysis/sweep-fits.ts on their metric's own y-axis, and logarithmic x and y axes, where values at
// or below zero are left out (a log axis cannot place them).
import type { MetricColumn } from '@shared/api/sweeps'
import type { SweepAnalysis } from '@shared/analysis/sweep-fits'

/** Samples of a fitted curve across the axis: smooth at a few hundred pixels. */
const CURVE_SAMPLES = 201

export const LIFETIME_FIT_NAME = 'Fit η₀·exp(−Γτ)'
export const GAIN_SLOPE_FIT_NAME = 'Fit: small-signal slope'

interface Series {
  name: string
  yAxisIndex?: number
  data?: unknown[]
  [k: string]: unknown
}
interface LineChartOption {
  xAxis: Record<string, unknown>
  yAxis: Record<string, unknown>[]
  series: Series[]
  [k: string]: unknown
}

/** [x, y] samples of an analysis' fitted curve over [lo, hi] on the sweep axis; empty without a fit. */
export function fitCurve(a: SweepAnalysis, lo: number, hi: number): [number, number][] {
  if (!a.result.ok) return []
  const out: [number, number][] = []
  if (a.kind === 'lifetime') {
    const { amplitude, rate } = a.result.fit
    for (let i = 0; i < CURVE_SAMPLES; i++) {
      const x = lo + ((hi - lo) * i) / (CURVE_SAMPLES - 1)
      out.push([x, amplitude * Math.exp(-rate * (x - a.offsetNs))])
    }
    return out
  }
  // The straight line over the points it was fitted to (beyond them the gain saturates), in the axis' unit.
  const { slope, intercept, maxPowerUsedW } = a.result.fit
  const k = a.wattsPerAxisUnit
  const end = Math.min(hi, maxPowerUsedW / k)
  // Sampled, not two end points: on a log power axis the straight line is a curve.
  for (let i = 0; i < CURVE_SAMPLES; i++) {
    const x = lo + ((end - lo) * i) / (CURVE_SAMPLES - 1)
    out.push([x, intercept + slope * x * k])
  }
  return out
}

/** The chart with each analysis' fitted curve drawn beside its plotted metric. */
export function withFitCurves<T extends LineChartOption>(option: T, analyses: SweepAnalysis[], plotted: MetricColumn[], axisValues: number[]): T {
  if (axisValues.length === 0) return option
  const lo = Math.min(...axisValues)
  const hi = Math.max(...axisValues)
  const added: Series[] = []
  for (const a of analyses) {
    const at = plotted.findIndex((m) => m.key === a.metricKey)
    const data = fitCurve(a, lo, hi)
    if (at < 0 || data.length === 0) continue
    added.push({
      name: a.kind === 'lifetime' ? LIFETIME_FIT_NAME : GAIN_SLOPE_FIT_NAME,
      type: 'line',
      yAxisIndex: option.series[at]?.yAxisIndex ?? 0,
      showSymbol: false,
      // Drawn over the points' joining line so it shows where they agree; the points keep the clicks.
      silent: true,
      z: 3,
      lineStyle: { width: 2, type: 'dashed' },
      data,
    })
  }
  return added.length ? { ...option, series: [...option.series, ...added] } : option
}

/** Whether a log x-axis can show every point (all axis values above zero). */
export const logXPossible = (axisValues: number[]) => axisValues.length > 0 && axisValues.every((v) => v > 0)

const positiveOrNull = (v: unknown) => (typeof v === 'number' && v > 0 ? v : null)

/** The chart with log axes as asked (a linear x-axis too, whatever the axis' spacing); points at or below zero become gaps on a log y-axis. */
export function withLogAxes<T extends LineChartOption>(option: T, logX: boolean, logY: boolean): T {
  return {
    ...option,
    xAxis: logX ? { ...option.xAxis, type: 'log', logBase: 10, scale: false } : { ...option.xAxis, type: 'value' },
    yAxis: logY ? option.yAxis.map((y) => ({ ...y, type: 'log', logBase: 10, scale: false })) : option.yAxis,
    series: logY
      ? option.series.map((s) => ({ ...s, data: (s.data ?? []).map((d) => (Array.isArray(d) ? [d[0], positiveOrNull(d[1]), ...d.slice(2)] : d)) }))
      : option.series,
  }
}

/** How many plotted points (curves aside) a log y-axis leaves out: those at or below zero. */
export function hiddenOnLogY(option: Pick<LineChartOption, 'series'>): number {
  let n = 0
  for (const s of option.series) if (!s.silent) for (const d of s.data ?? []) if (Array.isArray(d) && typeof d[1] === 'number' && !(d[1] > 0)) n++
  return n
}
