import { runKeyFigure, type RunDetail, type RunSummary } from '@shared/api/runs'
import type { RunRow } from './runs.repo'

const iso = (d: Date | null): string | null => (d ? d.toISOString() : null)

export function toSummary(r: RunRow): RunSummary {
  return {
    id: r.id,
    groupId: r.groupId,
    authorId: r.authorId,
    authorName: r.authorName,
    title: r.title,
    status: r.status,
    progress: r.progress,
    attempt: r.attempt,
    error: r.error,
    configHash: r.configHash,
    solverVersion: r.solverVersion,
    expectedSeconds: r.estimate?.expectedSeconds ?? null,
    createdAt: r.createdAt.toISOString(),
    startedAt: iso(r.startedAt),
    finishedAt: iso(r.finishedAt),
    waveguideName: r.config?.waveguide?.name ?? null,
    keyFigure: runKeyFigure(r.figures),
    sweepId: r.sweepId ?? null,
    sweepPoint: r.sweepPoint ?? null,
  }
}

export function toDetail(r: RunRow, queuePosition: number | null = null): RunDetail {
  return {
    ...toSummary(r),
    queuePosition,
    notes: r.notes,
    config: r.config,
    figures: r.figures ?? null,
    warnings: r.manifest?.warnings ?? [],
    arrays: (r.manifest?.arrays ?? []).map(({ name, dtype, shape, units, description }) => ({ name, dtype, shape, units, description })),
    heartbeatAt: iso(r.heartbeatAt),
  }
}
