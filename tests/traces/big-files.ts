// Large trace files for the limit tests, built the way the failures were seen: one line with no line
// break, and a valid two-column scope export with a million rows.

/** `bytes` of "0.001,0.001,…" with no line break: one line far past the line-length limit. */
export function oneLineCsv(bytes: number): Buffer {
  return Buffer.alloc(bytes, '0.001,')
}

/** A header naming its units and `rows` samples of a 1 GHz ripple, every 0.1 ns (time in s, power in W). */
export function scopeCsv(rows: number): Buffer {
  const lines = ['time (s),power (W)']
  for (let i = 0; i < rows; i++) lines.push(`${(i * 1e-10).toExponential(6)},${(1e-3 * (1 + Math.sin((2 * Math.PI * i) / 10))).toExponential(6)}`)
  return Buffer.from(lines.join('\n') + '\n')
}
