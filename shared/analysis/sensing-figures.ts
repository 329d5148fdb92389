/*
 * Figures of a time-of-flight sensing map (docs/analysis.md, sensing map):
 *  - spatial resolution: nominal δz = v_g τ/2 for a pump pulse of duration τ (common practice; Horiguchi &
 *    Tateda 1989, J. Lightwave Technol. 7, 1170; τ of a shape other than rectangular: its equivalent rectangular
 *    duration, physics/pulse-duration.ts), and measured as the 10–90 % width of the fitted shift
 *    across the cleanest step of the true profile: no other edge within 1.5 δz, a change of at most half the
 *    linewidth, and the smallest such change (the fitted shift follows the gain-weighted mean of the two sides
 *    only while the step is small against the linewidth; across a large step the fit jumps from one line to
 *    the other and reads sharper than the pulse resolves). The two differ when the pulse is not long against
 *    the phonon lifetime: the phonon builds up while the pulse passes, so the fitted shift weighs the pulse's
 *    trailing part most and a 10 ns rectangular pulse reads about half of v_g τ/2 (docs/analysis.md). The width
 *    is read on the noise-free map when detector noise is added: the 10 % and 90 % levels of a step of at most
 *    half a linewidth lie within the fit's 1σ at 0.1 % noise (a 10 ns rectangular pulse across a 5 MHz step then
 *    reads 0.77–1.7 × v_g τ/2 instead of 0.62), so the noisy width would measure the noise, not the pulse;
 *  - range: the farthest position up to which every fit is usable (or its line lies outside the scan);
 *  - hot spots: each segment with a shift change. One shorter than the resolution is "not resolved" (its
 *    fitted shift would be a mixture, not a measurement); otherwise "detected" when the fitted shift at its
 *    centre lies within 3σ of the true one, else "missed"; "outside the scanned range" when the gain peak there
 *    sits on the first or last detuning (the fit would be a guess at a line the scan did not reach).
 */
import { segmentShiftMHz, type ProfileSegment } from '../physics/longitudinal-profile'
import type { AssembledSensingMap } from './sensing-map'

export interface HotSpotResult {
  segment: number
  startM: number
  endM: number
  trueShiftMHz: number
  fittedShiftMHz: number | null
  sigmaMHz: number | null
  status: 'detected' | 'missed' | 'not resolved' | 'outside scan'
}

export interface SensingFigures {
  nominalResolutionM: number
  /** Null when the profile has no clean step to measure it on. */
  measuredResolutionM: number | null
  resolutionM: number
  rangeM: number
  trueShiftMHz: number[]
  hotSpots: HotSpotResult[]
}

const C_M_PER_NS = 0.299792458

export function trueShiftAt(segments: readonly ProfileSegment[], zM: number): number {
  for (const s of segments) if (zM >= s.startM && zM < s.endM) return segmentShiftMHz(s)
  return 0
}

/** 10–90 % width of the fitted shift across the edge at zE from level s1 to s2 (null if it never crosses both). */
export function stepWidthM(map: AssembledSensingMap, zE: number, halfSpanM: number, s1: number, s2: number): number | null {
  const z: number[] = []
  const r: number[] = []
  map.positionsM.forEach((p, i) => {
    const f = map.fits[i].shiftMHz
    if (Math.abs(p - zE) <= halfSpanM && f !== null) (z.push(p), r.push((f - s1) / (s2 - s1)))
  })
  const crossing = (level: number, from: number): number | null => {
    for (let i = Math.max(1, from); i < z.length; i++) if (r[i - 1] < level && r[i] >= level) return z[i - 1] + ((level - r[i - 1]) / (r[i] - r[i - 1])) * (z[i] - z[i - 1])
    return null
  }
  const z10 = crossing(0.1, 1)
  if (z10 === null) return null
  const z90 = crossing(0.9, z.findIndex((p) => p >= z10))
  return z90 === null ? null : z90 - z10
}

export function sensingFigures(map: AssembledSensingMap, segments: readonly ProfileSegment[], groupIndex: number, pumpDurationNs: number, linewidthMHz: number, stepMap: AssembledSensingMap = map): SensingFigures {
  const nominal = ((C_M_PER_NS / groupIndex) * pumpDurationNs) / 2
  const edges: { z: number; s1: number; s2: number }[] = []
  for (const s of segments) for (const z of [s.startM, s.endM]) edges.push({ z, s1: trueShiftAt(segments, z - 1e-9), s2: trueShiftAt(segments, z) })
  const length = map.positionsM[map.positionsM.length - 1]
  const clean = edges.filter((e) => e.s1 !== e.s2 && Math.abs(e.s2 - e.s1) <= linewidthMHz / 2 && e.z > 1.5 * nominal && e.z < length - 1.5 * nominal && edges.every((o) => o === e || Math.abs(o.z - e.z) > 1.5 * nominal))
  clean.sort((a, b) => Math.abs(a.s2 - a.s1) - Math.abs(b.s2 - b.s1))
  const measured = clean.length > 0 ? stepWidthM(stepMap, clean[0].z, 1.5 * nominal, clean[0].s1, clean[0].s2) : null
  const resolutionM = measured ?? nominal
  let last = -1
  // A position whose line lies outside the scan still has signal: it does not end the range.
  while (last + 1 < map.fits.length && (map.fits[last + 1].usable || map.fits[last + 1].outsideScan)) last++
  const hotSpots = segments.flatMap((s, i): HotSpotResult[] => {
    const trueShiftMHz = segmentShiftMHz(s)
    if (trueShiftMHz === 0) return []
    const base = { segment: i + 1, startM: s.startM, endM: s.endM, trueShiftMHz }
    if (s.endM - s.startM < resolutionM) return [{ ...base, fittedShiftMHz: null, sigmaMHz: null, status: 'not resolved' }]
    const centre = (s.startM + s.endM) / 2
    let k = 0
    map.positionsM.forEach((p, j) => Math.abs(p - centre) < Math.abs(map.positionsM[k] - centre) && (k = j))
    const f = map.fits[k]
    if (f.outsideScan) return [{ ...base, fittedShiftMHz: null, sigmaMHz: null, status: 'outside scan' }]
    const detected = f.usable && f.shiftMHz !== null && f.sigmaMHz !== null && Math.abs(f.shiftMHz - trueShiftMHz) <= 3 * f.sigmaMHz
    return [{ ...base, fittedShiftMHz: f.shiftMHz, sigmaMHz: f.sigmaMHz, status: detected ? 'detected' : 'missed' }]
  })
  return {
    nominalResolutionM: nominal,
    measuredResolutionM: measured,
    resolutionM,
    rangeM: last >= 0 ? map.positionsM[last] : 0,
    trueShiftMHz: map.positionsM.map((z) => trueShiftAt(segments, z)),
    hotSpots,
  }
}
