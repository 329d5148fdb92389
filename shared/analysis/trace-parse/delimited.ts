// Delimited text from oscilloscopes and analysis scripts: comma, semicolon, tab or whitespace separated,
// dot or comma decimals, optional metadata and header lines before the data, CRLF or LF, blank lines,
// a trailing delimiter, units written after the numbers. The data block is the first line holding two or
// more numbers and everything after it; each later line must have the same number of numeric fields.
// The file is read line by line (line-reader.ts) into typed columns (column-store.ts): memory grows with
// the numbers kept, never with a copy of every line.
import { TRACE_MAX_SAMPLES, type DecimalSeparator, type Delimiter } from '../../api/traces'
import { ColumnStore } from './column-store'
import { TraceParseError } from './errors'
import { LineReader, NotUtf8Error, type TextEncoding } from './line-reader'
import { parseField, unquote } from './numbers'
import { isBlank, SNIFF_CHARS, SNIFF_LINES, sniff, splitFields, type Reading, type Sep } from './sniff'
import type { MetadataEntry, ParsedTable } from './table'
import { suggestChoices } from './suggest'
import { unitInName } from './units'

export interface DelimitedOptions {
  delimiter?: Delimiter
  decimalSeparator?: DecimalSeparator
}

/** Comment marks some instruments put before metadata and header lines. */
const stripComment = (line: string) => line.replace(/^\s*(#|%|\/\/|;)\s?/, '')

function metadataOf(line: string, lineNo: number, sep: Sep): MetadataEntry | null {
  const text = stripComment(line).trim()
  if (!text) return null
  const kv = /^([^:=]{1,80}?)\s*[:=]\s*(.*)$/.exec(text)
  if (kv) return { key: kv[1].trim(), value: kv[2].trim(), line: lineNo }
  const fields = splitFields(text, sep).map(unquote)
  if (fields.length >= 2) return { key: fields[0], value: fields.slice(1).join(' ').trim(), line: lineNo }
  return { key: '', value: text, line: lineNo }
}

/** Reads the data block, from the first data line of `head` to the end of the file, into columns. */
function readData(head: string[], reader: LineReader, r: Reading): { store: ColumnStore; units: (string | null)[] } {
  const { sep, dec, start, cols } = r
  const comma = dec === 'comma'
  const store = new ColumnStore(cols)
  const units: (string | null)[] = Array(cols).fill(null)
  const row = new Float64Array(cols)
  const take = (line: string, lineNo: number) => {
    if (isBlank(line)) return
    const fields = splitFields(line, sep)
    if (fields.length !== cols) {
      throw new TraceParseError(`Line ${lineNo} has ${fields.length} field${fields.length === 1 ? '' : 's'} but the data starting at line ${start + 1} have ${cols} columns (ragged rows)`, { line: lineNo })
    }
    for (let c = 0; c < cols; c++) {
      const p = parseField(fields[c], comma)
      if (!p) throw new TraceParseError(`Line ${lineNo}, column ${c + 1}: "${fields[c].slice(0, 40)}" is not a number`, { line: lineNo, column: c + 1 })
      if (p.unit !== null) {
        if (units[c] === null && store.rowCount === 0) units[c] = p.unit
        else if (units[c] !== p.unit) {
          throw new TraceParseError(`Line ${lineNo}, column ${c + 1}: unit "${p.unit}" differs from "${units[c] ?? 'none'}" used above`, { line: lineNo, column: c + 1 })
        }
      } else if (units[c] !== null) {
        throw new TraceParseError(`Line ${lineNo}, column ${c + 1}: the number has no unit while the lines above have "${units[c]}"`, { line: lineNo, column: c + 1 })
      }
      row[c] = p.value
    }
    if (store.rowCount === TRACE_MAX_SAMPLES) {
      throw new TraceParseError(`The file holds more than ${TRACE_MAX_SAMPLES} samples (line ${lineNo} is one too many); a trace may hold at most ${TRACE_MAX_SAMPLES}. Decimate it first.`, { line: lineNo })
    }
    store.push(row, lineNo)
  }
  for (let i = start; i < head.length; i++) take(head[i], i + 1)
  for (let line = reader.next(); line !== null; line = reader.next()) take(line, reader.lineNo)
  return { store, units }
}

function readWith(bytes: Uint8Array, encoding: TextEncoding, opts: DelimitedOptions): ParsedTable {
  const reader = new LineReader(bytes, encoding)
  const head: string[] = []
  let headChars = 0
  while (head.length < SNIFF_LINES && headChars < SNIFF_CHARS) {
    const line = reader.next()
    if (line === null) break
    head.push(line)
    headChars += line.length
  }
  const reading = sniff(head, opts.delimiter, opts.decimalSeparator)
  const { sep, dec, start, cols } = reading
  const { store, units } = readData(head, reader, reading)

  // The header is the last non-blank line before the data, when it names every column.
  let headerLine: number | null = null
  let names: string[] = Array.from({ length: cols }, (_, c) => `Column ${c + 1}`)
  let h = start - 1
  while (h >= 0 && isBlank(head[h])) h--
  if (h >= 0) {
    const text = stripComment(head[h])
    let fields = splitFields(text, sep).map(unquote)
    // Whitespace-separated headers often have spaces inside names ("Time (s)  Power (W)").
    if (fields.length !== cols && sep === 'whitespace') fields = text.trim().split(/\t|\s{2,}/).map(unquote)
    if (fields.length === cols && fields.some((f) => parseField(f, dec === 'comma') === null)) {
      headerLine = h + 1
      names = fields.map((f, c) => f || `Column ${c + 1}`)
    }
  }
  const metadata: MetadataEntry[] = []
  const lastMeta = headerLine !== null ? headerLine - 1 : start
  for (let i = 0; i < lastMeta; i++) {
    if (isBlank(head[i])) continue
    const m = metadataOf(head[i], i + 1, sep)
    if (m) metadata.push(m)
  }

  const tableColumns = names.map((name, index) => ({ index, name, unitHint: unitInName(name) ?? units[index] }))
  const { data, rowLines } = store.finish()
  return {
    format: 'delimited',
    columns: tableColumns,
    data,
    rowCount: rowLines.length,
    rowLines,
    delimiter: sep,
    decimalSeparator: dec,
    headerLine,
    dataStartLine: start + 1,
    metadata,
    suggestions: suggestChoices(tableColumns, metadata),
  }
}

/** Text bytes → table. UTF-8 first; a file that is not valid UTF-8 is read again as windows-1252. */
export function parseDelimited(bytes: Uint8Array, opts: DelimitedOptions = {}): ParsedTable {
  try {
    return readWith(bytes, 'utf-8', opts)
  } catch (err) {
    if (err instanceof NotUtf8Error) return readWith(bytes, 'windows-1252', opts)
    throw err
  }
}
