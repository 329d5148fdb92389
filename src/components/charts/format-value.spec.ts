import { describe, expect, it } from 'vitest'
import { formatQuantity } from './format-value'

// SI prefixes (BIPM, The International System of Units, 9th ed., §3): a value is written with the prefix
// that keeps its shown mantissa in [1, 1000).
describe('formatQuantity', () => {
  it('writes a colour-bar maximum just under 1 µW as 1 µW at two digits, not 1000 nW', () => {
    expect(formatQuantity(9.99e-7, 'W', 2)).toBe('1 µW')
    expect(formatQuantity(9.996e-7, 'W', 3)).toBe('1 µW')
    expect(formatQuantity(-9.99e-4, 'J', 2)).toBe('-1 mJ')
  })

  it('keeps the mantissa in [1, 1000) across prefixes', () => {
    expect(formatQuantity(1.5e-7, 'W', 2)).toBe('150 nW')
    expect(formatQuantity(994e-9, 'W', 2)).toBe('990 nW')
    expect(formatQuantity(2.5e-12, 'J')).toBe('2.5 pJ')
    expect(formatQuantity(0.0123, 'W')).toBe('12.3 mW')
    for (let e = -14; e < 12; e += 0.37) {
      const s = formatQuantity(10 ** e, 'W', 2)
      const mantissa = Number(s.split(' ')[0])
      expect(mantissa, s).toBeGreaterThanOrEqual(1)
      expect(mantissa, s).toBeLessThan(1000)
    }
  })
})
