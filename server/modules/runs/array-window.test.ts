// Windows over stored arrays (array-window.ts) and the arrays route that serves them (run-arrays.ts). Expected
// values come from the index rule itself: element (r, c) of the test map holds 1000·r + c, so a window's
// element (i, k) must hold 1000·(r0 + i·rs) + (c0 + k·cs), NumPy's slice rule (start:stop:step, stop excluded).
import express from 'express'
import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { errorHandler } from '../../middleware/error-handler'
import { validate } from '../../middleware/validate'
import { splitComplex, windowArray } from './array-window'
import { ArrayQuery, sendArray } from './run-arrays'
import { tracesCsv } from './run-download'
import type { StoredArray } from './runs.repo'

const ROWS = 12
const COLS = 7
const map = Float32Array.from({ length: ROWS * COLS }, (_, i) => 1000 * Math.floor(i / COLS) + (i % COLS))

/** The values a window should give, listed by the slice rule with plain loops. */
function expected(rows: number[], cols: number[], transpose = false): number[] {
  const out: number[] = []
  if (transpose) for (const c of cols) for (const r of rows) out.push(1000 * r + c)
  else for (const r of rows) for (const c of cols) out.push(1000 * r + c)
  return out
}
const range = (start: number, stop: number, step = 1) => Array.from({ length: Math.ceil((stop - start) / step) }, (_, i) => start + i * step)

describe('array windows', () => {
  it('crops a map to rows 3:9 and columns 2:5', () => {
    const w = windowArray(map, [ROWS, COLS], false, { rows: '3:9', cols: '2:5' })
    expect(w.shape).toEqual([6, 3])
    expect(Array.from(w.data)).toEqual(expected(range(3, 9), range(2, 5)))
    expect(w.data).toBeInstanceOf(Float32Array)
  })

  it('decimates with steps, open ends included (::5 rows, 1::3 columns)', () => {
    const w = windowArray(map, [ROWS, COLS], false, { rows: '::5', cols: '1::3' })
    expect(w.shape).toEqual([3, 2])
    expect(Array.from(w.data)).toEqual(expected([0, 5, 10], [1, 4]))
  })

  it('transposes a map to [z][time], after cropping', () => {
    const w = windowArray(map, [ROWS, COLS], false, { rows: '1:4', transpose: true })
    expect(w.shape).toEqual([COLS, 3])
    expect(Array.from(w.data)).toEqual(expected(range(1, 4), range(0, COLS), true))
  })

  it('slices complex traces by sample and keeps each (re, im) pair together', () => {
    const n = 10
    const trace = Float64Array.from({ length: 2 * n }, (_, i) => (i % 2 === 0 ? i / 2 : -i))
    const w = windowArray(trace, [n], true, { rows: '2:9:3' })
    expect(w.shape).toEqual([3])
    expect(Array.from(w.data)).toEqual([2, -5, 5, -11, 8, -17])
    expect(splitComplex(trace)).toEqual({ re: Float64Array.from(range(0, n)), im: Float64Array.from(range(0, n), (k) => -(2 * k + 1)) })
  })

  it('gives back the stored buffer itself when nothing is asked', () => {
    expect(windowArray(map, [ROWS, COLS], false, {}).data).toBe(map)
  })

  it('refuses ranges past the end or empty, and columns or a transpose on a 1-D array, naming the field', () => {
    const fieldOf = (f: () => unknown) => {
      try {
        f()
      } catch (e) {
        return (e as { httpStatus: number; details: { fields: { path: string }[] } }).details.fields[0].path
      }
      return 'accepted'
    }
    expect(fieldOf(() => windowArray(map, [ROWS, COLS], false, { rows: '0:13' }))).toBe('rows')
    expect(fieldOf(() => windowArray(map, [ROWS, COLS], false, { cols: '5:5' }))).toBe('cols')
    expect(fieldOf(() => windowArray(new Float64Array(4), [4], false, { cols: '0:2' }))).toBe('cols')
    expect(fieldOf(() => windowArray(new Float64Array(4), [4], false, { transpose: true }))).toBe('transpose')
  })
})

describe('GET …/arrays/:name with a window', () => {
  const stored: StoredArray = { name: 'map_pump_power_w', dtype: 'f4', shape: [ROWS, COLS], units: 'W', description: 'test map', data: Buffer.from(map.buffer) }
  const app = express()
  app.get('/a', validate({ query: ArrayQuery }), (req, res) => sendArray(req, res, stored))
  app.use(errorHandler)

  it('sends the decimated, transposed map as binary with its new shape', async () => {
    const res = await request(app).get('/a?format=binary&rows=0:12:4&cols=0:3&transpose=true').buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = []
      r.on('data', (c: Buffer) => chunks.push(c))
      r.on('end', () => cb(null, Buffer.concat(chunks)))
    })
    expect(res.status).toBe(200)
    expect(res.headers['x-shape']).toBe('3,3')
    const body = res.body as Buffer
    expect(Array.from(new Float32Array(body.buffer, body.byteOffset, body.byteLength / 4))).toEqual(expected([0, 4, 8], [0, 1, 2], true))
  })

  it('sends a cropped map as JSON, and a bad range as a 400 naming the field', async () => {
    const ok = await request(app).get('/a?format=json&rows=10:&cols=5:')
    expect(ok.body.shape).toEqual([2, 2])
    expect(ok.body.data).toEqual(expected([10, 11], [5, 6]))
    const bad = await request(app).get('/a?rows=3-4')
    expect(bad.status).toBe(400)
    expect(bad.body.error.fields[0].path).toBe('rows')
    const past = await request(app).get('/a?cols=0:99')
    expect(past.status).toBe(400)
    expect(past.body.error.fields[0].path).toBe('cols')
  })
})

describe('trace CSV of the run ZIP', () => {
  it('writes re, im and |A|² of each interleaved complex trace per time sample', () => {
    const arr = (name: string, values: number[], dtype: 'f8' | 'c16' = 'c16'): StoredArray => ({ name, dtype, shape: [dtype === 'c16' ? values.length / 2 : values.length], units: dtype === 'c16' ? '√W' : 'ns', description: '', data: Buffer.from(Float64Array.from(values).buffer) })
    const csv = tracesCsv(arr('time_ns', [0, 0.5], 'f8'), [arr('ch1_pump_out', [3, 4, 1, 0]), arr('ch1_stokes_out', [0, 2, 0.5, -0.5])])
    expect(csv.split('\n')).toEqual([
      'time (ns),ch1_pump_out re (sqrtW),ch1_pump_out im (sqrtW),ch1_pump_out power (W),ch1_stokes_out re (sqrtW),ch1_stokes_out im (sqrtW),ch1_stokes_out power (W)',
      '0,3,4,25,0,2,4',
      '0.5,1,0,1,0.5,-0.5,0.5',
      '',
    ])
  })
})
