// Numbers with units for readouts, tables and axes: SI prefixes for SI units, powers of ten otherwise.

const PREFIXES: Array<[number, string]> = [
  [1e12, 'T'],
  [1e9, 'G'],
  [1e6, 'M'],
  [1e3, 'k'],
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'µ'],
  [1e-9, 'n'],
  [1e-12, 'p'],
  [1e-15, 'f'],
]

/** Units that take SI prefixes ("2.3 mW"); anything else is written with an exponent ("4.1e9 phonons/m"). */
const PREFIXABLE = new Set(['W', 'J', 's', 'm', 'Hz'])

export function formatQuantity(v: number | null | undefined, unit: string, digits = 3): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—'
  if (v === 0) return `0 ${unit}`.trim()
  if (PREFIXABLE.has(unit)) {
    // Pick the prefix after rounding to the digits shown: 9.99e-7 W at 2 digits is "1 µW", not "1000 nW".
    const a = Math.abs(Number(v.toPrecision(digits)))
    const [f, p] = PREFIXES.find(([f]) => a >= f) ?? PREFIXES[PREFIXES.length - 1]
    return `${Number((v / f).toPrecision(digits))} ${p}${unit}`
  }
  return `${formatNumber(v, digits)} ${unit}`.trim()
}

/** Plain numbers: fixed for everyday magnitudes, exponent outside 1e-3..1e5. */
export function formatNumber(v: number | null | undefined, digits = 3): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—'
  const a = Math.abs(v)
  if (a !== 0 && (a < 1e-3 || a >= 1e5)) return v.toExponential(digits - 1).replace('e+', 'e')
  return String(Number(v.toPrecision(digits)))
}

export function formatDuration(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds)) return '—'
  if (seconds < 1) return `${Math.round(seconds * 1000)} ms`
  if (seconds < 90) return `${seconds.toFixed(seconds < 10 ? 1 : 0)} s`
  const m = Math.floor(seconds / 60)
  const s = Math.round(seconds % 60)
  return m < 60 ? `${m} min ${s} s` : `${Math.floor(m / 60)} h ${m % 60} min`
}
