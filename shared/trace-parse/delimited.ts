// Delimited text from oscilloscopes and analysis scripts: comma, semicolon, tab or whitespace separated,
// dot or comma decimals, optional metadata and header lines before the data, CRLF or LF, blank lines,
// a trailing delimiter, units written after the numbers. The data block is the first line holding two or
// more numbers and everything after it; each later line must have the same number of numeric fields.
import type { DecimalSeparator, Delimiter } from '../traces'
import { TraceParseError } from './errors'
import { parseField, unquote } from './numbers'
import type { MetadataEntry, ParsedTable } from './table'
import { suggestChoices } from './suggest'
import { unitInName } from './units'

type Sep = Exclude<Delimiter, 'auto'>
type Dec = Exclude<DecimalSeparator, 'auto'>

/** Tried in this order; on a tie the earlier one wins (a plain "1;2" is read with dot decimals). */
const COMBOS: Array<[Sep, Dec]> = [
  ['comma', 'dot'],
  ['tab', 'dot'],
  ['semicolon', 'dot'],
  ['whitespace', 'dot'],
  ['semicolon', 'comma'],
  ['tab', 'comma'],
  ['whitespace', 'comma'],
]

/** Lines looked at when choosing the delimiter (enough to see past a long metadata block). */
const SNIFF_LINES = 400
/** Consecutive agreeing numeric lines that mark the start of the data (unless the file ends sooner). */
const MIN_DATA_RUN = 3

export function splitFields(line: string, sep: Sep): string[] {
  let fields: string[]
  if (sep === 'whitespace') fields = line.trim().split(/\s+/)
  else fields = line.split(sep === 'comma' ? ',' : sep === 'semicolon' ? ';' : '\t').map((f) => f.trim())
  // A trailing delimiter leaves one empty field at the end.
  if (fields.length > 1 && fields[fields.length - 1] === '') fields.pop()
  return fields
}

interface NumericRow {
  values: number[]
  units: (string | null)[]
}

function numericRow(fields: string[], dec: Dec): NumericRow | null {
  const values: number[] = []
  const units: (string | null)[] = []
  for (const f of fields) {
    const p = parseField(f, dec === 'comma')
    if (!p) return null
    values.push(p.value)
    units.push(p.unit)
  }
  return { values, units }
}

const isBlank = (line: string) => line.trim().length === 0

/** Index of the first data line under this reading and how many lines after it agree; null if none. */
function score(lines: string[], sep: Sep, dec: Dec): { start: number; cols: number; agreeing: number } | null {
  const limit = Math.min(lines.length, SNIFF_LINES)
  for (let i = 0; i < limit; i++) {
    if (isBlank(lines[i])) continue
    const fields = splitFields(lines[i], sep)
    if (fields.length < 2 || !numericRow(fields, dec)) continue
    let agreeing = 0
    let brokenByText = false
    for (let j = i; j < limit; j++) {
      if (isBlank(lines[j])) continue
      const f = splitFields(lines[j], sep)
      if (f.length !== fields.length || !numericRow(f, dec)) {
        brokenByText = parseField(f[0], dec === 'comma') === null
        break
      }
      agreeing++
    }
    // A short numeric run followed by text (a header) is metadata ("Date,2026,11,30"), not the data;
    // one broken by a ragged or damaged data row is the data, and the full pass reports the bad row.
    if (agreeing < MIN_DATA_RUN && brokenByText) continue
    return { start: i, cols: fields.length, agreeing }
  }
  return null
}

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

export function parseDelimited(text: string, opts: DelimitedOptions = {}): ParsedTable {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/)
  const combos = COMBOS.filter(([s, d]) => (opts.delimiter ?? 'auto') === 'auto' || opts.delimiter === s).filter(
    ([, d]) => (opts.decimalSeparator ?? 'auto') === 'auto' || opts.decimalSeparator === d,
  )
  let best: { sep: Sep; dec: Dec; start: number; cols: number; agreeing: number } | null = null
  for (const [sep, dec] of combos) {
    const s = score(lines, sep, dec)
    if (s && (!best || s.agreeing > best.agreeing)) best = { sep, dec, ...s }
  }
  if (!best) {
    const how = opts.delimiter && opts.delimiter !== 'auto' ? ` separated by ${opts.delimiter}` : ''
    throw new TraceParseError(`No numeric data found: none of the first ${Math.min(lines.length, SNIFF_LINES)} lines holds two or more numbers${how}. A trace needs a time column and at least one signal column.`)
  }
  const { sep, dec, start, cols } = best

  // The data block: every later non-blank line must have the same numeric fields.
  const columns: number[][] = Array.from({ length: cols }, () => [])
  const rowLines: number[] = []
  const units: (string | null)[] = Array(cols).fill(null)
  for (let i = start; i < lines.length; i++) {
    if (isBlank(lines[i])) continue
    const lineNo = i + 1
    const fields = splitFields(lines[i], sep)
    if (fields.length !== cols) {
      throw new TraceParseError(`Line ${lineNo} has ${fields.length} field${fields.length === 1 ? '' : 's'} but the data starting at line ${start + 1} have ${cols} columns (ragged rows)`, { line: lineNo })
    }
    for (let c = 0; c < cols; c++) {
      const p = parseField(fields[c], dec === 'comma')
      if (!p) throw new TraceParseError(`Line ${lineNo}, column ${c + 1}: "${fields[c].slice(0, 40)}" is not a number`, { line: lineNo, column: c + 1 })
      if (p.unit !== null) {
        if (units[c] === null && rowLines.length === 0) units[c] = p.unit
        else if (units[c] !== p.unit) {
          throw new TraceParseError(`Line ${lineNo}, column ${c + 1}: unit "${p.unit}" differs from "${units[c] ?? 'none'}" used above`, { line: lineNo, column: c + 1 })
        }
      } else if (units[c] !== null) {
        throw new TraceParseError(`Line ${lineNo}, column ${c + 1}: the number has no unit while the lines above have "${units[c]}"`, { line: lineNo, column: c + 1 })
      }
      columns[c].push(p.value)
    }
    rowLines.push(lineNo)
  }

  // The header is the last non-blank line before the data, when it names every column.
  let headerLine: number | null = null
  let names: string[] = Array.from({ length: cols }, (_, c) => `Column ${c + 1}`)
  let h = start - 1
  while (h >= 0 && isBlank(lines[h])) h--
  if (h >= 0) {
    const text = stripComment(lines[h])
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
    if (isBlank(lines[i])) continue
    const m = metadataOf(lines[i], i + 1, sep)
    if (m) metadata.push(m)
  }

  const tableColumns = names.map((name, index) => ({ index, name, unitHint: unitInName(name) ?? units[index] }))
  const data = columns.map((c) => Float64Array.from(c))
  return {
    format: 'delimited',
    columns: tableColumns,
    data,
    rowCount: rowLines.length,
    rowLines: Int32Array.from(rowLines),
    delimiter: sep,
    decimalSeparator: dec,
    headerLine,
    dataStartLine: start + 1,
    metadata,
    suggestions: suggestChoices(tableColumns, data, metadata),
  }
}
