import { describe, expect, it } from 'vitest'
import { formatToError, formatValue } from './sweep-format'

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
