import { describe, expect, it } from 'vitest'
import { formatToError, formatValue, percentText, progressOf } from './sweep-format'

describe('formatToError', () => {
  it('quotes a figure down to the second significant digit of its estimated error (common practice)', () => {
    // Error 0.00012 → last digit kept at 1e-5: 0.078 6 4 → 0.07786.
    expect(formatToError(0.0778634, 0.00012)).toBe('0.07786')
    // A coarse error cuts the noise digits: 45.70512 ± 0.30 dB → 45.71; ± 3.0 dB → 45.7; ± 30 dB → 46.
    expect(formatToError(45.70512, 0.3)).toBe('45.71')
    expect(formatToError(45.70512, 3)).toBe('45.7')
    expect(formatToError(45.70512, 30)).toBe('46')
  })

  it('keeps at most six digits however small the error, and at least one however large', () => {
    expect(formatToError(0.123456789, 1e-15)).toBe('0.123457')
    expect(formatToError(0.0625, 5)).toBe('0.06')
  })

  it('falls back to four significant digits without an estimate', () => {
    expect(formatToError(0.0778634, null)).toBe(formatValue(0.0778634))
    expect(formatToError(0.0778634, null)).toBe('0.07786')
    expect(formatToError(null, 0.1)).toBe('—')
  })
})

describe('sweep progress', () => {
  const counts = { queued: 8, running: 2, succeeded: 0, failed: 0, cancelled: 0 }
  it('counts the running points’ own progress, so the bar moves before the first point finishes', () => {
    const points = [
      { status: 'running' as const, progress: 0.3 },
      { status: 'running' as const, progress: 0.1 },
      ...Array.from({ length: 8 }, () => ({ status: 'queued' as const, progress: 0 })),
    ]
    expect(progressOf({ counts, pointCount: 10, points })).toBeCloseTo(0.04, 15)
    expect(progressOf({ counts, pointCount: 10 })).toBe(0)
  })

  it('writes small fractions with their digit instead of rounding them to zero', () => {
    expect([0, 0.0004, 0.004, 0.04, 0.4, 0.999, 1].map(percentText)).toEqual(['0 %', '< 0.1 %', '0.4 %', '4 %', '40 %', '99 %', '100 %'])
  })
})
