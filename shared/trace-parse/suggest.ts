// First guesses for the import form: which column is time, in which unit, which are signals.
import type { TraceColumn, TraceSignalUnit, TraceTimeUnit } from '../traces'
import type { ImportSuggestions, MetadataEntry } from './table'
import { asSignalUnit, asTimeUnit, looksLikeTimeName } from './units'

/** Metadata keys instruments use for the time unit ("Horizontal Units", "XUnit", "Time unit"). */
const TIME_UNIT_KEY = /(horizontal|x)[\s_.-]*units?|time[\s_.-]*units?/i

export function suggestChoices(columns: TraceColumn[], data: Float64Array[], metadata: MetadataEntry[]): ImportSuggestions {
  if (columns.length === 1) {
    return { timeColumn: null, timeUnit: 'ns', timeUnitSource: 'guess', signalColumns: [0], signalUnit: asSignalUnit(columns[0].unitHint) ?? 'arb' }
  }
  let timeColumn = columns.findIndex((c) => looksLikeTimeName(c.name) || asTimeUnit(c.unitHint) !== null)
  if (timeColumn < 0) timeColumn = 0
  const signalColumns = columns.map((c) => c.index).filter((i) => i !== timeColumn)

  let timeUnit: TraceTimeUnit | null = asTimeUnit(columns[timeColumn].unitHint)
  let timeUnitSource: ImportSuggestions['timeUnitSource'] = 'header'
  if (!timeUnit) {
    const entry = metadata.find((m) => TIME_UNIT_KEY.test(m.key) && asTimeUnit(m.value.replace(/["']/g, '')) !== null)
    if (entry) {
      timeUnit = asTimeUnit(entry.value.replace(/["']/g, ''))
      timeUnitSource = 'metadata'
    }
  }
  if (!timeUnit) {
    // No word for it: oscilloscopes write seconds (steps far below 1), scripts often nanoseconds.
    const t = data[timeColumn]
    const step = t.length > 1 ? Math.abs(t[t.length - 1] - t[0]) / (t.length - 1) : 1
    timeUnit = step < 1e-3 ? 's' : 'ns'
    timeUnitSource = 'guess'
  }
  const signalUnits = signalColumns.map((i) => asSignalUnit(columns[i].unitHint))
  const signalUnit: TraceSignalUnit = signalUnits.length > 0 && signalUnits.every((u) => u !== null && u === signalUnits[0]) ? signalUnits[0]! : 'arb'
  return { timeColumn, timeUnit, timeUnitSource, signalColumns, signalUnit }
}
