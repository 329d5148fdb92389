// The axis as the form holds it (strings while typed) and its conversion to the shared SweepAxis.
import type { SweepAxis } from '@shared/api/sweeps'
import { sweepField, type SweepFieldId } from '@shared/physics/sweep-fields'

export interface AxisDraft {
  field: SweepFieldId
  pulseLabel: string
  /** Further labels that take the same value (pulse fields only). */
  tiedLabels: string[]
  kind: 'list' | 'linear' | 'log'
  /** Comma- or space-separated values for kind 'list'. */
  listText: string
  start: string
  stop: string
  count: string
}

export function newAxisDraft(field: SweepFieldId = 'pulsePeakPowerW', pulseLabel = ''): AxisDraft {
  return { field, pulseLabel, tiedLabels: [], kind: 'linear', listText: '', start: '1', stop: '10', count: '8' }
}

/** The draft as the API takes it; numbers that do not parse become NaN and fail the schema with a message. */
export function toAxis(d: AxisDraft): SweepAxis {
  const values =
    d.kind === 'list'
      ? { kind: 'list' as const, values: d.listText.split(/[\s,;]+/).filter(Boolean).map(Number) }
      : { kind: d.kind, start: Number(d.start), stop: Number(d.stop), count: Number(d.count) }
  const tied = sweepField(d.field).needsPulseLabel ? d.tiedLabels.filter((l) => l && l !== d.pulseLabel) : []
  return { field: d.field, ...(d.pulseLabel ? { pulseLabel: d.pulseLabel } : {}), ...(tied.length ? { tiedLabels: tied } : {}), values } as SweepAxis
}
