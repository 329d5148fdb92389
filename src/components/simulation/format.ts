// Number formatting for tables of physical quantities: four significant figures, powers of ten written out.
const SUPERSCRIPT: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' }

export function formatNumber(x: number, digits = 4): string {
  if (!Number.isFinite(x)) return String(x)
  if (x === 0) return '0'
  const a = Math.abs(x)
  // toPrecision switches to "1.266e+5" once the exponent reaches `digits`; write those as powers of ten instead.
  if (a >= 1e-3 && a < 10 ** digits) return trimZeros(x.toPrecision(digits))
  const [mant, exp] = x.toExponential(digits - 1).split('e')
  const e = String(Number(exp)).split('').map((ch) => SUPERSCRIPT[ch] ?? ch).join('')
  return `${trimZeros(mant)} × 10${e}`
}

function trimZeros(s: string): string {
  if (!s.includes('.') || s.includes('e')) return s
  return s.replace(/\.?0+$/, '')
}

export function formatBytes(bytes: number): string {
  if (bytes < 1024 ** 2) return `${formatNumber(bytes / 1024, 3)} KiB`
  if (bytes < 1024 ** 3) return `${formatNumber(bytes / 1024 ** 2, 3)} MiB`
  return `${formatNumber(bytes / 1024 ** 3, 3)} GiB`
}

export function formatDuration(seconds: number): string {
  // Three figures: with two, 100–999 ms would be written as powers of ten.
  if (seconds < 1) return `${formatNumber(seconds * 1000, 3)} ms`
  if (seconds < 120) return `${formatNumber(seconds, 3)} s`
  if (seconds < 7200) return `${formatNumber(seconds / 60, 3)} min`
  return `${formatNumber(seconds / 3600, 3)} h`
}

/** A length in the unit that keeps the number between 1 and 1000 where possible (m, mm, µm). */
export function formatLengthM(m: number): string {
  if (m >= 1) return `${formatNumber(m, 3)} m`
  if (m >= 1e-3) return `${formatNumber(m * 1e3, 3)} mm`
  return `${formatNumber(m * 1e6, 3)} µm`
}

/** A time step given in ps, shown in ns once it passes 1000 ps. */
export const formatStepPs = (ps: number): string => (ps >= 1000 ? `${formatNumber(ps / 1000, 3)} ns` : `${formatNumber(ps, 3)} ps`)
