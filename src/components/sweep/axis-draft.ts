// The axis as the form holds it (strings while typed) and its conversion to the shared SweepAxis.
import type { SweepAxis } from '@shared/api/sweeps'
import type { SweepFieldId } from '@shared/physics/sweep-fields'

export interface AxisDraft {
  field: SweepFieldId
  pulseLabel: string
  kind: 'list' | 'linear' | 'log'
  /** Comma- or space-separated values for kind 'list'. */
  listText: string
  start: string
  stop: string
  count: string
}

export function newAxisDraft(field: SweepFieldId = 'pulsePeakPowerW', pulseLabel = ''): AxisDraft {
  return { field, pulseLabel, kind: 'linear', listText: '', start: '1', stop: '10', count: '8' }
}

/** The draft as the API takes it; numbers that do not parse become NaN and fail the schema with a message. */
export function toAxis(d: AxisDraft): SweepAxis {
  const values =
    d.kind === 'list'
      ? { kind: 'list' as const, values: d.listText.split(/[\s,;]+/).filter(Boolean).map(Number) }
      : { kind: d.kind, start: Number(d.start), stop: Number(d.stop), count: Number(d.count) }
  return { field: d.field, ...(d.pulseLabel ? { pulseLabel: d.pulseLabel } : {}), values } as SweepAxis
}
