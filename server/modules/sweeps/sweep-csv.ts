// The figures-of-merit table of a sweep as CSV: one row per point, axis values first, units in the header;
// each figure is followed by its estimated discretisation error (same unit; empty where there is none).
import { errorKey } from '@shared/analysis/sweep-metrics'
import { axisLabel, type SweepDetail } from '@shared/api/sweeps'

/** Quotes a cell when it holds a comma, quote or line break (RFC 4180). */
const cell = (s: string) => (/[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s)

/** Numbers are written with String(): the shortest text that reads back as the same double. */
const num = (x: number | null) => (x === null ? '' : String(x))

export function sweepCsv(s: SweepDetail): string {
  const header = ['point', ...s.axes.map(axisLabel), 'status', 'run_id', ...s.metrics.flatMap((m) => [`${m.label} (${m.unit})`, `${m.label} estimated error (${m.unit})`])]
  const lines = [header.map(cell).join(',')]
  for (const p of s.points) {
    lines.push([String(p.index + 1), ...p.values.map(num), p.status, p.runId, ...s.metrics.flatMap((m) => [num(p.metrics[m.key] ?? null), num(p.metrics[errorKey(m.key)] ?? null)])].map(cell).join(','))
  }
  return lines.join('\r\n') + '\r\n'
}
