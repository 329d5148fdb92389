import { axisLabel, axisValues, type SweepDetail, type SweepPoint, type SweepSummary } from '@shared/api/sweeps'
import { metricColumns, reduceFigures } from '@shared/analysis/sweep-metrics'
import type { PointRunRow, SweepRow } from './sweeps.repo'

const iso = (d: Date | null): string | null => (d ? d.toISOString() : null)

export function toSweepSummary(s: SweepRow): SweepSummary {
  return {
    id: s.id,
    groupId: s.groupId,
    authorId: s.authorId,
    authorName: s.authorName,
    title: s.title,
    status: s.status,
    pointCount: s.pointCount,
    counts: s.counts,
    axisLabels: s.axes.map(axisLabel),
    estimate: s.estimate,
    createdAt: s.createdAt.toISOString(),
    finishedAt: iso(s.finishedAt),
  }
}

/** The axis values of point `index` (index = i0 · n1 + i1). */
export function pointValues(values: number[][], index: number): number[] {
  if (values.length === 1) return [values[0][index]]
  const n1 = values[1].length
  return [values[0][Math.floor(index / n1)], values[1][index % n1]]
}

export function toSweepDetail(s: SweepRow, runs: PointRunRow[]): SweepDetail {
  const values = s.axes.map((a) => axisValues(a.values))
  const metrics = metricColumns(s.baseConfig)
  const points: SweepPoint[] = runs.map((r) => ({
    index: r.point,
    values: pointValues(values, r.point),
    runId: r.runId,
    status: r.status,
    progress: r.progress,
    attempt: r.attempt,
    error: r.error,
    startedAt: iso(r.startedAt),
    finishedAt: iso(r.finishedAt),
    metrics: reduceFigures(r.status === 'succeeded' ? r.figures : null, metrics),
  }))
  return { ...toSweepSummary(s), notes: s.notes, baseConfig: s.baseConfig, axes: s.axes, extendWindow: s.extendWindow, axisValues: values, metrics, points }
}
