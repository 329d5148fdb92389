/*
 * Figures of a correlation sensing map (docs/analysis.md, sensing map, correlation read-out):
 *  - spatial resolution: nominal Δz = v_g Δν_B/(2π f_m Δf) (Hotate & Hasegawa 2000, IEICE Trans. Electron. E83-C,
 *    405), measured as for the time-of-flight map: the 10–90 % width of the fitted shift across the cleanest step
 *    of the true profile (sensing-figures.ts, stepWidthM). That width is about Δz/2 (the stretch where the beat
 *    swings by less than half the linewidth), but the fitted shift overshoots on either side out to about Δz, so
 *    `resolutionM`, which decides whether a hot spot is resolved, is the larger of the measured and nominal figures;
 *  - peak spacing d_m = v_g/(2 f_m): the unambiguous range, the most one set of delays can cover;
 *  - range: the span from the first to the last position with a usable fit (a mixture at an edge inside it is no
 *    limit of the range; what lies beyond d_m is read by the next peak);
 *  - hot spots: as for the time-of-flight map (shorter than the resolution: "not resolved"; else "detected" when
 *    the fit at the centre lies within 3σ of the true shift; "outside scan" when its line lies beyond the scanned
 *    detunings), and "outside range" for one no read position covers.
 */
import { correlationFigures } from '../physics/correlation-figures'
import { segmentShiftMHz, type ProfileSegment } from '../physics/longitudinal-profile'
import type { AssembledSensingMap } from './sensing-map'
import { stepWidthM, trueShiftAt, type HotSpotResult } from './sensing-figures'

export interface CorrelationHotSpot extends Omit<HotSpotResult, 'status'> {
  status: HotSpotResult['status'] | 'outside range'
}

export interface CorrelationSensingFigures {
  nominalResolutionM: number
  measuredResolutionM: number | null
  resolutionM: number
  peakSpacingM: number
  rangeStartM: number
  rangeM: number
  trueShiftMHz: number[]
  hotSpots: CorrelationHotSpot[]
}

export interface CorrelationModulation {
  rateMHz: number
  excursionMHz: number
}

/** First and last position indices with a usable fit (null: none usable). */
function usableSpan(map: AssembledSensingMap): [number, number] | null {
  const first = map.fits.findIndex((f) => f.usable)
  if (first < 0) return null
  let last = map.fits.length - 1
  while (!map.fits[last].usable) last--
  return [first, last]
}

export function correlationSensingFigures(map: AssembledSensingMap, segments: readonly ProfileSegment[], groupIndex: number, linewidthMHz: number, m: CorrelationModulation): CorrelationSensingFigures {
  const cf = correlationFigures(groupIndex, linewidthMHz, m.rateMHz, m.excursionMHz)
  const nominal = cf.peakWidthM ?? cf.peakSpacingM
  const z = map.positionsM
  const span = usableSpan(map)
  const [zFrom, zTo] = span ? [z[span[0]], z[span[1]]] : [z[0], z[0]]
  const edges: { z: number; s1: number; s2: number }[] = []
  for (const s of segments) for (const e of [s.startM, s.endM]) edges.push({ z: e, s1: trueShiftAt(segments, e - 1e-9), s2: trueShiftAt(segments, e) })
  const clean = edges.filter((e) => e.s1 !== e.s2 && Math.abs(e.s2 - e.s1) <= linewidthMHz / 2 && e.z - 1.5 * nominal >= zFrom && e.z + 1.5 * nominal <= zTo && edges.every((o) => o === e || Math.abs(o.z - e.z) > 1.5 * nominal))
  clean.sort((a, b) => Math.abs(a.s2 - a.s1) - Math.abs(b.s2 - b.s1))
  const measured = clean.length > 0 ? stepWidthM(map, clean[0].z, 1.5 * nominal, clean[0].s1, clean[0].s2) : null
  // The fitted shift steps over about Δz/2 but rings out over Δz (docs/analysis.md): a section shorter than Δz
  // reads a mixture, so the hot-spot rule takes the larger of the two.
  const resolutionM = Math.max(measured ?? 0, nominal)
  const hotSpots = segments.flatMap((s, i): CorrelationHotSpot[] => {
    const trueShiftMHz = segmentShiftMHz(s)
    if (trueShiftMHz === 0) return []
    const base = { segment: i + 1, startM: s.startM, endM: s.endM, trueShiftMHz, fittedShiftMHz: null, sigmaMHz: null }
    const centre = (s.startM + s.endM) / 2
    if (!span || centre < zFrom || centre > zTo) return [{ ...base, status: 'outside range' }]
    if (s.endM - s.startM < resolutionM) return [{ ...base, status: 'not resolved' }]
    let k = 0
    z.forEach((p, j) => Math.abs(p - centre) < Math.abs(z[k] - centre) && (k = j))
    const f = map.fits[k]
    if (f.outsideScan) return [{ ...base, status: 'outside scan' }]
    const detected = f.usable && f.shiftMHz !== null && f.sigmaMHz !== null && Math.abs(f.shiftMHz - trueShiftMHz) <= 3 * f.sigmaMHz
    return [{ ...base, fittedShiftMHz: f.shiftMHz, sigmaMHz: f.sigmaMHz, status: detected ? 'detected' : 'missed' }]
  })
  return {
    nominalResolutionM: nominal,
    measuredResolutionM: measured,
    resolutionM,
    peakSpacingM: cf.peakSpacingM,
    rangeStartM: zFrom,
    rangeM: zTo - zFrom,
    trueShiftMHz: z.map((p) => trueShiftAt(segments, p)),
    hotSpots,
  }
}
