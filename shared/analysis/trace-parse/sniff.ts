// Which delimiter and decimal mark a text file uses, and where its data start, judged from its first lines
// only. Each line is split once per reading and reduced to a few numbers, so the search over start lines
// costs no more string work however the lines are arranged.
import { TRACE_MAX_COLUMNS, type DecimalSeparator, type Delimiter } from '../../api/traces'
import { TraceParseError } from './errors'
import { parseField } from './numbers'

export type Sep = Exclude<Delimiter, 'auto'>
export type Dec = Exclude<DecimalSeparator, 'auto'>

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

/** Lines looked at when choosing the delimiter (enough to see past a long metadata block)… */
export const SNIFF_LINES = 400
/** …as long as they hold no more than this many characters in all. */
export const SNIFF_CHARS = 2 * 1024 * 1024
/** Consecutive agreeing numeric lines that mark the start of the data (unless the file ends sooner). */
const MIN_DATA_RUN = 3

/** The fields of one line; `limit` stops splitting a long line early (the count is then at most `limit`). */
export function splitFields(line: string, sep: Sep, limit?: number): string[] {
  let fields: string[]
  if (sep === 'whitespace') fields = line.trim().split(/\s+/, limit)
  else fields = line.split(sep === 'comma' ? ',' : sep === 'semicolon' ? ';' : '\t', limit).map((f) => f.trim())
  // A trailing delimiter leaves one empty field at the end.
  if (fields.length > 1 && fields[fields.length - 1] === '') fields.pop()
  return fields
}

export const isBlank = (line: string) => line.trim().length === 0

/** A line as the search sees it under one reading. */
interface Shape {
  blank: boolean
  fields: number
  numeric: boolean
  firstIsNumber: boolean
}

function shapeOf(line: string, sep: Sep, dec: Dec): Shape {
  if (isBlank(line)) return { blank: true, fields: 0, numeric: false, firstIsNumber: false }
  const f = splitFields(line, sep, TRACE_MAX_COLUMNS + 2)
  const comma = dec === 'comma'
  return { blank: false, fields: f.length, numeric: f.every((x) => parseField(x, comma) !== null), firstIsNumber: parseField(f[0], comma) !== null }
}

interface Start {
  start: number
  cols: number
  agreeing: number
}

/** Index of the first data line under this reading and how many lines after it agree; null if none. */
function score(shapes: Shape[]): Start | null {
  for (let i = 0; i < shapes.length; i++) {
    const s = shapes[i]
    if (s.blank || s.fields < 2 || s.fields > TRACE_MAX_COLUMNS || !s.numeric) continue
    let agreeing = 0
    let brokenByText = false
    for (let j = i; j < shapes.length; j++) {
      const t = shapes[j]
      if (t.blank) continue
      if (t.fields !== s.fields || !t.numeric) {
        brokenByText = !t.firstIsNumber
        break
      }
      agreeing++
    }
    // A short numeric run followed by text (a header) is metadata ("Date,2026,11,30"), not the data;
    // one broken by a ragged or damaged data row is the data, and the full pass reports the bad row.
    if (agreeing < MIN_DATA_RUN && brokenByText) continue
    return { start: i, cols: s.fields, agreeing }
  }
  return null
}

export interface Reading extends Start {
  sep: Sep
  dec: Dec
}

/** The best reading of the file's first lines under the delimiter and decimal mark the user allows. */
export function sniff(head: string[], delimiter: Delimiter = 'auto', decimalSeparator: DecimalSeparator = 'auto'): Reading {
  const combos = COMBOS.filter(([s, d]) => (delimiter === 'auto' || delimiter === s) && (decimalSeparator === 'auto' || decimalSeparator === d))
  let best: Reading | null = null
  let tooWide: { line: number; fields: number } | null = null
  for (const [sep, dec] of combos) {
    const shapes = head.map((line) => shapeOf(line, sep, dec))
    const wide = shapes.findIndex((s) => s.numeric && s.fields > TRACE_MAX_COLUMNS)
    if (wide >= 0 && !tooWide) tooWide = { line: wide + 1, fields: shapes[wide].fields }
    const s = score(shapes)
    if (s && (!best || s.agreeing > best.agreeing)) best = { sep, dec, ...s }
  }
  if (best) return best
  if (tooWide) {
    throw new TraceParseError(
      `Line ${tooWide.line} holds more than ${TRACE_MAX_COLUMNS} numbers; a trace file may have at most ${TRACE_MAX_COLUMNS} columns. Keep only the columns you need, one sample per line.`,
      { line: tooWide.line },
    )
  }
  const how = delimiter !== 'auto' ? ` separated by ${delimiter}` : ''
  throw new TraceParseError(`No numeric data found: none of the first ${head.length} lines holds two or more numbers${how}. A trace needs a time column and at least one signal column.`)
}
