// The sensing map of a sweep over the pump–probe detuning (a sensing scan, time-of-flight or correlation read-out):
// request options, the answer, and the check that a sweep is such a scan (docs/analysis.md, sensing map).
import { z } from 'zod'
import type { SweepDetail } from './sweeps'
import { correlationConfigProblem, isCorrelationAxes } from './correlation-scan'

export const SensingMapQuery = z.object({
  format: z.enum(['json', 'csv', 'npy']).default('json').describe('json: map and fits; csv: per-position table; npy: the gain map'),
  noiseRms: z.coerce.number().min(0).max(0.5).default(0).describe('Detector noise added before the fits, rms as a fraction of the probe power'),
})
export type SensingMapQuery = z.infer<typeof SensingMapQuery>

const nullableNumber = z.number().nullable()

export const SensingHotSpot = z.object({
  segment: z.number().int().positive(),
  startM: z.number(),
  endM: z.number(),
  trueShiftMHz: z.number(),
  fittedShiftMHz: nullableNumber,
  sigmaMHz: nullableNumber,
  /** outside range: no position the correlation read-out read covers it. */
  status: z.enum(['detected', 'missed', 'not resolved', 'outside scan', 'outside range']),
})
export type SensingHotSpot = z.infer<typeof SensingHotSpot>

export const SensingMapResponse = z.object({
  /** The waveguide's own ν_B; shifts are changes from it. */
  brillouinShiftGHz: z.number(),
  positionsM: z.array(z.number()),
  detuningsMHz: z.array(z.number()),
  /** ln(P_probe/P_probe without pump), [position][detuning]. */
  gainLn: z.array(z.array(z.number())),
  fittedShiftMHz: z.array(nullableNumber),
  sigmaMHz: z.array(nullableNumber),
  peakGainLn: z.array(nullableNumber),
  usable: z.array(z.boolean()),
  /** The gain peak at this position sits on the first or last detuning: outside the scanned range, no fit
   *  (time-of-flight read-out; absent where the read-out does not check it). */
  outsideScan: z.array(z.boolean()).optional(),
  trueShiftMHz: z.array(z.number()),
  nominalResolutionM: z.number(),
  measuredResolutionM: nullableNumber,
  resolutionM: z.number(),
  rangeM: z.number(),
  hotSpots: z.array(SensingHotSpot),
  pointsUsed: z.number().int(),
  pointsPending: z.number().int(),
  noiseRms: z.number(),
  /** Absent: time-of-flight. */
  readOut: z.enum(['time-of-flight', 'correlation']).optional(),
  /** Correlation read-out: the distance d_m between correlation peaks, the unambiguous range (m). */
  peakSpacingM: z.number().optional(),
  /** Correlation read-out: the first position of the range (m); the range runs from it for rangeM. */
  rangeStartM: z.number().optional(),
})
export type SensingMapResponse = z.infer<typeof SensingMapResponse>

/** Why a sweep is not a sensing scan (a sentence for the user), or null when it is one. */
export function sensingScanProblem(s: Pick<SweepDetail, 'axes' | 'baseConfig'>): string | null {
  if (isCorrelationAxes(s.axes)) return correlationConfigProblem(s.baseConfig)
  if (s.axes.length !== 1 || s.axes[0].field !== 'detuningMHz') return 'A sensing map needs a sweep of the detuning alone (time-of-flight read-out) or of the detuning and the Stokes source delay (correlation read-out)'
  const c = s.baseConfig
  if (c.channels.length !== 1) return 'A sensing map needs a single channel'
  const pulse = c.channels[0].pump.pulses[0]
  if (!pulse) return 'A sensing map needs a pump pulse (time-of-flight read-out)'
  if (pulse.shape === 'sampled') return 'A sensing map needs a pump pulse of stated width (not a sampled shape)'
  if (!(c.channels[0].stokes.backgroundPowerW > 0)) return 'A sensing map needs a continuous probe: set the Stokes continuous background'
  return null
}

/** Which read-out a sensing scan uses (for a sweep that sensingScanProblem accepts). */
export const sensingReadOut = (s: Pick<SweepDetail, 'axes'>): 'time-of-flight' | 'correlation' => (isCorrelationAxes(s.axes) ? 'correlation' : 'time-of-flight')
