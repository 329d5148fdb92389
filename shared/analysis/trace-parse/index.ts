// The one trace parser: the browser runs it for the import preview, the server runs it again on the
// stored bytes, so what the preview shows is what gets stored.
import type { DecimalSeparator, Delimiter } from '../../api/traces'
import { parseDelimited } from './delimited'
import { isNpy, parseNpy } from './npy'
import type { ParsedTable } from './table'
import { assertText } from './text'

export { TraceParseError, type ParseLocation } from './errors'
export type { ParsedTable, ImportSuggestions, MetadataEntry } from './table'
export { buildTrace, resolveTimeUnit, type BuiltTrace } from './build'
export { namedTimeUnit } from './suggest'

export interface ParseOptions {
  delimiter?: Delimiter
  decimalSeparator?: DecimalSeparator
}

export function parseTraceFile(bytes: Uint8Array, opts: ParseOptions = {}): ParsedTable {
  if (isNpy(bytes)) return parseNpy(bytes)
  assertText(bytes)
  return parseDelimited(bytes, opts)
}
