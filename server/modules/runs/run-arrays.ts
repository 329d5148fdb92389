// GET /api/runs/:id/arrays/:name: raw little-endian bytes with X-Dtype/X-Shape headers, or JSON for
// arrays small enough to read that way; ?rows=, ?cols= and ?transpose=true crop, thin out or transpose it
// first (array-window.ts), so a client can fetch a corner of a large map or every tenth row.
import type { Request, Response } from 'express'
import { z } from 'zod'
import { AppError } from '../../errors'
import { isWindowed, SliceText, splitComplex, windowArray, type Flat } from './array-window'
import type { StoredArray } from './runs.repo'

/** Largest array served as JSON (elements); bigger ones come as binary. */
export const JSON_MAX_ELEMENTS = 1_000_000
/** Without ?format, arrays up to this size come as JSON when the client asks for JSON. */
const JSON_DEFAULT_MAX_ELEMENTS = 65_536

export const ArrayQuery = z.object({
  format: z.enum(['binary', 'json']).optional(),
  rows: SliceText.optional(),
  cols: SliceText.optional(),
  transpose: z
    .enum(['true', 'false'])
    .transform((v) => v === 'true')
    .optional()
    .describe('true: a map comes as [z][time] instead of [time][z]'),
})

const NPY_DESCR = { c16: '<c16', f8: '<f8', f4: '<f4' } as const

function typed(a: StoredArray): Float64Array | Float32Array {
  // Copy: a Buffer from pg may sit at an offset that is not a multiple of 8.
  const bytes = new Uint8Array(a.data)
  return a.dtype === 'f4' ? new Float32Array(bytes.buffer, 0, bytes.byteLength / 4) : new Float64Array(bytes.buffer, 0, bytes.byteLength / 8)
}

export function sendArray(req: Request, res: Response, a: StoredArray): void {
  const query = req.query as z.infer<typeof ArrayQuery>
  // The stored bytes go out as they are unless a window asks for part of them (no copy on the common path).
  const win: { data: Flat | null; shape: number[] } = isWindowed(query) ? windowArray(typed(a), a.shape, a.dtype === 'c16', query) : { data: null, shape: a.shape }
  const elements = win.shape.reduce((p, d) => p * d, 1)
  const format = query.format ?? (req.accepts(['application/octet-stream', 'application/json']) === 'application/json' && elements <= JSON_DEFAULT_MAX_ELEMENTS ? 'json' : 'binary')
  res.set('Cache-Control', 'private, max-age=3600')
  if (format === 'json') {
    if (elements > JSON_MAX_ELEMENTS) {
      throw new AppError('too_large_for_json', 422, `${a.name} has ${elements} elements; JSON is limited to ${JSON_MAX_ELEMENTS}: ask for ?format=binary`)
    }
    const values = win.data ?? typed(a)
    const data = a.dtype === 'c16' ? mapValues(splitComplex(values as Float64Array), (v) => Array.from(v)) : { data: Array.from(values) }
    res.json({ name: a.name, dtype: a.dtype, shape: win.shape, units: a.units, description: a.description, ...data })
    return
  }
  res.set({
    'Content-Type': 'application/octet-stream',
    'X-Dtype': NPY_DESCR[a.dtype],
    'X-Shape': win.shape.join(','),
    // Units such as √W are not Latin-1; percent-encoded like RFC 8187 values.
    'X-Units': encodeURIComponent(a.units),
    'Access-Control-Expose-Headers': 'X-Dtype, X-Shape, X-Units',
    'Content-Disposition': `attachment; filename="${a.name}.bin"`,
  })
  res.send(win.data ? Buffer.from(win.data.buffer, win.data.byteOffset, win.data.byteLength) : a.data)
}

const mapValues = <T, U>(o: { re: T; im: T }, f: (v: T) => U) => ({ re: f(o.re), im: f(o.im) })
