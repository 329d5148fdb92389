// Small-signal gain slope of an amplifier from gain (dB) against pump power (W).
//
// Below saturation the Brillouin gain in dB is linear in pump power,
//     G_dB(P) = 10·log10(e)·(η g_B P L_eff / A_eff − αL)        (Agrawal, Nonlinear Fiber Optics, ch. 9),
// so a straight line G_dB = c + s·P through the unsaturated points gives the slope s in dB/W.
//
// Which points are unsaturated: saturation sets in gradually as the Stokes takes power from the pump, and the
// 1 dB gain-compression point is the usual mark of full saturation (common practice for amplifiers). A
// small-signal slope needs the points well before it, so, sorted by power, points are taken while their gain
// lies within COMPRESSION_DB of the straight line through the three lowest-power points; the first one
// further below ends the run. Linear least squares over the points taken, with the covariance s²(JᵀJ)⁻¹,
// s² = SSR/(N − 2) (least-squares.ts; common practice).
import { parameterSigmas } from './least-squares'

/** Gain compression (dB) that ends the small-signal points: half the 1 dB compression mark; our choice. */
export const COMPRESSION_DB = 0.5
/** Points needed for a slope with an error (two parameters, one degree of freedom). */
const MIN_POINTS = 3

export interface LineFit {
  slope: number
  slopeSigma: number | null
  intercept: number
  interceptSigma: number | null
  points: number
}

/** Least-squares straight line y = intercept + slope·x. */
export function fitLine(x: readonly number[], y: readonly number[]): LineFit {
  const n = x.length
  const xm = x.reduce((s, v) => s + v, 0) / n
  const ym = y.reduce((s, v) => s + v, 0) / n
  let sxx = 0
  let sxy = 0
  for (let i = 0; i < n; i++) {
    sxx += (x[i] - xm) ** 2
    sxy += (x[i] - xm) * (y[i] - ym)
  }
  const slope = sxy / sxx
  const intercept = ym - slope * xm
  let ssr = 0
  for (let i = 0; i < n; i++) ssr += (y[i] - intercept - slope * x[i]) ** 2
  const [interceptSigma, slopeSigma] = parameterSigmas([x.map(() => 1), [...x]], ssr, n)
  return { slope, slopeSigma, intercept, interceptSigma, points: n }
}

export interface GainSlopeFit extends LineFit {
  /** Highest pump power among the points used (W). */
  maxPowerUsedW: number
  /** Lowest power whose gain fell more than COMPRESSION_DB below the reference line, or null when none did. */
  saturatedFromW: number | null
}

export type GainSlopeResult = { ok: true; fit: GainSlopeFit } | { ok: false; reason: string }

export function fitSmallSignalGainSlope(powerW: readonly number[], gainDb: readonly number[]): GainSlopeResult {
  const pts = powerW
    .map((p, i) => ({ p, g: gainDb[i] }))
    .filter((q) => Number.isFinite(q.p) && Number.isFinite(q.g))
    .sort((a, b) => a.p - b.p)
  if (pts.length < MIN_POINTS) return { ok: false, reason: `needs at least ${MIN_POINTS} points with a gain (has ${pts.length})` }
  if (pts[MIN_POINTS - 1].p <= pts[0].p) return { ok: false, reason: 'needs points at more than one pump power' }

  // A fixed reference: refitting as points are added would let the line bend down with a slow saturation.
  const ref = fitLine(pts.slice(0, MIN_POINTS).map((q) => q.p), pts.slice(0, MIN_POINTS).map((q) => q.g))
  let used = MIN_POINTS
  let saturatedFromW: number | null = null
  for (; used < pts.length; used++) {
    const next = pts[used]
    if (ref.intercept + ref.slope * next.p - next.g > COMPRESSION_DB) {
      saturatedFromW = next.p
      break
    }
  }
  const line = fitLine(pts.slice(0, used).map((q) => q.p), pts.slice(0, used).map((q) => q.g))
  return { ok: true, fit: { ...line, maxPowerUsedW: pts[used - 1].p, saturatedFromW } }
}
