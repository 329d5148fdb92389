// Cropping, decimating and transposing a stored array without reshaping it by hand: a strided ndarray view
// over the flat buffer (start:stop:step per axis, Python's slice rule, stop exclusive), copied once into a
// C-ordered buffer by ndarray-ops. Complex (c16) data carry a trailing axis of 2 (re, im) that is never sliced.
import ndarray from 'ndarray'
import ops from 'ndarray-ops'
import { z } from 'zod'
import { AppError } from '../../errors'

export type Flat = Float64Array | Float32Array

const SLICE = /^(\d{0,10}):(\d{0,10})(?::([1-9]\d{0,9}))?$/
export const SliceText = z
  .string()
  .regex(SLICE, 'must be start:stop or start:stop:step (whole numbers, stop excluded, step at least 1)')
  .describe('A range of indices, start:stop:step as in NumPy; start defaults to 0, stop to the end, step to 1')

export interface ArrayWindow {
  /** Along the first axis (time rows of a map, samples of a trace). */
  rows?: string
  /** Along the second axis (z columns of a map). */
  cols?: string
  /** Swap the two axes of a map: [z][time] instead of [time][z]. */
  transpose?: boolean
}

const bad = (field: keyof ArrayWindow, message: string) => new AppError('invalid_input', 400, `${field}: ${message}`, { fields: [{ path: field, message }] })

function bounds(field: 'rows' | 'cols', text: string, length: number, axisName: string): [number, number, number] {
  const m = SLICE.exec(text)
  if (!m) throw bad(field, 'must be start:stop or start:stop:step')
  const start = m[1] === '' ? 0 : Number(m[1])
  const stop = m[2] === '' ? length : Number(m[2])
  // A step past the end keeps only the first index; bounding it keeps ndarray's 32-bit index arithmetic exact.
  const step = m[3] === undefined ? 1 : Math.min(Number(m[3]), length)
  if (stop > length) throw bad(field, `stop ${stop} is past the end: the array has ${length} ${axisName}`)
  if (start >= stop) throw bad(field, `${text} selects no ${axisName}`)
  return [start, stop, step]
}

export const isWindowed = (w: ArrayWindow) => w.rows !== undefined || w.cols !== undefined || w.transpose === true

/**
 * The part of a stored array a window selects, as a new C-ordered buffer with its shape; the stored buffer
 * itself when the window selects everything as it is.
 */
export function windowArray(data: Flat, shape: number[], complex: boolean, w: ArrayWindow): { data: Flat; shape: number[] } {
  if (!isWindowed(w)) return { data, shape }
  if (shape.length !== 1 && shape.length !== 2) throw bad('rows', `the array has ${shape.length} dimensions; ranges apply to 1-D and 2-D arrays`)
  if (shape.length === 1 && w.cols !== undefined) throw bad('cols', 'the array has one dimension; use rows')
  if (shape.length === 1 && w.transpose) throw bad('transpose', 'the array has one dimension; only maps can be transposed')
  let v = ndarray(data, complex ? [...shape, 2] : shape)
  const axes = shape.length === 2 ? ['rows', 'columns'] : ['samples']
  const [r0, r1, rs] = w.rows === undefined ? [0, shape[0], 1] : bounds('rows', w.rows, shape[0], axes[0])
  if (shape.length === 1) {
    v = v.hi(r1).lo(r0).step(rs)
  } else {
    const [c0, c1, cs] = w.cols === undefined ? [0, shape[1], 1] : bounds('cols', w.cols, shape[1], axes[1])
    v = v.hi(r1, c1).lo(r0, c0).step(rs, cs)
    if (w.transpose) v = complex ? v.transpose(1, 0, 2) : v.transpose(1, 0)
  }
  const out = data instanceof Float32Array ? new Float32Array(v.size) : new Float64Array(v.size)
  ops.assign(ndarray(out, v.shape), v)
  return { data: out, shape: complex ? v.shape.slice(0, -1) : v.shape }
}

/** Real and imaginary parts of interleaved complex data, each as its own array (strided views, one copy each). */
export function splitComplex(data: Float64Array): { re: Float64Array; im: Float64Array } {
  const n = data.length / 2
  const pairs = ndarray(data, [n, 2])
  const re = new Float64Array(n)
  const im = new Float64Array(n)
  ops.assign(ndarray(re, [n]), pairs.pick(null, 0))
  ops.assign(ndarray(im, [n]), pairs.pick(null, 1))
  return { re, im }
}
