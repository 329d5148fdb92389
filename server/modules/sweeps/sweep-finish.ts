// Closing a sweep: once no point is queued or running, the sweep is finished and its author gets one mail
// with the figures (unless they opted out). The update that closes it also claims the mail, so with several
// feeders running only one sends it.
import type { Pool } from 'pg'
import { axisLabel, type SweepDetail } from '@shared/sweeps'
import type { Db } from '../../db/client'
import type { Logger } from '../../logger'
import { notifyRunFinished, type FinishedNotice } from '../mail/notify'
import { toSweepDetail } from './sweeps.mapper'
import { findSweep, pointRuns } from './sweeps.repo'

/** Rows of the figures table in the mail; the rest is in the ZIP. */
const MAIL_MAX_ROWS = 40
/** Metric columns in the mail table: those with a value somewhere, headline figures first, up to this many. */
const MAIL_MAX_METRICS = 4
const MAIL_ORDER = ['retrievalEfficiency', 'peakStokesGainDb', 'pumpOutFwhmNs', 'pumpDelayNs', 'reflectivity', 'window:']
const mailRank = (key: string) => {
  const bare = key.replace(/^ch\d+\./, '')
  const i = MAIL_ORDER.findIndex((k) => bare.startsWith(k))
  return i < 0 ? MAIL_ORDER.length : i
}

const fmt = (x: number | null | undefined) => (x === null || x === undefined ? '—' : Math.abs(x) >= 1e4 || (x !== 0 && Math.abs(x) < 1e-3) ? x.toExponential(3) : x.toPrecision(4))

export function sweepFinishedNotice(s: SweepDetail): FinishedNotice {
  const c = s.counts
  const head = `The sweep finished: ${c.succeeded} of ${s.pointCount} points succeeded${c.failed ? `, ${c.failed} failed (re-run them from the sweep page)` : ''}${c.cancelled ? `, ${c.cancelled} cancelled` : ''}.`
  const metrics = s.metrics
    .filter((m) => s.points.some((p) => p.metrics[m.key] !== null))
    .sort((a, b) => mailRank(a.key) - mailRank(b.key))
    .slice(0, MAIL_MAX_METRICS)
  const rows = s.points.slice(0, MAIL_MAX_ROWS).map((p) => [...p.values.map(fmt), p.status === 'succeeded' ? '' : p.status, ...metrics.map((m) => fmt(p.metrics[m.key]))])
  const header = [...s.axes.map(axisLabel), 'status', ...metrics.map((m) => `${m.label} (${m.unit})`)]
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)))
  const line = (r: string[]) => r.map((x, i) => x.padEnd(widths[i])).join('  ').trimEnd()
  const table = [line(header), ...rows.map(line)].join('\n')
  const more = s.points.length > MAIL_MAX_ROWS ? `\n… ${s.points.length - MAIL_MAX_ROWS} more points in the download.` : ''
  return { title: `Sweep '${s.title}' finished`, url: `/sweeps/${s.id}`, summary: `${head}\n\nFigures of merit per point:\n\n${table}${more}` }
}

/** Marks every running sweep without queued or running points finished; mails each author once. */
export async function closeFinishedSweeps(pool: Pool, db: Db, log: Logger, o: { mail: boolean }): Promise<string[]> {
  const { rows } = await pool.query(
    `update sweeps s set status = 'finished', finished_at = now(), notified_at = now()
      where s.status = 'running' and not exists (select 1 from runs r where r.sweep_id = s.id and r.status in ('queued', 'running'))
      returning s.id, s.author_id`,
  )
  for (const r of rows) {
    if (!o.mail || !r.author_id) continue
    try {
      const sweep = await findSweep(pool, r.id)
      if (!sweep) continue
      await notifyRunFinished(db, r.author_id, sweepFinishedNotice(toSweepDetail(sweep, await pointRuns(pool, r.id))))
    } catch (err) {
      log.warn({ err, sweepId: r.id }, 'sweep-finished mail failed')
    }
  }
  return rows.map((r) => r.id)
}
