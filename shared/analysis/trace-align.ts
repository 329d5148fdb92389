/*
 * Lining a model trace up with a measurement: the measurement y(t) against s·m(t − t₀), m linearly
 * interpolated and zero outside its record (no light before the run starts or after it ends).
 *
 * For a fixed offset t₀ the best scale is linear least squares in closed form, s = Σ y m / Σ m²; the offset
 * is found by a scan over its range followed by golden-section search (Kiefer 1953) in the best scan cell.
 * Peak and energy normalisation are the two quick alternatives for the overlay.
 */
import { informationCriteria, parameterSigmas } from './least-squares'

export interface Series {
  timeNs: ArrayLike<number>
  values: ArrayLike<number>
}

/** Value of a series at time t by linear interpolation; 0 outside its record. */
export function sampleAt(s: Series, t: number, hint = { j: 0 }): number {
  const x = s.timeNs
  const n = x.length
  if (n === 0 || t < x[0] || t > x[n - 1]) return 0
  let j = hint.j
  if (j >= n - 1 || x[j] > t) j = 0
  while (j < n - 2 && x[j + 1] < t) j++
  hint.j = j
  const span = x[j + 1] - x[j]
  const w = span > 0 ? (t - x[j]) / span : 0
  return s.values[j] * (1 - w) + s.values[j + 1] * w
}

/** Indices of measurement samples inside the window. */
export function windowIndices(timeNs: ArrayLike<number>, startNs: number, endNs: number): number[] {
  const out: number[] = []
  for (let i = 0; i < timeNs.length; i++) if (timeNs[i] >= startNs && timeNs[i] <= endNs) out.push(i)
  return out
}

/** The model shifted by t₀ on the measurement's samples (before scaling). */
export function shiftedModel(model: Series, timeNs: ArrayLike<number>, idx: number[], offsetNs: number): Float64Array {
  const out = new Float64Array(idx.length)
  const hint = { j: 0 }
  for (let k = 0; k < idx.length; k++) out[k] = sampleAt(model, timeNs[idx[k]] - offsetNs, hint)
  return out
}

function bestScale(y: Float64Array, m: Float64Array): { scale: number; ssr: number } {
  let ym = 0
  let mm = 0
  let yy = 0
  for (let i = 0; i < y.length; i++) {
    ym += y[i] * m[i]
    mm += m[i] * m[i]
    yy += y[i] * y[i]
  }
  if (mm === 0) return { scale: 0, ssr: yy }
  const scale = ym / mm
  return { scale, ssr: Math.max(0, yy - scale * ym) }
}

export interface AlignOptions {
  startNs: number
  endNs: number
  offsetMinNs: number
  offsetMaxNs: number
  /** Offsets tried in the scan before the golden-section refinement. */
  scanPoints?: number
}

export interface Alignment {
  offsetNs: number
  scale: number
  offsetUncertaintyNs: number | null
  scaleUncertainty: number | null
  ssr: number
  points: number
  aic: number
  bic: number
}

/** Golden ratio conjugate (√5 − 1)/2. */
const INV_PHI = (Math.sqrt(5) - 1) / 2
/** Golden-section steps: the bracket shrinks by 0.618 each, 60 steps → 1e-12 of the scan cell. */
const GOLDEN_STEPS = 60

export function alignClosedForm(measured: Series, model: Series, o: AlignOptions): Alignment {
  const idx = windowIndices(measured.timeNs, o.startNs, o.endNs)
  if (idx.length < 3) throw new Error(`The window ${o.startNs}–${o.endNs} ns holds ${idx.length} measured samples; at least 3 are needed`)
  const y = Float64Array.from(idx, (i) => measured.values[i])
  const cost = (t0: number) => bestScale(y, shiftedModel(model, measured.timeNs, idx, t0)).ssr

  const scan = Math.max(3, o.scanPoints ?? 401)
  const step = (o.offsetMaxNs - o.offsetMinNs) / (scan - 1)
  let best = o.offsetMinNs
  let bestCost = Infinity
  for (let k = 0; k < scan; k++) {
    const t0 = o.offsetMinNs + k * step
    const c = cost(t0)
    if (c < bestCost) (bestCost = c), (best = t0)
  }
  let a = Math.max(o.offsetMinNs, best - step)
  let b = Math.min(o.offsetMaxNs, best + step)
  let c = b - INV_PHI * (b - a)
  let d = a + INV_PHI * (b - a)
  let fc = cost(c)
  let fd = cost(d)
  for (let k = 0; k < GOLDEN_STEPS && b - a > 1e-15 * Math.max(1, Math.abs(a)); k++) {
    if (fc < fd) ((b = d), (d = c), (fd = fc), (c = b - INV_PHI * (b - a)), (fc = cost(c)))
    else ((a = c), (c = d), (fc = fd), (d = a + INV_PHI * (b - a)), (fd = cost(d)))
  }
  const offsetNs = fc < bestCost || fd < bestCost ? (fc < fd ? c : d) : best
  const m = shiftedModel(model, measured.timeNs, idx, offsetNs)
  const { scale, ssr } = bestScale(y, m)

  // Jacobian of the residual y − s·m(t − t₀): ∂/∂t₀ = s·m'(t − t₀), ∂/∂s = −m.
  const h = Math.max(1e-9, medianStep(model.timeNs) / 2)
  const mPlus = shiftedModel(model, measured.timeNs, idx, offsetNs - h)
  const mMinus = shiftedModel(model, measured.timeNs, idx, offsetNs + h)
  const dOffset = Float64Array.from(m, (_, i) => (scale * (mPlus[i] - mMinus[i])) / (2 * h))
  const [offsetUncertaintyNs, scaleUncertainty] = parameterSigmas([dOffset, m], ssr, idx.length)
  return { offsetNs, scale, offsetUncertaintyNs, scaleUncertainty, ssr, points: idx.length, ...informationCriteria(ssr, idx.length, 2) }
}

export function medianStep(t: ArrayLike<number>): number {
  if (t.length < 2) return 1
  const steps = Array.from({ length: Math.min(t.length - 1, 1001) }, (_, i) => t[i + 1] - t[i]).sort((p, q) => p - q)
  return steps[Math.floor(steps.length / 2)]
}

/** Scale that makes the model's peak equal the measurement's peak inside the window. */
export function peakScale(measured: Series, model: Series, startNs: number, endNs: number, offsetNs: number): number {
  const idx = windowIndices(measured.timeNs, startNs, endNs)
  const m = shiftedModel(model, measured.timeNs, idx, offsetNs)
  const peakM = Math.max(0, ...m)
  const peakY = Math.max(0, ...idx.map((i) => measured.values[i]))
  return peakM > 0 ? peakY / peakM : 0
}

/** Scale that makes the model's energy (∫ dt by trapezoids on the measured samples) equal the measurement's. */
export function energyScale(measured: Series, model: Series, startNs: number, endNs: number, offsetNs: number): number {
  const idx = windowIndices(measured.timeNs, startNs, endNs)
  const m = shiftedModel(model, measured.timeNs, idx, offsetNs)
  let em = 0
  let ey = 0
  for (let k = 1; k < idx.length; k++) {
    const dt = measured.timeNs[idx[k]] - measured.timeNs[idx[k - 1]]
    em += 0.5 * dt * (m[k] + m[k - 1])
    ey += 0.5 * dt * (measured.values[idx[k]] + measured.values[idx[k - 1]])
  }
  return em > 0 ? ey / em : 0
}
