// NPY format version 1.0 (numpy's open standard, numpy.org/neps/nep-0001-npy-format.html):
//   bytes 0–5   magic "\x93NUMPY"
//   bytes 6–7   version major, minor = 1, 0
//   bytes 8–9   header length HLEN, unsigned 16-bit little-endian
//   HLEN bytes  ASCII Python dict literal {'descr': …, 'fortran_order': False, 'shape': (…), } padded with
//               spaces and ended by '\n' so that 10 + HLEN is a multiple of 64 (the data starts aligned)
//   then the raw data in C order.
// Pure byte work, no fs: the CLI writes the returned bytes. Complex data are interleaved (re, im) float64.
// Reading is shared/analysis/trace-parse/npy.ts (readNpyArray), the project's one NPY reader.

export type NpyDescr = '<c16' | '<f8' | '<f4'

export const NPY_MAGIC = Uint8Array.of(0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59)
const PREAMBLE_BYTES = 10
const ALIGNMENT = 64
const MAX_V1_HEADER = 0xffff

export interface NpyArray {
  descr: NpyDescr
  shape: number[]
  /** Float64Array for '<f8' and '<c16' (two numbers per element), Float32Array for '<f4'. */
  data: Float64Array | Float32Array
}

const isLittleEndian = new Uint8Array(Uint16Array.of(1).buffer)[0] === 1

function valuesPerElement(descr: NpyDescr): number {
  return descr === '<c16' ? 2 : 1
}

/** Python tuple literal: () for 0-d, (n,) for 1-d, (a, b) otherwise. */
function shapeLiteral(shape: number[]): string {
  if (shape.length === 1) return `(${shape[0]},)`
  return `(${shape.join(', ')})`
}

/** Preamble + header for an array; data of prod(shape) elements of `descr` follows it. */
export function npyHeader(descr: NpyDescr, shape: number[]): Uint8Array {
  for (const d of shape) if (!Number.isInteger(d) || d < 0) throw new Error(`NPY shape entries must be non-negative integers, got ${shape}`)
  const dict = `{'descr': '${descr}', 'fortran_order': False, 'shape': ${shapeLiteral(shape)}, }`
  // Pad with spaces; the final '\n' is part of the header.
  const unpadded = PREAMBLE_BYTES + dict.length + 1
  const headerLength = dict.length + 1 + ((ALIGNMENT - (unpadded % ALIGNMENT)) % ALIGNMENT)
  if (headerLength > MAX_V1_HEADER) throw new Error('NPY v1.0 header too long')
  const out = new Uint8Array(PREAMBLE_BYTES + headerLength)
  out.set(NPY_MAGIC, 0)
  out[6] = 1
  out[7] = 0
  out[8] = headerLength & 0xff
  out[9] = headerLength >> 8
  const text = dict.padEnd(headerLength - 1, ' ') + '\n'
  for (let i = 0; i < text.length; i++) out[PREAMBLE_BYTES + i] = text.charCodeAt(i)
  return out
}

function checkArray(a: NpyArray): void {
  const expectedType = a.descr === '<f4' ? Float32Array : Float64Array
  if (!(a.data instanceof expectedType)) throw new Error(`NPY ${a.descr} needs a ${expectedType.name}`)
  const elements = a.shape.reduce((p, d) => p * d, 1)
  if (a.data.length !== elements * valuesPerElement(a.descr)) {
    throw new Error(`NPY data has ${a.data.length} numbers; shape ${shapeLiteral(a.shape)} of ${a.descr} needs ${elements * valuesPerElement(a.descr)}`)
  }
  // Typed arrays use the platform byte order; NPY here promises little-endian.
  if (!isLittleEndian) throw new Error('NPY writing needs a little-endian platform')
}

/** Header and data as two byte views (no copy of the data), for streaming to a file. */
export function npyParts(a: NpyArray): [Uint8Array, Uint8Array] {
  checkArray(a)
  return [npyHeader(a.descr, a.shape), new Uint8Array(a.data.buffer, a.data.byteOffset, a.data.byteLength)]
}

/** The whole file in one buffer. */
export function encodeNpy(a: NpyArray): Uint8Array {
  const [head, body] = npyParts(a)
  const out = new Uint8Array(head.length + body.length)
  out.set(head, 0)
  out.set(body, head.length)
  return out
}
