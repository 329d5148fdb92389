import { execFileSync } from 'node:child_process'
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { readNpyArray } from '@shared/analysis/trace-parse/npy'
import { encodeNpy, npyHeader, type NpyDescr } from './npy'

const ascii = (b: Uint8Array) => String.fromCharCode(...b)

function hasNumpy(): boolean {
  try {
    execFileSync('python3', ['-c', 'import numpy'], { stdio: 'ignore' })
    return true
  } catch {
    return false
  }
}

describe('NPY v1.0 header (numpy.org/neps/nep-0001-npy-format.html)', () => {
  it('writes magic, version 1.0, a little-endian header length and the dict text, hand-computed', () => {
    const h = npyHeader('<f8', [3])
    // Dict "{'descr': '<f8', 'fortran_order': False, 'shape': (3,), }" is 57 characters; 10 + 57 + '\n' = 68
    // rounds up to 128, so HLEN = 118 = 0x76 with 60 spaces of padding.
    expect(Array.from(h.subarray(0, 10))).toEqual([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, 1, 0, 0x76, 0x00])
    expect(h.length).toBe(128)
    expect(ascii(h.subarray(10))).toBe("{'descr': '<f8', 'fortran_order': False, 'shape': (3,), }" + ' '.repeat(60) + '\n')
  })

  it('writes tuple shapes the Python way: () for 0-d, (n,) for 1-d, (a, b) for 2-d', () => {
    expect(ascii(npyHeader('<f8', []))).toContain("'shape': (), }")
    expect(ascii(npyHeader('<c16', [2, 3]))).toContain("'descr': '<c16', 'fortran_order': False, 'shape': (2, 3), }")
  })

  it('aligns the data start to 64 bytes for every dtype and shape, and stores HLEN little-endian', () => {
    const shapes = [[], [0], [1], [7], [1024, 1024], [123456789, 3], [2, 3, 4, 5, 6, 7, 8, 9]]
    for (const descr of ['<c16', '<f8', '<f4'] as NpyDescr[]) {
      for (const s of shapes) {
        const h = npyHeader(descr, s)
        expect(h.length % 64).toBe(0)
        expect(h[8] | (h[9] << 8)).toBe(h.length - 10)
        expect(h[h.length - 1]).toBe(0x0a)
      }
    }
  })

  it('refuses negative or fractional shapes and data of the wrong size or type', () => {
    expect(() => npyHeader('<f8', [-1])).toThrow(/non-negative integers/)
    expect(() => npyHeader('<f8', [1.5])).toThrow(/non-negative integers/)
    expect(() => encodeNpy({ descr: '<c16', shape: [3], data: new Float64Array(3) })).toThrow(/needs 6/)
    expect(() => encodeNpy({ descr: '<f4', shape: [3], data: new Float64Array(3) })).toThrow(/Float32Array/)
  })
})

describe('NPY round trip', () => {
  it('reads back interleaved complex, float64 and float32 bit for bit', () => {
    const c16 = Float64Array.from({ length: 12 }, (_, i) => Math.sin(i) * 1e-3)
    const f8 = Float64Array.from([0, -0, 1e-300, Number.MAX_VALUE, Math.PI])
    const f4 = Float32Array.from([1.5, -2.25, 3e-20])
    for (const a of [
      { descr: '<c16' as const, shape: [2, 3], data: c16 },
      { descr: '<f8' as const, shape: [5], data: f8 },
      { descr: '<f4' as const, shape: [3, 1], data: f4 },
    ]) {
      const back = readNpyArray(encodeNpy(a))
      expect(back.descr).toBe(a.descr)
      expect(back.fortranOrder).toBe(false)
      expect(back.shape).toEqual(a.shape)
      expect(Array.from(back.data)).toEqual(Array.from(a.data))
      expect((10 + back.headerLength) % 64).toBe(0)
    }
  })

  it('writes the little-endian IEEE bytes of each value (1.0 as float64 is 00 00 00 00 00 00 F0 3F)', () => {
    const bytes = encodeNpy({ descr: '<f8', shape: [1], data: Float64Array.of(1) })
    expect(Array.from(bytes.subarray(128))).toEqual([0, 0, 0, 0, 0, 0, 0xf0, 0x3f])
  })

  it.skipIf(!hasNumpy())('numpy.load reads our files with the same dtype, shape and values (numpy as reference)', () => {
    const dir = mkdtempSync(join(tmpdir(), 'npy-'))
    try {
      const path = join(dir, 'a.npy')
      const data = Float64Array.from([1, 2, 3, 4, 5, -6])
      writeFileSync(path, encodeNpy({ descr: '<c16', shape: [3], data }))
      const out = execFileSync('python3', ['-c', `import numpy as np; a = np.load(${JSON.stringify(path)}); print(a.dtype.str, a.shape, a.real.tolist(), a.imag.tolist())`]).toString().trim()
      expect(out).toBe('<c16 (3,) [1.0, 3.0, 5.0] [2.0, 4.0, -6.0]')
    } finally {
      rmSync(dir, { recursive: true, force: true })
    }
  })

  it.skipIf(!hasNumpy())('the shared reader reads numpy-written big-endian complex and float32 files (numpy as reference)', () => {
    const dir = mkdtempSync(join(tmpdir(), 'npy-'))
    try {
      const c = join(dir, 'c.npy')
      const f = join(dir, 'f.npy')
      execFileSync('python3', ['-c', `import numpy as np; np.save(${JSON.stringify(c)}, np.array([1+2j, -3.5+0.25j], dtype='>c16')); np.save(${JSON.stringify(f)}, np.arange(6, dtype='<f4').reshape(2, 3))`])
      const complex = readNpyArray(new Uint8Array(readFileSync(c)))
      expect(complex.descr).toBe('>c16')
      expect(complex.shape).toEqual([2])
      expect(Array.from(complex.data)).toEqual([1, 2, -3.5, 0.25])
      const real = readNpyArray(new Uint8Array(readFileSync(f)))
      expect(real.descr).toBe('<f4')
      expect(real.shape).toEqual([2, 3])
      expect(Array.from(real.data)).toEqual([0, 1, 2, 3, 4, 5])
    } finally {
      rmSync(dir, { recursive: true, force: true })
    }
  })
})
