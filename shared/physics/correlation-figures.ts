/*
 * Figures of a correlation read-out, for the form and the docs (docs/model.md, modulated and broadband sources).
 *
 * Pump and Stokes sharing a sinusoidal frequency modulation (rate f_m, excursion Δf) meet in step at
 * correlation peaks d_m = v_g/(2 f_m) apart, each Δz ≈ v_g Δν_B/(2π f_m Δf) wide (Hotate & Hasegawa 2000,
 * IEICE Trans. Electron. E83-C, 405). The width holds while the sound follows the beat's frequency swing,
 * f_m well below Δν_B: the solver's peaks are 0.87 of it for f_m ≤ 0.4 Δν_B and broaden past it above
 * (1.13 at f_m = 0.8 Δν_B, 1.53 at 1.2 Δν_B; tests/solver/correlation-peaks.test.ts and docs/model.md).
 * A broadband source of linewidth Δν localises the interaction over its correlation length v_g/(πΔν): shared by
 * pump and Stokes it gives one peak whose excess over a floor Δν_B/(Δν_B + 2Δν) has FWHM
 * v_g ln 2/(π(Δν_B + 2Δν)) (the Wiener phase model, derived in docs/model.md).
 */
import { SPEED_OF_LIGHT_M_PER_S } from './physical-constants'

/** Above this f_m/Δν_B the width formula no longer describes the peak (it broadens). */
export const MAX_RATE_PER_LINEWIDTH = 0.5

export interface CorrelationFigures {
  /** Distance between correlation peaks (m). */
  peakSpacingM: number
  /** Peak width after Hotate & Hasegawa (m); null when Δf = 0 (nothing localises the interaction). */
  peakWidthM: number | null
  /** f_m > MAX_RATE_PER_LINEWIDTH·Δν_B: the width figure is only a lower bound. */
  widthIsLowerBound: boolean
}

export function correlationFigures(groupIndex: number, linewidthMHz: number, rateMHz: number, excursionMHz: number): CorrelationFigures {
  const vg = SPEED_OF_LIGHT_M_PER_S / groupIndex
  return {
    peakSpacingM: vg / (2 * rateMHz * 1e6),
    peakWidthM: excursionMHz > 0 ? (vg * linewidthMHz) / (2 * Math.PI * rateMHz * excursionMHz * 1e6) : null,
    widthIsLowerBound: rateMHz > MAX_RATE_PER_LINEWIDTH * linewidthMHz,
  }
}

/** Correlation length v_g/(πΔν) of a broadband source (m). */
export function broadbandCorrelationLengthM(groupIndex: number, linewidthMHz: number): number {
  return SPEED_OF_LIGHT_M_PER_S / groupIndex / (Math.PI * linewidthMHz * 1e6)
}

export interface BroadbandPeak {
  /** FWHM of the peak's excess over the floor (m). */
  widthM: number
  /** Gain far from the peak over gain at the peak. */
  floor: number
}

export function broadbandPeak(groupIndex: number, linewidthMHz: number, sourceLinewidthMHz: number): BroadbandPeak {
  const vg = SPEED_OF_LIGHT_M_PER_S / groupIndex
  return {
    widthM: (vg * Math.LN2) / (Math.PI * (linewidthMHz + 2 * sourceLinewidthMHz) * 1e6),
    floor: linewidthMHz / (linewidthMHz + 2 * sourceLinewidthMHz),
  }
}
