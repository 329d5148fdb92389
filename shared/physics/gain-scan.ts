// The detuning axis of a gain-spectrum scan: ±3 linewidths (FWHM) around the main resonance, or, with
// several backward resonances, from the lowest line − 3 of its linewidths to the highest + 3 of its own.
// At ±3 FWHM a Lorentzian is down to 1/37 of its peak, so the wings are visible on a dB axis.
// A waveguide with a longitudinal profile (a sensing scan) moves the local line by each segment's shift change
// δν_B (with its own linewidth where it sets one): the range spans every local line the same way, so a hot spot
// shifted by +35 MHz is scanned across, not fitted from the edge of the scan.
import type { SweepAxis } from '../api/sweeps'
import { MAX_AXIS_VALUES } from '../api/sweeps'
import { gainLines, type GainLine } from './gain-spectrum'
import { segmentShiftMHz } from './longitudinal-profile'
import type { Waveguide } from './waveguide'
import type { EnergyWindow, SimulationConfig } from './simulation-config'

/** How far past each line the scan reaches, in that line's FWHM. */
export const SCAN_LINEWIDTHS = 3
/** Points of a scan over one line: 41 puts a point every 0.15 FWHM, ten inside the line's FWHM. */
export const SCAN_MIN_POINTS = 41
/** Wanted spacing in units of the narrowest FWHM, so every line of a wide multi-line scan is resolved. */
const STEP_PER_LINEWIDTH = 1 / 3

export interface GainScanPlan {
  startMHz: number
  stopMHz: number
  count: number
  stepMHz: number
  /** How many backward lines the range covers. */
  lines: number
  /** Lowest and highest local shift change of the profile (MHz), or null without one. */
  profileSpanMHz: [number, number] | null
  axis: SweepAxis
}

type ScannedGuide = Pick<Waveguide, 'brillouinShiftGHz' | 'linewidthMHz' | 'gainCoefficientMPerW' | 'additionalResonances'> & Partial<Pick<Waveguide, 'profile'>>

/** The main line moved to each profile segment's local shift (and linewidth), for the range only. */
function profileLines(w: ScannedGuide): GainLine[] {
  return (w.profile?.segments ?? []).map((s) => ({ centreMHz: segmentShiftMHz(s), linewidthMHz: s.linewidthMHz ?? w.linewidthMHz, gainCoefficientMPerW: s.gainCoefficientMPerW ?? w.gainCoefficientMPerW }))
}

export function gainScanPlan(w: ScannedGuide): GainScanPlan {
  const local = profileLines(w)
  const lines = [...gainLines(w), ...local]
  const startMHz = Math.min(...lines.map((l) => l.centreMHz - SCAN_LINEWIDTHS * l.linewidthMHz))
  const stopMHz = Math.max(...lines.map((l) => l.centreMHz + SCAN_LINEWIDTHS * l.linewidthMHz))
  const narrowest = Math.min(...lines.map((l) => l.linewidthMHz))
  const wanted = Math.ceil((stopMHz - startMHz) / (narrowest * STEP_PER_LINEWIDTH)) + 1
  // Odd counts keep a point on the main line's centre when the range is symmetric about it.
  const count = Math.min(MAX_AXIS_VALUES - 1, Math.max(SCAN_MIN_POINTS, wanted | 1))
  const round = (x: number) => Number(x.toPrecision(6))
  const start = round(startMHz)
  const stop = round(stopMHz)
  return {
    startMHz: start,
    stopMHz: stop,
    count,
    stepMHz: (stop - start) / (count - 1),
    lines: lines.length - local.length,
    profileSpanMHz: local.length ? [Math.min(0, ...local.map((l) => l.centreMHz)), Math.max(0, ...local.map((l) => l.centreMHz))] : null,
    axis: { field: 'detuningMHz', values: { kind: 'linear', start, stop, count } },
  }
}

/**
 * A CW scan reads the Stokes gain from the settled end of each run, not from its peak: switching a CW pump on
 * away from line centre makes the Stokes output ring above its steady value before it settles. Two windows over
 * the same tail of the run, one at each Stokes facet, give P_s,out/P_s,in = E_out/E_in there (sweep-metrics.ts).
 */
export const SETTLED_STOKES_IN = 'Stokes in, settled tail'
export const SETTLED_STOKES_OUT = 'Stokes out, settled tail'
/** The tail: the last tenth of the simulated time. */
export const SETTLED_TAIL_FRACTION = 0.1

export function settledWindows(windowNs: number): EnergyWindow[] {
  const startNs = Number((windowNs * (1 - SETTLED_TAIL_FRACTION)).toPrecision(6))
  return [
    { label: SETTLED_STOKES_IN, port: 'stokesIn', startNs, endNs: windowNs },
    { label: SETTLED_STOKES_OUT, port: 'stokesOut', startNs, endNs: windowNs },
  ]
}

/** The configuration with the two tail windows (replacing earlier ones of the same names). */
export function withSettledWindows(config: SimulationConfig): SimulationConfig {
  const others = config.energyWindows.filter((w) => w.label !== SETTLED_STOKES_IN && w.label !== SETTLED_STOKES_OUT)
  return { ...config, energyWindows: [...others, ...settledWindows(config.windowNs)] }
}
