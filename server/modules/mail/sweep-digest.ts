// The one mail a finished sweep sends: how many points ran, what was swept, where the headline figure
// was highest and lowest, and a short table. The rest is on the sweep page and in its download.
import type { SweepDetail } from '@shared/api/sweeps'
import type { FinishedNotice } from './notify'

/** Rows of the figures table in the mail; the rest is in the ZIP. */
const MAIL_MAX_ROWS = 20
/** Metric columns in the mail table: those with a value somewhere, headline figures first, up to this many. */
const MAIL_MAX_METRICS = 3
const MAIL_ORDER = ['retrievalEfficiency', 'peakStokesGainDb', 'pumpOutFwhmNs', 'pumpDelayNs', 'reflectivity', 'window:']
const mailRank = (key: string) => {
  const bare = key.replace(/^ch\d+\./, '')
  const i = MAIL_ORDER.findIndex((k) => bare.startsWith(k))
  return i < 0 ? MAIL_ORDER.length : i
}

/** Four significant digits, exponent form outside 1e-3 … 1e4: enough to tell points apart. */
export const fmt = (x: number | null | undefined) =>
  x === null || x === undefined || !Number.isFinite(x) ? '—' : Math.abs(x) >= 1e4 || (x !== 0 && Math.abs(x) < 1e-3) ? x.toExponential(3) : String(Number(x.toPrecision(4)))

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`

function axisRanges(s: SweepDetail): string[] {
  return s.axisLabels.map((label, a) => {
    const vals = s.axisValues[a] ?? s.points.map((p) => p.values[a])
    const lo = Math.min(...vals)
    const hi = Math.max(...vals)
    return `${label}: ${lo === hi ? fmt(lo) : `${fmt(lo)} to ${fmt(hi)}`} in ${plural(new Set(vals).size, 'step')}`
  })
}

const where = (s: SweepDetail, p: SweepDetail['points'][number]) =>
  `point ${p.index + 1} (${s.axisLabels.map((l, a) => `${l.replace(/ \([^()]*\)$/, '')} = ${fmt(p.values[a])}`).join(', ')})`

export function sweepDigestNotice(s: SweepDetail): FinishedNotice {
  const c = s.counts
  const done = `${c.succeeded} of ${plural(s.pointCount, 'point')} succeeded${c.failed ? `, ${c.failed} failed (re-run them from the sweep page)` : ''}${c.cancelled ? `, ${c.cancelled} cancelled` : ''}.`
  const metrics = s.metrics
    .filter((m) => s.points.some((p) => p.metrics[m.key] !== null && p.metrics[m.key] !== undefined))
    .sort((a, b) => mailRank(a.key) - mailRank(b.key))
    .slice(0, MAIL_MAX_METRICS)
  const lines = [`The sweep finished: ${done}`, '', 'Swept:', ...axisRanges(s).map((r) => `  ${r}`)]
  const main = metrics[0]
  if (main) {
    const withValue = s.points.filter((p) => typeof p.metrics[main.key] === 'number')
    const best = withValue.reduce((a, b) => (b.metrics[main.key]! > a.metrics[main.key]! ? b : a))
    const worst = withValue.reduce((a, b) => (b.metrics[main.key]! < a.metrics[main.key]! ? b : a))
    lines.push('', `${main.label}:`, `  highest ${fmt(best.metrics[main.key])} ${main.unit} at ${where(s, best)}`, `  lowest  ${fmt(worst.metrics[main.key])} ${main.unit} at ${where(s, worst)}`)
  } else {
    lines.push('', 'No point produced figures of merit.')
  }
  const rows = s.points.slice(0, MAIL_MAX_ROWS).map((p) => [String(p.index + 1), ...p.values.map(fmt), p.status === 'succeeded' ? 'ok' : p.status, ...metrics.map((m) => fmt(p.metrics[m.key]))])
  const header = ['#', ...s.axisLabels, 'status', ...metrics.map((m) => `${m.label} (${m.unit})`)]
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)))
  const line = (r: string[]) => r.map((x, i) => x.padEnd(widths[i])).join('  ').trimEnd()
  lines.push('', 'Per point:', '', [line(header), ...rows.map(line)].join('\n'))
  if (s.points.length > MAIL_MAX_ROWS) lines.push('', `… ${plural(s.points.length - MAIL_MAX_ROWS, 'more point')} on the sweep page and in its download.`)
  const tail = c.failed ? `, ${c.failed} failed` : ''
  return { title: `Sweep '${s.title}' (${c.succeeded}/${s.pointCount} points${tail})`, url: `/sweeps/${s.id}`, summary: lines.join('\n') }
}
