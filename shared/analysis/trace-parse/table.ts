import type { DecimalSeparator, Delimiter, TraceColumn, TraceSignalUnit, TraceTimeUnit } from '../../api/traces'

export interface MetadataEntry {
  key: string
  value: string
  /** 1-based line of a text file; 0 for NPY header entries. */
  line: number
}

/** What the parser proposes; the user confirms or changes it in the import form. */
export interface ImportSuggestions {
  timeColumn: number | null
  /** The time unit the file names; null when it names none (the user must then choose it). */
  timeUnit: TraceTimeUnit | null
  /** Where the file names it: a column's header or number suffixes, or a metadata line. */
  timeUnitSource: 'header' | 'metadata' | 'none'
  signalColumns: number[]
  signalUnit: TraceSignalUnit
}

/** A file read into columns, before the user's choices turn it into a trace. */
export interface ParsedTable {
  format: 'delimited' | 'npy'
  columns: TraceColumn[]
  /** Column-major: data[c][r]. */
  data: Float64Array[]
  rowCount: number
  /** 1-based file line of each row (text files), for messages that say where. Empty for NPY. */
  rowLines: Int32Array
  delimiter: Exclude<Delimiter, 'auto'> | null
  decimalSeparator: Exclude<DecimalSeparator, 'auto'> | null
  headerLine: number | null
  dataStartLine: number | null
  metadata: MetadataEntry[]
  suggestions: ImportSuggestions
}
