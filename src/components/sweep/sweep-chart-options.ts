// ECharts options for a sweep: 1-D = one line per chosen metric against the axis (one y-axis per unit),
// 2-D = a heatmap of one metric over both axes. Points without a value yet are gaps, so the plot fills in.
import { axisLabel, type MetricColumn, type SweepDetail } from '@shared/api/sweeps'
import { formatValue, unitSuffix } from './sweep-format'

export type ImageType = 'png' | 'svg'

// Line charts put it bottom right, clear of the legend's row (which needs the full width on a phone).
const toolbox = (name: string, type: ImageType, place: Record<string, number> = { right: 4, bottom: 0 }) => ({
  ...place,
  feature: { saveAsImage: { name, type, title: `Save as ${type.toUpperCase()}`, pixelRatio: 2 } },
})

const fileName = (s: SweepDetail) => `${s.title.replace(/[^A-Za-z0-9._-]+/g, '-').slice(0, 60) || 'sweep'}-${s.id.slice(0, 8)}`

const tickLabel = (v: number) => (v !== 0 && (Math.abs(v) >= 1e4 || Math.abs(v) < 1e-3) ? v.toExponential(2) : String(v))

export function lineOption(s: SweepDetail, metrics: MetricColumn[], type: ImageType) {
  const axis = s.axes[0]
  const units = [...new Set(metrics.map((m) => m.unit))]
  return {
    animation: false,
    toolbox: toolbox(fileName(s), type),
    tooltip: { trigger: 'axis', valueFormatter: (v: number | null) => formatValue(v) },
    legend: { top: 0, left: 8, right: 8, type: 'scroll' },
    grid: { left: 64, right: 40 + Math.max(0, units.length - 1) * 64, top: 48, bottom: 52 },
    xAxis: {
      type: axis.values.kind === 'log' ? 'log' : 'value',
      name: axisLabel(axis),
      nameLocation: 'middle',
      nameGap: 30,
      scale: true,
      axisLabel: { formatter: (v: number) => formatValue(v) },
    },
    yAxis: units.map((u, i) => ({
      type: 'value',
      // Fractions and pure numbers need no axis title (the legend carries the unit); it would sit on the legend.
      name: unitSuffix(u) ? u : '',
      position: i === 0 ? 'left' : 'right',
      offset: i > 1 ? (i - 1) * 64 : 0,
      scale: true,
      alignTicks: false,
      splitLine: { show: i === 0 },
      // Tick values are already round; only very large or small ones need an exponent.
      axisLabel: { formatter: tickLabel },
    })),
    series: metrics.map((m) => ({
      name: `${m.label}${m.unit === '1' ? '' : ` (${m.unit})`}`,
      type: 'line',
      yAxisIndex: units.indexOf(m.unit),
      showSymbol: true,
      symbolSize: 7,
      connectNulls: false,
      // [x, y, point index]: the index is what a click opens.
      data: s.points.map((p) => [p.values[0], p.metrics[m.key] ?? null, p.index]),
    })),
  }
}

export function heatmapOption(s: SweepDetail, metric: MetricColumn, type: ImageType) {
  const [v0, v1] = s.axisValues
  const data = s.points.map((p) => {
    const i0 = Math.floor(p.index / v1.length)
    const i1 = p.index % v1.length
    return [i1, i0, p.metrics[metric.key] ?? '-']
  })
  const finite = data.map((d) => d[2]).filter((x): x is number => typeof x === 'number')
  return {
    animation: false,
    toolbox: toolbox(fileName(s), type, { right: 8 }),
    tooltip: {
      formatter: (p: { data: [number, number, number | string] }) =>
        `${axisLabel(s.axes[0])}: ${formatValue(v0[p.data[1]])}<br>${axisLabel(s.axes[1])}: ${formatValue(v1[p.data[0]])}<br>` +
        `${metric.label}: ${typeof p.data[2] === 'number' ? formatValue(p.data[2]) + unitSuffix(metric.unit) : 'not yet'}`,
    },
    grid: { left: 84, right: 24, top: 36, bottom: 116 },
    xAxis: { type: 'category', data: v1.map((v) => formatValue(v)), name: axisLabel(s.axes[1]), nameLocation: 'middle', nameGap: 26, splitArea: { show: true } },
    yAxis: { type: 'category', data: v0.map((v) => formatValue(v)), name: axisLabel(s.axes[0]), nameLocation: 'end', splitArea: { show: true } },
    visualMap: {
      min: finite.length ? Math.min(...finite) : 0,
      max: finite.length ? Math.max(...finite) : 1,
      calculable: true,
      orient: 'horizontal',
      left: 'center',
      bottom: 4,
      text: [`${metric.label}${unitSuffix(metric.unit)}`, ''],
      formatter: (v: number) => formatValue(v),
    },
    series: [{ name: metric.label, type: 'heatmap', data, label: { show: v0.length * v1.length <= 64, formatter: (p: { data: [number, number, number | string] }) => (typeof p.data[2] === 'number' ? formatValue(p.data[2]) : '') } }],
  }
}

/** The point a chart click lands on. */
export function clickedPoint(s: SweepDetail, data: unknown): number | null {
  if (!Array.isArray(data)) return null
  if (s.axes.length === 1) return typeof data[2] === 'number' ? data[2] : null
  const n1 = s.axisValues[1].length
  return typeof data[0] === 'number' && typeof data[1] === 'number' ? data[1] * n1 + data[0] : null
}
