// ECharts options for port traces: power on the left axis and, optionally, phase on a second axis at the
// right, sharing a time axis with zoom. Pure, so the shaping of the data can be tested without a browser.
import { timeUnit } from './map-axes'

export interface TraceInput {
  name: string
  /** Sample times (ns). */
  timeNs: ArrayLike<number>
  /** Complex envelope in √W, interleaved re, im (numpy <c16 layout); |A|² is power in W. */
  field: ArrayLike<number>
  colour?: string
  dashed?: boolean
}

export interface TraceOptionsInput {
  traces: TraceInput[]
  showPhase?: boolean
  /** Most points drawn per series; longer traces keep the largest-power sample of each bucket. */
  maxPoints?: number
  /** Phase is drawn only where power exceeds this fraction of the trace's peak (elsewhere it is noise). */
  phaseFloor?: number
  /** 'dBm' shows 10·log10(P / 1 mW), so a 10 mW pulse and a 10 W pulse are both readable. */
  powerScale?: 'linear' | 'dBm'
}

/** Lowest level drawn on the dBm axis; weaker samples are left blank. */
export const DBM_FLOOR = -60

export const toDbm = (powerW: number): number | null => (powerW > 0 ? Math.max(DBM_FLOOR, 10 * Math.log10(powerW / 1e-3)) : null)

export const DEFAULT_MAX_POINTS = 4000
export const DEFAULT_PHASE_FLOOR = 1e-3

const POWER_UNITS: Array<[number, string]> = [
  [1, 'W'],
  [1e-3, 'mW'],
  [1e-6, 'µW'],
  [1e-9, 'nW'],
]

/** The power unit that shows the largest peak as a number between 1 and 1000. */
export function powerUnit(peakW: number): { unit: string; factor: number } {
  const [f, unit] = POWER_UNITS.find(([f]) => peakW >= f) ?? POWER_UNITS[POWER_UNITS.length - 1]
  return { unit: peakW > 0 ? unit : 'W', factor: peakW > 0 ? 1 / f : 1 }
}

/** Indices to draw: every sample when few, else the largest-power sample of each of `max` buckets. */
export function decimate(power: ArrayLike<number>, max: number): number[] {
  const n = power.length
  if (n <= max) return Array.from({ length: n }, (_, i) => i)
  const out: number[] = []
  const bucket = n / max
  for (let b = 0; b < max; b++) {
    const lo = Math.floor(b * bucket)
    const hi = Math.min(n, Math.floor((b + 1) * bucket))
    let best = lo
    for (let i = lo + 1; i < hi; i++) if (power[i] > power[best]) best = i
    out.push(best)
  }
  if (out[out.length - 1] !== n - 1) out.push(n - 1)
  return out
}

export function tracePower(field: ArrayLike<number>): Float64Array {
  const p = new Float64Array(field.length >> 1)
  for (let k = 0; k < p.length; k++) p[k] = field[2 * k] ** 2 + field[2 * k + 1] ** 2
  return p
}

export function buildTraceOptions(input: TraceOptionsInput) {
  const { traces, showPhase = true, maxPoints = DEFAULT_MAX_POINTS, phaseFloor = DEFAULT_PHASE_FLOOR, powerScale = 'linear' } = input
  const dbm = powerScale === 'dBm'
  const powers = traces.map((t) => tracePower(t.field))
  const peak = Math.max(0, ...powers.map((p) => p.reduce((m, v) => (v > m ? v : m), 0)))
  const pu = powerUnit(peak)
  let tMin = Infinity
  let tMax = -Infinity
  for (const t of traces) {
    if (t.timeNs.length === 0) continue
    tMin = Math.min(tMin, t.timeNs[0])
    tMax = Math.max(tMax, t.timeNs[t.timeNs.length - 1])
  }
  const tu = timeUnit(Number.isFinite(tMax - tMin) ? tMax - tMin : 1)

  const series: Record<string, unknown>[] = []
  traces.forEach((t, i) => {
    const power = powers[i]
    const idx = decimate(power, maxPoints)
    const tracePeak = power.reduce((m, v) => (v > m ? v : m), 0)
    const common = { type: 'line', showSymbol: false, animation: false, color: t.colour }
    series.push({
      ...common,
      name: showPhase ? `${t.name} power` : t.name,
      yAxisIndex: 0,
      lineStyle: { width: 1.5, type: t.dashed ? 'dashed' : 'solid' },
      data: idx.map((k) => [t.timeNs[k] * tu.factor, dbm ? toDbm(power[k]) : power[k] * pu.factor]),
    })
    if (showPhase) {
      series.push({
        ...common,
        name: `${t.name} phase`,
        yAxisIndex: 1,
        connectNulls: false,
        lineStyle: { width: 1, type: 'dotted', opacity: 0.8 },
        data: idx.map((k) => [
          t.timeNs[k] * tu.factor,
          tracePeak > 0 && power[k] > phaseFloor * tracePeak ? Math.atan2(t.field[2 * k + 1], t.field[2 * k]) : null,
        ]),
      })
    }
  })

  return {
    animation: false,
    // One legend entry per trace; its phase (same colour, dotted) is explained in the chart's caption.
    legend: { top: 0, type: 'scroll', icon: 'roundRect', itemWidth: 14, itemHeight: 3, itemGap: 18, data: traces.map((t) => (showPhase ? `${t.name} power` : t.name)) },
    tooltip: { trigger: 'axis', valueFormatter: (v: unknown) => (typeof v === 'number' ? Number(v.toPrecision(4)).toString() : '—') },
    grid: { left: 60, right: showPhase ? 56 : 20, top: 36, bottom: 64 },
    xAxis: {
      type: 'value',
      name: `t (${tu.unit})`,
      nameLocation: 'middle',
      nameGap: 26,
      min: Number.isFinite(tMin) ? tMin * tu.factor : undefined,
      max: Number.isFinite(tMax) ? tMax * tu.factor : undefined,
    },
    yAxis: [
      dbm
        ? { type: 'value', name: 'Power (dBm)', nameLocation: 'middle', nameGap: 44, min: DBM_FLOOR }
        : { type: 'value', name: `Power (${pu.unit})`, nameLocation: 'middle', nameGap: 44, min: 0 },
      ...(showPhase
        ? [{ type: 'value', name: 'Phase (rad)', nameLocation: 'middle', nameGap: 36, min: -Math.PI, max: Math.PI, interval: Math.PI / 2, splitLine: { show: false }, axisLabel: { formatter: (v: number) => (Math.abs(v) < 1e-9 ? '0' : `${(v / Math.PI).toFixed(1)}π`) } }]
        : []),
    ],
    dataZoom: [
      { type: 'inside', xAxisIndex: 0, filterMode: 'none' },
      {
        type: 'slider',
        xAxisIndex: 0,
        height: 16,
        bottom: 8,
        filterMode: 'none',
        // Neutral greys that sit on both themes instead of the library's stock blue.
        borderColor: 'rgba(128,128,128,0.35)',
        fillerColor: 'rgba(128,128,128,0.18)',
        backgroundColor: 'transparent',
        dataBackground: { lineStyle: { color: 'rgba(128,128,128,0.6)' }, areaStyle: { color: 'rgba(128,128,128,0.15)' } },
        selectedDataBackground: { lineStyle: { color: 'rgba(128,128,128,0.8)' }, areaStyle: { color: 'rgba(128,128,128,0.25)' } },
        handleStyle: { color: 'rgba(128,128,128,0.9)', borderColor: 'rgba(128,128,128,0.9)' },
        moveHandleStyle: { color: 'rgba(128,128,128,0.5)' },
        textStyle: { color: 'rgba(128,128,128,1)' },
      },
    ],
    series,
  }
}
