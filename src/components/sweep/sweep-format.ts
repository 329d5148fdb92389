import type { MetricColumn, SweepDetail } from '@shared/api/sweeps'

/** Engineering-friendly number: 4 significant digits (or `digits`), exponent outside 1e-3…1e4. */
export function formatValue(x: number | null | undefined, digits = 4): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—'
  if (x === 0) return '0'
  const a = Math.abs(x)
  return a >= 1e4 || a < 1e-3 ? x.toExponential(digits - 1) : String(Number(x.toPrecision(digits)))
}

/** Most digits a figure is shown with, however small its estimated error. */
const MAX_DIGITS = 6

/**
 * A figure shown to its meaningful digits: down to the second significant digit of its estimated numerical
 * error when there is one (quoting a value to its uncertainty: common practice), else 4 significant digits.
 */
export function formatToError(x: number | null | undefined, error: number | null | undefined): string {
  if (x === null || x === undefined || !Number.isFinite(x) || x === 0) return formatValue(x)
  if (error === null || error === undefined || !Number.isFinite(error) || !(error > 0)) return formatValue(x)
  const digits = Math.floor(Math.log10(Math.abs(x))) - Math.floor(Math.log10(error)) + 2
  return formatValue(x, Math.min(MAX_DIGITS, Math.max(1, digits)))
}

/** Suffix after a value: none for pure numbers and fractions ("0.094"), " ns" etc. otherwise. */
export const unitSuffix = (unit: string) => (unit === '1' || unit === 'fraction' ? '' : ` ${unit}`)

/** Columns that have a value at some point: what is worth plotting. */
export function metricsWithData(s: SweepDetail): MetricColumn[] {
  return s.metrics.filter((m) => s.points.some((p) => p.metrics[m.key] !== null && p.metrics[m.key] !== undefined))
}

/** The headline figures, picked first on the chart and in the table. */
const PREFERRED = ['retrievalEfficiency', 'settledStokesGainDb', 'peakStokesGainDb', 'pumpOutFwhmNs', 'pumpDelayNs', 'reflectivity']

export function defaultMetrics(s: SweepDetail, n = 2): string[] {
  const have = metricsWithData(s)
  const rank = (k: string) => {
    const i = PREFERRED.indexOf(k.replace(/^ch\d+\./, ''))
    return i < 0 ? PREFERRED.length : i
  }
  return [...have].sort((a, b) => rank(a.key) - rank(b.key)).slice(0, n).map((m) => m.key)
}

/** Share of the sweep done: finished points, plus the running points' own progress when the points are known. */
export function progressOf(s: Pick<SweepDetail, 'counts' | 'pointCount'> & { points?: Pick<SweepDetail['points'][number], 'status' | 'progress'>[] }): number {
  const c = s.counts
  if (!s.pointCount) return 0
  const running = (s.points ?? []).reduce((sum, p) => sum + (p.status === 'running' ? Math.min(1, Math.max(0, p.progress)) : 0), 0)
  return Math.min(1, (c.succeeded + c.failed + c.cancelled + running) / s.pointCount)
}

/** A percentage that stays true when small: "0.4 %" rather than "0 %", "< 0.1 %" once anything has started. */
export function percentText(fraction: number): string {
  const pct = 100 * fraction
  if (pct <= 0) return '0 %'
  if (pct < 0.1) return '< 0.1 %'
  if (pct < 10) return `${Number(pct.toFixed(1))} %`
  return `${Math.floor(pct)} %`
}
