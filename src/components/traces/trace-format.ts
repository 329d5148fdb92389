/** Numbers as the trace views show them: 4 significant digits, exponent form outside 1e-3…1e5. */
export function fmt(v: number | null | undefined, digits = 4): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '–'
  const a = Math.abs(v)
  if (a !== 0 && (a < 1e-3 || a >= 1e5)) return v.toExponential(digits - 1)
  return Number(v.toPrecision(digits)).toString()
}

/** "1.23 ± 0.04" with the uncertainty's first two digits setting the precision. */
export function withUncertainty(v: number, sigma: number | null): string {
  if (sigma === null || !Number.isFinite(sigma) || sigma <= 0) return `${fmt(v)}`
  const a = Math.abs(v)
  if (a !== 0 && (a < 1e-3 || a >= 1e5)) {
    const e = Math.floor(Math.log10(a))
    const digits = Math.max(1, e - Math.floor(Math.log10(sigma)) + 2)
    return `(${(v / 10 ** e).toFixed(digits - 1)} ± ${(sigma / 10 ** e).toFixed(digits - 1)})e${e}`
  }
  const decimals = Math.max(0, 1 - Math.floor(Math.log10(sigma)))
  return `${v.toFixed(decimals)} ± ${sigma.toFixed(decimals)}`
}

export const formatBytes = (n: number) => (n < 1024 ? `${n} B` : n < 1024 ** 2 ? `${(n / 1024).toFixed(1)} kB` : `${(n / 1024 ** 2).toFixed(1)} MB`)

/** Every k-th point so a chart gets at most `max`. */
export function thin<T>(a: ArrayLike<T>, max = 4000): T[] {
  const step = Math.max(1, Math.ceil(a.length / max))
  const out: T[] = []
  for (let i = 0; i < a.length; i += step) out.push(a[i])
  return out
}
