/*
 * The two quick ways to lay a model over a measurement, each setting the time offset t₀ and the scale s of
 * y(t) ≈ s·m(t − t₀) (see trace-align.ts for the least-squares one):
 *   by peak:   t₀ = t_peak(y) − t_peak(m), s = max y / max m;
 *   by energy: t₀ = t̄(y) − t̄(m) with t̄ = ∫ t f dt / ∫ f dt the centroid, s = ∫ y dt / ∫ m dt.
 * A shift moves the centroid by the same amount and leaves the area unchanged (common practice), so a scaled,
 * shifted copy of the model is recovered exactly by the energy rule, and by the peak rule up to the parabolic
 * refinement of the sampled peak.
 */
import { energyScale, peakScale, type Series } from './trace-align'

export interface QuickAlignment {
  offsetNs: number
  scale: number
}

/** Time of the largest sample of s inside [a, b], refined by the vertex of the parabola through it and its neighbours. */
export function peakTimeNs(s: Series, a: number, b: number): number | null {
  const t = s.timeNs
  const v = s.values
  let k = -1
  for (let i = 0; i < t.length; i++) if (t[i] >= a && t[i] <= b && (k < 0 || v[i] > v[k])) k = i
  if (k < 0) return null
  if (k === 0 || k === t.length - 1) return t[k]
  // Vertex of the parabola through three points (common practice; uneven spacing allowed).
  const [x0, x1, x2] = [t[k - 1] - t[k], 0, t[k + 1] - t[k]]
  const [y0, y1, y2] = [v[k - 1], v[k], v[k + 1]]
  const den = x0 * (y1 - y2) + x1 * (y2 - y0) + x2 * (y0 - y1)
  if (den === 0) return t[k]
  const num = x0 * x0 * (y1 - y2) + x1 * x1 * (y2 - y0) + x2 * x2 * (y0 - y1)
  const dx = num / (2 * den)
  return t[k] + Math.max(x0, Math.min(x2, dx))
}

/** First moment ∫t s dt / ∫s dt over [a, b] by trapezoids on s's own samples; null when the area is not positive. */
export function centroidNs(s: Series, a: number, b: number): number | null {
  const t = s.timeNs
  const v = s.values
  let area = 0
  let moment = 0
  for (let i = 1; i < t.length; i++) {
    if (t[i - 1] < a || t[i] > b) continue
    const dt = t[i] - t[i - 1]
    area += 0.5 * dt * (v[i] + v[i - 1])
    moment += 0.5 * dt * (t[i] * v[i] + t[i - 1] * v[i - 1])
  }
  return area > 0 ? moment / area : null
}

/**
 * Offset that puts the model's peak on the measurement's, and the peak ratio. The model's peak is looked for
 * where the window [startNs, endNs] of the measurement falls on the model at the offset the search starts from.
 */
export function alignByPeak(measured: Series, model: Series, startNs: number, endNs: number, fromOffsetNs: number): QuickAlignment | null {
  const ty = peakTimeNs(measured, startNs, endNs)
  const tm = peakTimeNs(model, startNs - fromOffsetNs, endNs - fromOffsetNs)
  if (ty === null || tm === null) return null
  const offsetNs = ty - tm
  return { offsetNs, scale: peakScale(measured, model, startNs, endNs, offsetNs) }
}

/** Iterations of the centroid match; each moves the model's part in view by the last correction. */
const CENTROID_ITERATIONS = 50

/**
 * Offset that puts the model's centroid (energy-weighted mean time) on the measurement's, and the energy ratio.
 * The model's centroid is taken over the part in view of the window; the offset is iterated until that part
 * stops moving (a pulse that lies wholly inside the window needs one step).
 */
export function alignByEnergy(measured: Series, model: Series, startNs: number, endNs: number, fromOffsetNs: number): QuickAlignment | null {
  const ty = centroidNs(measured, startNs, endNs)
  if (ty === null) return null
  let offsetNs = fromOffsetNs
  const tol = 1e-9 * Math.max(1, endNs - startNs)
  for (let k = 0; k < CENTROID_ITERATIONS; k++) {
    const tm = centroidNs(model, startNs - offsetNs, endNs - offsetNs)
    if (tm === null) return null
    const next = ty - tm
    const done = Math.abs(next - offsetNs) <= tol
    offsetNs = next
    if (done) break
  }
  return { offsetNs, scale: energyScale(measured, model, startNs, endNs, offsetNs) }
}
