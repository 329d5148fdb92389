// A parsed table + the user's choices → the stored trace: time in ns, signals in W (or arbitrary units)
// with the baseline removed. Every refusal names the row (and file line) it is about.
import { NS_PER_TIME_UNIT, TIME_UNIT_LABEL, TRACE_MAX_SAMPLES, type StoredSignalUnit, type TraceImportSettings, type TraceSignalInfo, type TraceTimeUnit } from '../../api/traces'
import { TraceParseError } from './errors'
import { namedTimeUnit } from './suggest'
import type { ParsedTable } from './table'

export interface BuiltTrace {
  /** The unit the time column was read in (the user's choice, else the one the file names); null without a time column. */
  timeUnit: TraceTimeUnit | null
  timeNs: Float64Array
  signals: Array<TraceSignalInfo & { values: Float64Array }>
}

/** Watts per unit of the signal column (volts go through the detector responsivity). */
function wattsPerUnit(s: TraceImportSettings): { factor: number; unit: StoredSignalUnit } {
  switch (s.signalUnit) {
    case 'W':
      return { factor: 1, unit: 'W' }
    case 'mW':
      return { factor: 1e-3, unit: 'W' }
    case 'uW':
      return { factor: 1e-6, unit: 'W' }
    case 'V':
      return { factor: 1 / s.responsivityVPerW!, unit: 'W' }
    case 'mV':
      return { factor: 1e-3 / s.responsivityVPerW!, unit: 'W' }
    default:
      return { factor: 1, unit: 'arb' }
  }
}

/**
 * The unit of the time column: the user's explicit choice, else the one the file names. A file that names
 * none is refused until the user chooses: a guess from the size of the numbers takes µs for seconds.
 */
export function resolveTimeUnit(table: ParsedTable, s: TraceImportSettings): TraceTimeUnit | null {
  if (s.timeColumn === null) return null
  if (s.timeUnit) return s.timeUnit
  const named = namedTimeUnit(table, s.timeColumn)
  if (named) return named.unit
  const units = Object.values(TIME_UNIT_LABEL).join(', ')
  throw new TraceParseError(
    `The file does not name the unit of its time column ("${table.columns[s.timeColumn]?.name ?? s.timeColumn + 1}"): choose the time unit (${units}).`,
    { column: s.timeColumn + 1 },
    'timeUnit',
  )
}

function where(table: ParsedTable, row: number): string {
  return table.rowLines.length > row ? `row ${row + 1} (line ${table.rowLines[row]})` : `row ${row + 1}`
}

/** A value that is, or becomes in the chosen unit, too large for a double (e.g. 1e999 in the file). */
function notFinite(table: ParsedTable, row: number, column: number, raw: number, what: 'time' | 'signal'): TraceParseError {
  const line = table.rowLines.length > row ? table.rowLines[row] : undefined
  return new TraceParseError(
    `The ${what} value at ${where(table, row)}, column "${table.columns[column]?.name ?? column + 1}" (${raw}) is too large to store in the chosen unit.`,
    { line, column: column + 1 },
  )
}

export function buildTrace(table: ParsedTable, s: TraceImportSettings): BuiltTrace {
  const n = table.rowCount
  const nCols = table.columns.length
  if (n < 2) throw new TraceParseError(`The file holds ${n} data row${n === 1 ? '' : 's'}; a trace needs at least 2`)
  if (n > TRACE_MAX_SAMPLES) throw new TraceParseError(`The file holds ${n} samples; a trace may hold at most ${TRACE_MAX_SAMPLES}. Decimate it first.`)
  for (const c of [...(s.timeColumn === null ? [] : [s.timeColumn]), ...s.signalColumns]) {
    if (c >= nCols) throw new TraceParseError(`Column ${c + 1} does not exist; the file has ${nCols} column${nCols === 1 ? '' : 's'}`)
  }

  const timeUnit = resolveTimeUnit(table, s)
  const timeNs = new Float64Array(n)
  if (s.timeColumn === null || timeUnit === null) {
    for (let i = 0; i < n; i++) timeNs[i] = i * s.sampleIntervalNs!
  } else {
    const t = table.data[s.timeColumn]
    const k = NS_PER_TIME_UNIT[timeUnit]
    for (let i = 0; i < n; i++) {
      timeNs[i] = t[i] * k
      if (!Number.isFinite(timeNs[i])) throw notFinite(table, i, s.timeColumn, t[i], 'time')
      if (i > 0 && !(timeNs[i] > timeNs[i - 1])) {
        const line = table.rowLines.length > i ? table.rowLines[i] : undefined
        throw new TraceParseError(
          `Time is not increasing at ${where(table, i)}: ${t[i]} follows ${t[i - 1]} in column "${table.columns[s.timeColumn].name}". Sort the samples or pick the right time column.`,
          { line, column: s.timeColumn + 1 },
        )
      }
    }
  }

  let baseFrom = 0
  let baseTo = -1
  if (s.baseline) {
    const { startNs, endNs } = s.baseline
    baseFrom = timeNs.findIndex((t) => t >= startNs)
    let last = -1
    for (let i = n - 1; i >= 0; i--) if (timeNs[i] <= endNs) (last = i), (i = -1)
    baseTo = last
    if (baseFrom < 0 || baseTo < baseFrom) {
      throw new TraceParseError(`The baseline window ${startNs}–${endNs} ns holds no samples; the trace spans ${timeNs[0].toPrecision(6)}–${timeNs[n - 1].toPrecision(6)} ns`)
    }
  }

  const { factor, unit } = wattsPerUnit(s)
  const signals = s.signalColumns.map((c) => {
    const raw = table.data[c]
    const values = new Float64Array(n)
    for (let i = 0; i < n; i++) {
      values[i] = raw[i] * factor
      if (!Number.isFinite(values[i])) throw notFinite(table, i, c, raw[i], 'signal')
    }
    let baseline = 0
    if (baseTo >= baseFrom) {
      for (let i = baseFrom; i <= baseTo; i++) baseline += values[i]
      baseline /= baseTo - baseFrom + 1
      for (let i = 0; i < n; i++) values[i] -= baseline
    }
    let peak = -Infinity
    for (let i = 0; i < n; i++) if (values[i] > peak) peak = values[i]
    return { column: c, label: table.columns[c].name, unit, baseline, peak, values }
  })
  return { timeUnit, timeNs, signals }
}
