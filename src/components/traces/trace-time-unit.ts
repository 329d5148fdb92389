// What the upload form shows about the time axis: the span of the time column in the unit the user
// chose (or the file names), and the time between samples that unit implies, so a wrong unit shows at once.
import { NS_PER_TIME_UNIT, TIME_UNIT_LABEL, TIME_UNITS, type TraceTimeUnit } from '@shared/api/traces'
import { fmt } from './trace-format'

/** First and last value of the time column, and the number of samples. */
export interface TimeAxis {
  first: number
  last: number
  count: number
}

export function timeAxisOf(data: Float64Array[], timeColumn: number | null | undefined): TimeAxis | null {
  const t = timeColumn === null || timeColumn === undefined ? undefined : data[timeColumn]
  if (!t || t.length === 0) return null
  return { first: t[0], last: t[t.length - 1], count: t.length }
}

/** "0–7.98 µs": the column's numbers with the unit they would be read in. */
export function spanText(axis: TimeAxis, unit: TraceTimeUnit): string {
  return `${fmt(axis.first)}–${fmt(axis.last)} ${TIME_UNIT_LABEL[unit]}`
}

/** A duration in the unit that puts it between 1 and 1000 ("10 ns", "2.5 ms"). */
export function durationText(ns: number): string {
  const a = Math.abs(ns)
  const unit = [...TIME_UNITS].find((u) => a >= NS_PER_TIME_UNIT[u]) ?? 'ps'
  return `${fmt(ns / NS_PER_TIME_UNIT[unit], 3)} ${TIME_UNIT_LABEL[unit]}`
}

/** The mean time between samples when the column is read in `unit`; null for fewer than two samples. */
export function stepText(axis: TimeAxis, unit: TraceTimeUnit): string | null {
  if (axis.count < 2) return null
  return durationText(((axis.last - axis.first) / (axis.count - 1)) * NS_PER_TIME_UNIT[unit])
}
