// A sweep of the detuning plotting the Stokes gain is a gain-spectrum scan: its points are drawn against the
// closed-form Lorentzian sum of shared/physics/gain-spectrum.ts. Solid for CW pump and Stokes read over the
// settled tail of each run (gain-scan.ts); dashed and called a reference when the pump or Stokes is pulsed (the
// points are then the "effective gain") or when a CW scan has only the peak gain, which includes the
// switch-on ringing.
import type { MetricColumn, SweepDetail } from '@shared/api/sweeps'
import { SETTLED_GAIN_COLUMN } from '@shared/analysis/sweep-metrics'
import { cwStokesGainDb, gainDrive, gainLines } from '@shared/physics/gain-spectrum'
import { profileIsActive } from '@shared/physics/longitudinal-profile'

/** Samples of the closed-form curve across the axis: smooth at a few hundred pixels. */
const CURVE_SAMPLES = 401

export interface GainOverlay {
  /** cw: settled CW gain against the closed form; cwPeak: a CW scan without the tail windows; pulsed: effective gain. */
  kind: 'cw' | 'cwPeak' | 'pulsed'
  /** Key of the swept gain column (channel 1's peak Stokes gain). */
  metricKey: string
  pumpPowerW: number
  lines: number
  /** [detuning MHz, gain dB] along the axis. */
  curve: [number, number][]
}

const GAIN_KEYS = ['peakStokesGainDb', 'ch1.peakStokesGainDb']

/** The overlay of a one-axis detuning sweep with a gain column, or null for any other sweep. */
export function gainOverlay(s: Pick<SweepDetail, 'axes' | 'axisValues' | 'baseConfig' | 'metrics'>): GainOverlay | null {
  if (s.axes.length !== 1 || s.axes[0].field !== 'detuningMHz') return null
  // The closed form is that of a uniform guide: one whose response changes along z has none (its read-out is the sensing map).
  if (profileIsActive(s.baseConfig.waveguide.profile)) return null
  const settled = s.metrics.find((m) => m.key === SETTLED_GAIN_COLUMN.key)
  const metric = settled ?? s.metrics.find((m) => GAIN_KEYS.includes(m.key))
  const xs = s.axisValues[0] ?? []
  if (!metric || xs.length < 2) return null
  const drive = gainDrive(s.baseConfig)
  const pumpPowerW = drive.kind === 'cw' ? drive.pumpPowerW : drive.peakPumpPowerW
  if (!(pumpPowerW > 0)) return null
  const lo = Math.min(...xs)
  const hi = Math.max(...xs)
  const w = s.baseConfig.waveguide
  const curve: [number, number][] = []
  for (let i = 0; i < CURVE_SAMPLES; i++) {
    const x = lo + ((hi - lo) * i) / (CURVE_SAMPLES - 1)
    curve.push([x, cwStokesGainDb(w, pumpPowerW, x)])
  }
  const kind = drive.kind === 'pulsed' ? 'pulsed' : settled ? 'cw' : 'cwPeak'
  return { kind, metricKey: metric.key, pumpPowerW, lines: gainLines(w).length, curve }
}

/** The metric a gain scan opens with: the gain alone, so the overlay is drawn on its own axis. */
export function gainScanMetrics(s: Pick<SweepDetail, 'axes' | 'axisValues' | 'baseConfig' | 'metrics'>): string[] | null {
  const o = gainOverlay(s)
  return o ? [o.metricKey] : null
}

export const CLOSED_FORM_NAME = {
  cw: 'Closed form, CW small-signal gain (dB)',
  cwPeak: 'Closed form, CW small-signal gain, reference (dB)',
  pulsed: 'CW closed form at the peak pump power, reference (dB)',
} as const
export const EFFECTIVE_GAIN_NAME = 'Effective gain: peak Stokes gain (dB)'

interface LineSeries {
  name: string
  yAxisIndex?: number
  data: unknown[]
  [k: string]: unknown
}
interface LineChartOption {
  yAxis: { name?: string }[]
  series: LineSeries[]
  [k: string]: unknown
}

/**
 * The line chart with the closed-form curve added on the gain's own y-axis; the gain's points renamed
 * "effective gain" for pulsed runs. Unchanged when the gain is not plotted or the sweep is no gain scan.
 */
export function withGainOverlay<T extends LineChartOption>(option: T, s: SweepDetail, plotted: MetricColumn[]): Omit<T, 'series'> & { series: LineSeries[] } {
  const o = gainOverlay(s)
  const at = o ? plotted.findIndex((m) => m.key === o.metricKey) : -1
  if (!o || at < 0) return option
  const points = option.series[at]
  // The gain's points stand alone over the curve (no joining line), so the curve shows between and under them.
  const series: LineSeries[] = option.series.map((x, i) => (i === at ? { ...x, ...(o.kind === 'pulsed' ? { name: EFFECTIVE_GAIN_NAME } : {}), lineStyle: { opacity: 0 }, z: 3 } : x))
  series.push({
    name: CLOSED_FORM_NAME[o.kind],
    type: 'line',
    yAxisIndex: points.yAxisIndex ?? 0,
    showSymbol: false,
    // Points stay on top and keep the clicks; the curve is a guide.
    silent: true,
    z: 1,
    lineStyle: { width: 1.5, type: o.kind === 'cw' ? 'solid' : 'dashed' },
    data: o.curve,
  })
  return { ...option, series }
}
