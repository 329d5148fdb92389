/*
 * Pulses cut by the simulated window. The solver samples every pulse on t ∈ [0, T_w] only, so energy
 * that a pulse carries before 0 or after T_w is never launched. The rule: at most TRUNCATION_LIMIT of a
 * pulse's energy E = ∫ P(t) dt may lie outside [0, T_w].
 *
 * Fractions outside, for a pulse centred at c with power FWHM F:
 *   Gaussian  P ∝ exp(−4 ln2 x²/F²):   f(x < −a) = ½ erfc(2√(ln2)·a/F)
 *   sech²     P ∝ sech²(x/T₀), F = 2 ln(1+√2) T₀:   f(x < −a) = ½ (1 − tanh(a/T₀))
 *   others: adaptive Simpson quadrature of pulseAmplitude² (super-Gaussian, tanh-edged rectangle);
 *   sampled: exact, the power is piecewise linear between samples.
 */
import type { Pulse } from './pulse'
import { pulseAmplitude } from './pulse-envelope'

/** Largest fraction of a pulse's energy allowed outside the window (10⁻³: the launched energy is then right to 0.1 %). */
export const TRUNCATION_LIMIT = 1e-3

const SECH2_FWHM_PER_T0 = 2 * Math.log(1 + Math.SQRT2)

/** Complementary error function, fractional error < 1.2e-7 (Press et al., Numerical Recipes, 2nd ed., §6.2, erfcc). */
export function erfc(x: number): number {
  const z = Math.abs(x)
  const t = 1 / (1 + 0.5 * z)
  const r =
    t *
    Math.exp(
      -z * z - 1.26551223 + t * (1.00002368 + t * (0.37409196 + t * (0.09678418 + t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))))),
    )
  return x >= 0 ? r : 2 - r
}

export interface OutsideFractions {
  /** Share of the energy before t = 0. */
  before: number
  /** Share of the energy after t = windowNs. */
  after: number
}

/** Half-width (ns) beyond which a shape carries no energy that matters at 10⁻³. */
function supportHalfNs(p: Exclude<Pulse, { shape: 'sampled' }>): number {
  // Where the power has fallen below e^{-40} of the peak (tanh edges fall as e^{-2x·ln9/rise}).
  if (p.shape === 'rectangular') return p.fwhmNs / 2 + 12 * p.riseNs
  if (p.shape === 'superGaussian') return (p.fwhmNs / (2 * Math.pow(Math.LN2, 1 / (2 * p.order)))) * Math.pow(40, 1 / (2 * p.order))
  return 6 * p.fwhmNs
}

function simpson(f: (t: number) => number, a: number, b: number, fa: number, fm: number, fb: number, whole: number, tol: number, depth: number): number {
  const m = (a + b) / 2
  const lm = f((a + m) / 2)
  const rm = f((m + b) / 2)
  const left = ((m - a) / 6) * (fa + 4 * lm + fm)
  const right = ((b - m) / 6) * (fm + 4 * rm + fb)
  if (depth <= 0 || Math.abs(left + right - whole) <= 15 * tol) return left + right + (left + right - whole) / 15
  return simpson(f, a, m, fa, lm, fm, left, tol / 2, depth - 1) + simpson(f, m, b, fm, rm, fb, right, tol / 2, depth - 1)
}

/** ∫ f over [a, b], cut at the given break points and into at least `pieces` parts so no feature is stepped over. */
function integrate(f: (t: number) => number, a: number, b: number, breaks: number[], pieces: number, tol: number): number {
  if (!(b > a)) return 0
  const cuts = [a, ...breaks.filter((x) => x > a && x < b), b].sort((x, y) => x - y)
  let sum = 0
  for (let i = 0; i + 1 < cuts.length; i++) {
    const n = Math.max(1, Math.ceil((pieces * (cuts[i + 1] - cuts[i])) / (b - a)))
    const h = (cuts[i + 1] - cuts[i]) / n
    for (let k = 0; k < n; k++) {
      const x0 = cuts[i] + k * h
      const x1 = x0 + h
      const f0 = f(x0), f1 = f(x1), fm = f((x0 + x1) / 2)
      sum += simpson(f, x0, x1, f0, fm, f1, (h / 6) * (f0 + 4 * fm + f1), tol / n, 30)
    }
  }
  return sum
}

function sampledFractions(p: Extract<Pulse, { shape: 'sampled' }>, windowNs: number): OutsideFractions {
  const n = p.powerShape.length
  const dt = p.sampleIntervalNs
  const t0 = p.centreNs - ((n - 1) * dt) / 2
  // Exact integral of the piecewise-linear power over [lo, hi].
  const between = (lo: number, hi: number) => {
    let s = 0
    for (let i = 0; i + 1 < n; i++) {
      const a = Math.max(lo, t0 + i * dt), b = Math.min(hi, t0 + (i + 1) * dt)
      if (b <= a) continue
      const pa = p.powerShape[i] + ((p.powerShape[i + 1] - p.powerShape[i]) * (a - t0 - i * dt)) / dt
      const pb = p.powerShape[i] + ((p.powerShape[i + 1] - p.powerShape[i]) * (b - t0 - i * dt)) / dt
      s += ((pa + pb) / 2) * (b - a)
    }
    return s
  }
  const end = t0 + (n - 1) * dt
  const total = between(t0, end)
  if (total <= 0) return { before: 0, after: 0 }
  return { before: between(t0, Math.min(0, end)) / total, after: between(Math.max(windowNs, t0), end) / total }
}

/** Shares of a pulse's energy that fall before 0 and after windowNs. */
export function outsideFractions(p: Pulse, windowNs: number): OutsideFractions {
  if (p.shape === 'sampled') return sampledFractions(p, windowNs)
  const c = p.centreNs
  if (p.shape === 'gaussian') {
    const k = (2 * Math.sqrt(Math.LN2)) / p.fwhmNs
    return { before: 0.5 * erfc(k * c), after: 0.5 * erfc(k * (windowNs - c)) }
  }
  if (p.shape === 'sech2') {
    const t0 = p.fwhmNs / SECH2_FWHM_PER_T0
    return { before: 0.5 * (1 - Math.tanh(c / t0)), after: 0.5 * (1 - Math.tanh((windowNs - c) / t0)) }
  }
  const half = supportHalfNs(p)
  const lo = c - half, hi = c + half
  if (lo >= 0 && hi <= windowNs) return { before: 0, after: 0 }
  const power = (t: number) => pulseAmplitude(p, t) ** 2
  const breaks = p.shape === 'rectangular' ? [c - p.fwhmNs / 2, c + p.fwhmNs / 2, 0, windowNs] : [c, 0, windowNs]
  const pieces = p.shape === 'rectangular' ? Math.min(4000, Math.ceil((2 * half) / p.riseNs)) : 64
  const tol = 1e-9 * p.fwhmNs
  const total = integrate(power, lo, hi, breaks, pieces, tol)
  if (total <= 0) return { before: 0, after: 0 }
  return { before: integrate(power, lo, Math.min(0, hi), breaks, pieces, tol) / total, after: integrate(power, Math.max(windowNs, lo), hi, breaks, pieces, tol) / total }
}

const outside = (f: OutsideFractions) => f.before + f.after

/** Bisection for the boundary of `ok` between a (fails) and b (passes). */
function bisect(ok: (x: number) => boolean, a: number, b: number): number {
  for (let i = 0; i < 60; i++) {
    const m = (a + b) / 2
    if (ok(m)) b = m
    else a = m
  }
  return b
}

const round3 = (x: number, up: boolean) => {
  const e = Math.pow(10, Math.floor(Math.log10(Math.abs(x) || 1)) - 2)
  return (up ? Math.ceil(x / e) : Math.floor(x / e)) * e
}
const fmt = (x: number) => String(Number(x.toPrecision(3)))

/**
 * The user-facing message for a pulse losing more than TRUNCATION_LIMIT of its energy at the window's
 * edges, with the centre or width that would fix it; null when the pulse fits.
 */
export function truncationMessage(p: Pulse, windowNs: number): string | null {
  const f = outsideFractions(p, windowNs)
  if (outside(f) <= TRUNCATION_LIMIT) return null
  const fits = (q: Pulse) => outside(outsideFractions(q, windowNs)) <= TRUNCATION_LIMIT
  const where =
    f.before > 0 && f.after > 0 && Math.min(f.before, f.after) > TRUNCATION_LIMIT / 10
      ? `before t = 0 and after ${fmt(windowNs)} ns`
      : f.before >= f.after
        ? 'before t = 0'
        : `after the window ends at ${fmt(windowNs)} ns`
  const lost = `${fmt(100 * outside(f))} % of this pulse's energy falls ${where} and would not be launched`
  const fixes: string[] = []
  const moved = (c: number) => ({ ...p, centreNs: c }) as Pulse
  const mid = windowNs / 2
  if (f.before > f.after && p.centreNs < mid && fits(moved(mid))) fixes.push(`move the centre to ≥ ${fmt(round3(bisect((c) => fits(moved(c)), p.centreNs, mid), true))} ns`)
  else if (f.after > f.before && p.centreNs > mid && fits(moved(mid))) fixes.push(`move the centre to ≤ ${fmt(round3(bisect((c) => fits(moved(c)), p.centreNs, mid), false))} ns`)
  if ('fwhmNs' in p) {
    const narrowed = (w: number) => ({ ...p, fwhmNs: w }) as Pulse
    const w = bisect((x) => fits(narrowed(x)), p.fwhmNs, 0)
    if (w > 0 && fits(narrowed(w))) fixes.push(`shorten the FWHM to ≤ ${fmt(round3(w, false))} ns`)
  }
  fixes.push(`lengthen the window`)
  return `${lost}: ${fixes.slice(0, 2).join(' or ')}`
}
