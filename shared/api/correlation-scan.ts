// What makes a sweep a sensing scan with the correlation read-out (docs/analysis.md, sensing map, correlation
// read-out): the detuning and the Stokes source delay as its two axes, one channel, a continuous pump and a
// continuous probe sharing one sinusoidal frequency modulation. The time-of-flight scan is in sensing-map.ts.
import type { SweepAxis } from './sweeps'
import type { SimulationConfig } from '../physics/simulation-config'
import { peakSpacingM, steadyFromNs } from '../analysis/correlation-map'

/** Finished points the correlation map needs at the least: 8 detunings at each of 2 delays. */
export const CORRELATION_MIN_POINTS = 16

/** The two axes of a correlation scan, in either order. */
export function isCorrelationAxes(axes: readonly Pick<SweepAxis, 'field'>[]): boolean {
  const fields = axes.map((a) => a.field).sort()
  return fields.length === 2 && fields[0] === 'detuningMHz' && fields[1] === 'modulationDelayNs'
}

/** Index of the detuning and of the delay among a point's values. */
export function correlationAxisIndex(axes: readonly Pick<SweepAxis, 'field'>[]): { detuning: number; delay: number } {
  const detuning = axes.findIndex((a) => a.field === 'detuningMHz')
  return { detuning, delay: 1 - detuning }
}

/** Why a correlation scan's base run cannot give a map (a sentence for the user), or null. */
export function correlationConfigProblem(c: SimulationConfig): string | null {
  if (c.channels.length !== 1) return 'A sensing map needs a single channel'
  const { pump, stokes } = c.channels[0]
  if (pump.pulses.length > 0 || stokes.pulses.length > 0) return 'The correlation read-out needs a continuous pump and probe: remove their pulses'
  if (!(pump.backgroundPowerW > 0)) return 'The correlation read-out needs a continuous pump: set the pump continuous background'
  if (!(stokes.backgroundPowerW > 0)) return 'A sensing map needs a continuous probe: set the Stokes continuous background'
  const pm = pump.modulation
  const sm = stokes.modulation
  if (!pm || !sm) return 'The correlation read-out needs the pump and the Stokes input both frequency-modulated'
  if (pm.rateMHz !== sm.rateMHz || pm.excursionMHz !== sm.excursionMHz) return 'The pump and the Stokes input must share one modulation: give them the same rate and excursion'
  if (!(pm.excursionMHz > 0)) return 'The correlation read-out needs a frequency excursion above 0: without it nothing localises the interaction'
  return null
}

/** Detunings and delays a correlation scan takes at most: 16 × 16 = the sweep's 256 points. */
export const CORRELATION_SCAN_COUNT = 16

export interface CorrelationScanPlan {
  delayStartNs: number
  delayStopNs: number
  /** Positions the first and the last delay read (m). */
  fromM: number
  toM: number
  /** The window each point needs (ns): two crossings, the sound's settling and one modulation period. */
  windowNs: number
}

/**
 * The delays of a correlation scan: the peak moved over the guide, or over one peak spacing around mid-guide when
 * the guide is longer, z = L/2 + v_g t_d/2 (docs/analysis.md, sensing map, correlation read-out).
 */
export function correlationScanPlan(c: SimulationConfig): CorrelationScanPlan {
  const wg = c.waveguide
  const rateMHz = c.channels[0].pump.modulation?.rateMHz ?? 1
  const dm = peakSpacingM(wg.groupIndex, rateMHz)
  // Just inside ±d_m/2, so the last delay does not read the next peak's first position again.
  const half = Math.min(wg.lengthM / 2, (dm / 2) * (1 - 1 / CORRELATION_SCAN_COUNT))
  const vgMPerNs = 0.299792458 / wg.groupIndex
  const pumpDelayNs = c.channels[0].pump.modulation?.delayNs ?? 0
  return {
    delayStartNs: pumpDelayNs - (2 * half) / vgMPerNs,
    delayStopNs: pumpDelayNs + (2 * half) / vgMPerNs,
    fromM: wg.lengthM / 2 - half,
    toM: wg.lengthM / 2 + half,
    windowNs: steadyFromNs(wg.groupIndex, wg.lengthM, wg.linewidthMHz) + 1e3 / rateMHz + 5,
  }
}
