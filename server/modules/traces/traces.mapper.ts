import type { TraceDetail, TraceSummary } from '@shared/api/traces'
import type { TraceMeta } from './traces.repo'

export function toSummary(r: TraceMeta): TraceSummary {
  return {
    id: r.id,
    groupId: r.groupId,
    authorId: r.authorId,
    authorName: r.authorName,
    name: r.name,
    fileName: r.fileName,
    byteSize: r.byteSize,
    format: r.format,
    sampleCount: r.sampleCount,
    startNs: r.startNs,
    endNs: r.endNs,
    signals: r.signals,
    createdAt: r.createdAt.toISOString(),
  }
}

export function toDetail(r: TraceMeta): TraceDetail {
  return { ...toSummary(r), notes: r.notes, contentType: r.contentType, sha256: r.sha256, settings: r.settings, columns: r.columns }
}
