// NPY arrays (numpy's open format, numpy.org/neps/nep-0001-npy-format.html), versions 1.0–3.0:
// magic "\x93NUMPY", major, minor, header length (uint16 LE for 1.x, uint32 LE for 2.x/3.x), a Python dict
// literal {'descr', 'fortran_order', 'shape'}, then the raw data. The project's one NPY reader: readNpyHeader
// and readNpyArray read any numeric array (complex too) for whoever needs one, e.g. the solver's tests
// reading back what solver/io/npy.ts wrote; parseNpy makes a trace of 1-D arrays (one signal, time from
// the sample interval) and 2-D arrays whose short side holds the columns (≤ 16), in any of the common
// real dtypes and either byte order.
import { TRACE_MAX_SIGNALS } from '../../api/traces'
import { TraceParseError } from './errors'
import type { ParsedTable } from './table'
import { suggestChoices } from './suggest'

const MAGIC = [0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59]

export function isNpy(bytes: Uint8Array): boolean {
  return MAGIC.every((b, i) => bytes[i] === b)
}

type Reader = (v: DataView, offset: number, little: boolean) => number
const READERS: Record<string, { size: number; read: Reader }> = {
  f8: { size: 8, read: (v, o, le) => v.getFloat64(o, le) },
  f4: { size: 4, read: (v, o, le) => v.getFloat32(o, le) },
  i1: { size: 1, read: (v, o) => v.getInt8(o) },
  u1: { size: 1, read: (v, o) => v.getUint8(o) },
  i2: { size: 2, read: (v, o, le) => v.getInt16(o, le) },
  u2: { size: 2, read: (v, o, le) => v.getUint16(o, le) },
  i4: { size: 4, read: (v, o, le) => v.getInt32(o, le) },
  u4: { size: 4, read: (v, o, le) => v.getUint32(o, le) },
  i8: { size: 8, read: (v, o, le) => Number(v.getBigInt64(o, le)) },
  u8: { size: 8, read: (v, o, le) => Number(v.getBigUint64(o, le)) },
}

/** Where complex dtypes keep their two parts: cN is a pair of fN/2 numbers (re, im). */
const COMPLEX_PART: Record<string, string> = { c16: 'f8', c8: 'f4' }

export interface NpyHeader {
  /** Byte order and kind as numpy writes them, e.g. '<f8', '>i4', '<c16' ('|' for single bytes). */
  descr: string
  /** The kind without the byte order: 'f8', 'i4', 'c16'. */
  kind: string
  littleEndian: boolean
  fortranOrder: boolean
  shape: number[]
  headerStart: number
  /** Length of the header dict (the number stored in the preamble). */
  headerLength: number
  dataStart: number
}

/** The preamble and header of an NPY file: its dtype, shape and order, and where its data start. */
export function readNpyHeader(bytes: Uint8Array): NpyHeader {
  if (!isNpy(bytes)) throw new TraceParseError('Not an NPY file: the first bytes are not "\\x93NUMPY"', { byteOffset: 0 })
  if (bytes.length < 12) throw new TraceParseError('The NPY file ends inside its preamble', { byteOffset: bytes.length })
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  const major = bytes[6]
  if (major < 1 || major > 3) throw new TraceParseError(`Unsupported NPY version ${major}.${bytes[7]}`, { byteOffset: 6 })
  const headerLength = major === 1 ? view.getUint16(8, true) : view.getUint32(8, true)
  const headerStart = major === 1 ? 10 : 12
  const dataStart = headerStart + headerLength
  if (dataStart > bytes.length) throw new TraceParseError(`The NPY header claims ${headerLength} bytes but the file ends at byte ${bytes.length}`, { byteOffset: headerStart })
  let header = ''
  for (let i = headerStart; i < dataStart; i++) header += String.fromCharCode(bytes[i])

  const descr = /'descr'\s*:\s*'([<>|=]?)([a-z]\d+)'/.exec(header)
  if (!descr) {
    const raw = /'descr'\s*:\s*([^,}]+)/.exec(header)?.[1]?.trim() ?? 'none'
    throw new TraceParseError(`NPY dtype ${raw} is not a plain numeric type (structured and text arrays cannot be read)`, { byteOffset: headerStart })
  }
  const fortranOrder = /'fortran_order'\s*:\s*True/.test(header)
  const shapeText = /'shape'\s*:\s*\(([^)]*)\)/.exec(header)?.[1]
  if (shapeText === undefined) throw new TraceParseError('The NPY header has no shape', { byteOffset: headerStart })
  const shape = shapeText
    .split(',')
    .map((s) => s.trim())
    .filter(Boolean)
    .map(Number)
  if (shape.some((d) => !Number.isInteger(d) || d < 0)) throw new TraceParseError(`NPY shape (${shapeText}) is not a list of sizes`, { byteOffset: headerStart })
  return { descr: descr[1] + descr[2], kind: descr[2], littleEndian: descr[1] !== '>', fortranOrder, shape, headerStart, headerLength, dataStart }
}

function checkDataBytes(bytes: Uint8Array, h: NpyHeader, elementBytes: number): void {
  const needed = h.shape.reduce((p, d) => p * d, 1) * elementBytes
  if (bytes.length - h.dataStart !== needed) {
    throw new TraceParseError(`The NPY header promises ${needed} bytes of data (shape (${h.shape.join(', ')}), ${h.kind}) but the file holds ${bytes.length - h.dataStart}`, { byteOffset: h.dataStart })
  }
}

/** Every value of a numeric NPY array as float64, in the file's element order; complex values as (re, im) pairs. */
export function readNpyArray(bytes: Uint8Array): NpyHeader & { data: Float64Array } {
  const h = readNpyHeader(bytes)
  const part = COMPLEX_PART[h.kind]
  const reader = READERS[part ?? h.kind]
  if (!reader) throw new TraceParseError(`NPY dtype ${h.descr} is not a numeric type this reader knows`, { byteOffset: h.headerStart })
  const perElement = part ? 2 : 1
  checkDataBytes(bytes, h, perElement * reader.size)
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  const data = new Float64Array((bytes.length - h.dataStart) / reader.size)
  for (let i = 0; i < data.length; i++) data[i] = reader.read(view, h.dataStart + i * reader.size, h.littleEndian)
  return { ...h, data }
}

export function parseNpy(bytes: Uint8Array): ParsedTable {
  const h = readNpyHeader(bytes)
  const { shape, headerStart, dataStart } = h
  const fortran = h.fortranOrder
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  const reader = READERS[h.kind]
  if (!reader) throw new TraceParseError(`NPY dtype ${h.descr} is not supported; use float64, float32 or an integer type`, { byteOffset: headerStart })
  const little = h.littleEndian
  if (shape.length < 1 || shape.length > 2) throw new TraceParseError(`The NPY array has ${shape.length} dimensions; a trace needs 1 (one signal) or 2 (columns)`, { byteOffset: headerStart })
  checkDataBytes(bytes, h, reader.size)
  const [d0, d1] = shape.length === 1 ? [shape[0], 1] : shape
  // The short side is the columns: (n, k) as numpy.column_stack writes, or (k, n) as numpy.vstack does.
  const rowsAreSamples = shape.length === 1 || d1 <= d0
  const cols = rowsAreSamples ? d1 : d0
  const rows = rowsAreSamples ? d0 : d1
  if (cols > TRACE_MAX_SIGNALS + 1) throw new TraceParseError(`The NPY array is ${d0} × ${d1}; at most ${TRACE_MAX_SIGNALS + 1} columns (time + signals) can be read`, { byteOffset: headerStart })
  if (rows < 2) throw new TraceParseError(`The NPY array holds ${rows} sample; a trace needs at least 2`, { byteOffset: headerStart })

  const data = Array.from({ length: cols }, () => new Float64Array(rows))
  for (let i = 0; i < d0; i++) {
    for (let j = 0; j < d1; j++) {
      const flat = fortran ? j * d0 + i : i * d1 + j
      const v = reader.read(view, dataStart + flat * reader.size, little)
      if (!Number.isFinite(v)) throw new TraceParseError(`NPY element [${i}${shape.length === 2 ? `, ${j}` : ''}] is ${v}; every sample must be a finite number`, { byteOffset: dataStart + flat * reader.size })
      if (rowsAreSamples) data[j][i] = v
      else data[i][j] = v
    }
  }
  const columns = data.map((_, index) => ({ index, name: cols === 1 ? 'values' : `Column ${index + 1}`, unitHint: null }))
  const metadata = [
    { key: 'dtype', value: h.descr, line: 0 },
    { key: 'shape', value: `(${shape.join(', ')})`, line: 0 },
  ]
  return {
    format: 'npy',
    columns,
    data,
    rowCount: rows,
    rowLines: new Int32Array(0),
    delimiter: null,
    decimalSeparator: null,
    headerLine: null,
    dataStartLine: null,
    metadata,
    suggestions: suggestChoices(columns, metadata),
  }
}
