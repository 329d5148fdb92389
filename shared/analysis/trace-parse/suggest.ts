// First guesses for the import form: which column is time, its unit when the file names one, which are
// signals. A time unit is never guessed from the numbers: a file that does not name it leaves it to the user.
import type { TraceColumn, TraceSignalUnit, TraceTimeUnit } from '../../api/traces'
import type { ImportSuggestions, MetadataEntry } from './table'
import { asSignalUnit, asTimeUnit, looksLikeTimeName } from './units'

/** Metadata keys instruments use for the time unit ("Horizontal Units", "XUnit", "Time unit"). */
const TIME_UNIT_KEY = /(horizontal|x)[\s_.-]*units?|time[\s_.-]*units?/i

/** The unit the file itself gives for time in `timeColumn` (its header or number suffixes, else its metadata), and where it says so. */
export function namedTimeUnit(
  file: { columns: TraceColumn[]; metadata: MetadataEntry[] },
  timeColumn: number,
): { unit: TraceTimeUnit; source: 'header' | 'metadata' } | null {
  const fromColumn = asTimeUnit(file.columns[timeColumn]?.unitHint)
  if (fromColumn) return { unit: fromColumn, source: 'header' }
  const entry = file.metadata.find((m) => TIME_UNIT_KEY.test(m.key) && asTimeUnit(m.value.replace(/["']/g, '')) !== null)
  return entry ? { unit: asTimeUnit(entry.value.replace(/["']/g, ''))!, source: 'metadata' } : null
}

export function suggestChoices(columns: TraceColumn[], metadata: MetadataEntry[]): ImportSuggestions {
  if (columns.length === 1) {
    return { timeColumn: null, timeUnit: null, timeUnitSource: 'none', signalColumns: [0], signalUnit: asSignalUnit(columns[0].unitHint) ?? 'arb' }
  }
  let timeColumn = columns.findIndex((c) => looksLikeTimeName(c.name) || asTimeUnit(c.unitHint) !== null)
  if (timeColumn < 0) timeColumn = 0
  const signalColumns = columns.map((c) => c.index).filter((i) => i !== timeColumn)
  const named = namedTimeUnit({ columns, metadata }, timeColumn)
  const signalUnits = signalColumns.map((i) => asSignalUnit(columns[i].unitHint))
  const signalUnit: TraceSignalUnit = signalUnits.length > 0 && signalUnits.every((u) => u !== null && u === signalUnits[0]) ? signalUnits[0]! : 'arb'
  return { timeColumn, timeUnit: named?.unit ?? null, timeUnitSource: named?.source ?? 'none', signalColumns, signalUnit }
}
