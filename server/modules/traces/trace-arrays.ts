// Float64 arrays ⇄ little-endian bytes for the bytea columns.

const isLittleEndian = new Uint8Array(Uint16Array.of(1).buffer)[0] === 1

export function toBytes(a: Float64Array): Buffer {
  if (!isLittleEndian) throw new Error('Trace storage needs a little-endian platform')
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength)
}

export function fromBytes(b: Buffer): Float64Array {
  // Copy: a Buffer from pg may sit at an offset that is not a multiple of 8.
  const copy = new Uint8Array(b)
  return new Float64Array(copy.buffer, 0, copy.byteLength / 8)
}

/** Signals stored as one [k, n] block. */
export function packSignals(signals: Float64Array[]): Float64Array {
  const n = signals[0]?.length ?? 0
  const out = new Float64Array(signals.length * n)
  signals.forEach((s, k) => out.set(s, k * n))
  return out
}

export function unpackSignals(block: Float64Array, k: number): Float64Array[] {
  const n = k > 0 ? block.length / k : 0
  return Array.from({ length: k }, (_, i) => block.subarray(i * n, (i + 1) * n))
}
